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
    double c[kMaxLocalDofs];
    element_coefficients(dofs, t, mode.eigenvector, c);
    for (int q = 0; q < rule.n_points(); ++q) {
      const MappedPoint m = map_point(g, rule.points[q]);
      power += rule.weights[q] * m.det * raw_from(t, m, rule.points[q], c).s_z();
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
  double c[kMaxLocalDofs];
  element_coefficients(*dofs_, t, mode_->eigenvector, c);
  return raw_from(t, map_point(element_geometry(dofs_->mesh(), t), xi), xi, c);
}

FieldSample ModeFieldEvaluator::raw_from(int t, const MappedPoint& m, const Eigen::Vector2d& xi,
                                         const double* c) const {
  const ElectricField f = element_electric_field(*dofs_, m, xi, c, mode_->beta);
  // Faraday: H = j μ_r⁻¹ (∇×E) / (k0 Z0), μ_r⁻¹ diagonal and constant in the region
  const Material& mat = problem_->region_materials[dofs_->mesh().triangle_region[t]];
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

void ModeFieldEvaluator::at_reference(int t, const Eigen::Vector2d* xi, int n, FieldSample* out) const {
  double c[kMaxLocalDofs];
  element_coefficients(*dofs_, t, mode_->eigenvector, c);
  const ElementGeometry g = element_geometry(dofs_->mesh(), t);
  for (int k = 0; k < n; ++k) {
    out[k] = raw_from(t, map_point(g, xi[k]), xi[k], c);
    out[k].e *= scale_;
    out[k].h *= scale_;
  }
}

namespace {

template <int Order>
Eigen::Vector2d edge_interpolant(const MappedPoint& m, const Eigen::Vector2d& xi, const double* c_t) {
  typename NedelecTriangle<Order>::Values n;
  typename NedelecTriangle<Order>::Curls curl;
  edge_basis<Order>(m, xi, n, curl);
  Eigen::Vector2d e = Eigen::Vector2d::Zero();
  for (int i = 0; i < NedelecTriangle<Order>::n_functions; ++i) e += c_t[i] * n.col(i);
  return e;
}

}  // namespace

void ModeFieldEvaluator::transverse_e_at(int t, const Eigen::Vector2d* xi, int n, Eigen::Vector2cd* out) const {
  double c[kMaxLocalDofs];
  element_coefficients(*dofs_, t, mode_->eigenvector, c);
  const ElementGeometry g = element_geometry(dofs_->mesh(), t);
  const double s = scale_ / mode_->beta;  // E_t = e_t / β (formulation.md eq. 5)
  for (int k = 0; k < n; ++k) {
    const MappedPoint m = map_point(g, xi[k]);
    const Eigen::Vector2d e = dofs_->order() == 1 ? edge_interpolant<1>(m, xi[k], c) : edge_interpolant<2>(m, xi[k], c);
    out[k] = (s * e).cast<std::complex<double>>();
  }
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
