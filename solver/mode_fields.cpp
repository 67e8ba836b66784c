// Mode-field recovery and 1 W normalisation (see mode_fields.hpp).
#include "solver/mode_fields.hpp"

#include <cmath>
#include <complex>
#include <numbers>
#include <string>

#include "mesh/error.hpp"
#include "solver/assembly.hpp"
#include "solver/element_kernels.hpp"
#include "solver/field_recovery.hpp"

namespace cladwise {

namespace {

constexpr std::complex<double> kJ{0.0, 1.0};

}  // namespace

ModeFieldEvaluator::ModeFieldEvaluator(const ModeProblem& problem, const DofMap& dofs,
                                       const Mode& mode)
    : problem_(&problem), dofs_(&dofs), mode_(&mode),
      k0_(2.0 * std::numbers::pi / problem.wavelength_um) {
  if (mode.eigenvector.size() != dofs.n_dofs()) {
    throw InputError("mode", "eigenvector does not belong to this DofMap");
  }
  const Mesh& mesh = dofs.mesh();
  const QuadratureRule& rule = triangle_rule(kernel_quadrature_degree(dofs.order()));
  double power = 0.0;  // W/m² · µm²
  for (int t = 0; t < mesh.n_triangles(); ++t) {
    const ElementGeometry g = element_geometry(mesh, t);
    for (int q = 0; q < rule.n_points(); ++q) {
      power += rule.weights[q] * map_point(g, rule.points[q]).det * raw_at(t, rule.points[q]).s_z();
    }
  }
  raw_power_w_ = power * 1e-12;  // µm² -> m²
  if (!(raw_power_w_ > 0.0)) {
    throw ComputationError("mode fields: the mode carries no forward power (P = " +
                           std::to_string(raw_power_w_) + " W); it is not a guided forward mode");
  }
  scale_ = 1.0 / std::sqrt(raw_power_w_);
}

FieldSample ModeFieldEvaluator::raw_at(int t, const Eigen::Vector2d& xi) const {
  const Mesh& mesh = dofs_->mesh();
  double c[kMaxLocalDofs];
  element_coefficients(*dofs_, t, mode_->eigenvector, c);
  const MappedPoint m = map_point(element_geometry(mesh, t), xi);
  const ElectricField f = element_electric_field(*dofs_, m, xi, c, mode_->beta);
  // Faraday: H = j μ_r⁻¹ (∇×E) / (k0 Z0), μ_r⁻¹ diagonal and constant in the region
  const Material& mat = problem_->region_materials[mesh.triangle_region[t]];
  const double z0k0 = k0_ * vacuum_impedance_ohm;
  FieldSample s;
  s.e = f.e;
  s.h << kJ * mat.mu_inv_xx * f.curl_e.x() / z0k0, kJ * mat.mu_inv_yy * f.curl_e.y() / z0k0,
      kJ * mat.mu_inv_zz * f.curl_e.z() / z0k0;
  return s;
}

FieldSample ModeFieldEvaluator::at_reference(int t, const Eigen::Vector2d& xi) const {
  FieldSample s = raw_at(t, xi);
  s.e *= scale_;
  s.h *= scale_;
  return s;
}

std::optional<FieldSample> ModeFieldEvaluator::at_point(int t, const Point2& x) const {
  const std::optional<Eigen::Vector2d> xi = reference_coordinates(element_geometry(dofs_->mesh(), t), x);
  if (!xi) return std::nullopt;
  return at_reference(t, *xi);
}

NodalFields ModeFieldEvaluator::at_nodes() const {
  return nodal_average(dofs_->mesh(), [this](int t, const Eigen::Vector2d& xi) { return at_reference(t, xi); });
}

}  // namespace cladwise
