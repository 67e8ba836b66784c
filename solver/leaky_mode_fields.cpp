// Fields of leaky and lossy modes, 1 W over the physical domain (see leaky_mode_fields.hpp).
#include "solver/leaky_mode_fields.hpp"

#include <Eigen/LU>

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

using Complex = std::complex<double>;
constexpr Complex kJ{0.0, 1.0};

/// Inverse permeability of the medium at one point: μ_t⁻¹ and 1/μ_zz.
struct InversePermeability {
  Eigen::Matrix2cd t = Eigen::Matrix2cd::Identity();
  Complex zz{1.0};
};

InversePermeability inverse_permeability(const TensorMaterial& m) {
  return {m.mu_t.inverse(), 1.0 / m.mu_zz};
}

}  // namespace

LeakyModeFieldEvaluator::LeakyModeFieldEvaluator(const ComplexModeSolver& solver,
                                                 const LeakyMode& mode)
    : LeakyModeFieldEvaluator(solver.problem(), solver.dof_map(), mode) {}

LeakyModeFieldEvaluator::LeakyModeFieldEvaluator(const LeakyModeProblem& problem,
                                                 const DofMap& dofs, const LeakyMode& mode)
    : problem_(&problem), dofs_(&dofs), mode_(&mode),
      k0_(2.0 * std::numbers::pi / problem.wavelength_um) {
  if (mode.eigenvector.size() != dofs.n_dofs() || &dofs.mesh() != problem.mesh) {
    throw InputError("leaky mode", "eigenvector does not belong to this DofMap and mesh; pass the "
                                   "problem and DofMap of the solver that computed the mode");
  }
  if (!(std::abs(mode.beta) > 0.0)) {
    throw InputError("leaky mode", "β = 0: not a solved mode");
  }
  const Mesh& mesh = dofs.mesh();
  const QuadratureRule& rule = triangle_rule(kernel_quadrature_degree(dofs.order()));
  double power = 0.0, pml_power = 0.0, peak = -1.0;  // W/m² · µm², W/m²
  FieldSample peak_sample;
  for (int t = 0; t < mesh.n_triangles(); ++t) {
    const bool physical = mesh.regions[mesh.triangle_region[t]].role != RegionRole::pml;
    const ElementGeometry g = element_geometry(mesh, t);
    for (int q = 0; q < rule.n_points(); ++q) {
      const FieldSample s = raw_at(t, rule.points[q]);
      const double sz = s.s_z();
      const double w = rule.weights[q] * map_point(g, rule.points[q]).det;
      if (!physical) {
        pml_power += w * sz;
        continue;
      }
      power += w * sz;
      if (sz > peak) {
        peak = sz;
        peak_sample = s;
        peak_triangle_ = t;
        peak_xi_ = rule.points[q];
      }
    }
  }
  raw_power_w_ = power * 1e-12;  // µm² -> m²
  if (!(raw_power_w_ > 0.0) || peak_triangle_ < 0) {
    throw ComputationError("leaky mode fields: the mode carries no forward power in the physical "
                           "domain (P = " + std::to_string(raw_power_w_) +
                           " W); it is not a guided or leaky forward mode");
  }
  // Phase reference: the larger transverse component of E at the power peak, made real > 0.
  const Complex ref = std::abs(peak_sample.e.x()) >= std::abs(peak_sample.e.y()) ? peak_sample.e.x()
                                                                                 : peak_sample.e.y();
  const Complex phase = std::abs(ref) > 0.0 ? std::abs(ref) / ref : Complex(1.0);
  scale_ = phase / std::sqrt(raw_power_w_);
  pml_power_w_ = pml_power * 1e-12 / raw_power_w_;  // |scale|² = 1/P
}

FieldSample LeakyModeFieldEvaluator::raw_at(int t, const Eigen::Vector2d& xi) const {
  const Mesh& mesh = dofs_->mesh();
  Complex c[kMaxLocalDofs];
  element_coefficients(*dofs_, t, mode_->eigenvector, c);
  const MappedPoint m = map_point(element_geometry(mesh, t), xi);
  const ElectricField f = element_electric_field(*dofs_, m, xi, c, mode_->beta);
  // μ varies inside PML and bent elements: evaluate the medium at the point itself.
  const InversePermeability nu = inverse_permeability(leaky_medium_at(*problem_, mesh.triangle_region[t], m.x));
  // Faraday: H = j μ⁻¹ (∇×E) / (k0 Z0), μ the (bent, stretched) tensor the solver assembled
  const double z0k0 = k0_ * vacuum_impedance_ohm;
  const Eigen::Vector2cd curl_e_t = f.curl_e.head<2>();
  const Eigen::Vector2cd h_t = kJ * (nu.t * curl_e_t) / z0k0;
  FieldSample s;
  s.e = f.e;
  s.h << h_t.x(), h_t.y(), kJ * nu.zz * f.curl_e.z() / z0k0;
  return s;
}

FieldSample LeakyModeFieldEvaluator::at_reference(int t, const Eigen::Vector2d& xi) const {
  FieldSample s = raw_at(t, xi);
  s.e *= scale_;
  s.h *= scale_;
  return s;
}

std::optional<FieldSample> LeakyModeFieldEvaluator::at_point(int t, const Point2& x) const {
  const std::optional<Eigen::Vector2d> xi = reference_coordinates(element_geometry(dofs_->mesh(), t), x);
  if (!xi) return std::nullopt;
  return at_reference(t, *xi);
}

NodalFields LeakyModeFieldEvaluator::at_nodes() const {
  return nodal_average(dofs_->mesh(), [this](int t, const Eigen::Vector2d& xi) { return at_reference(t, xi); });
}

}  // namespace cladwise
