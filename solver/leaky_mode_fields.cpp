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

template <int Order>
FieldSample raw_fields(const MappedPoint& m, const Eigen::Vector2d& xi, const Complex* c_t,
                       const Complex* c_z, Complex beta, double k0, const InversePermeability& nu) {
  typename NedelecTriangle<Order>::Values n;
  typename NedelecTriangle<Order>::Curls curl;
  typename LagrangeTriangle<Order>::Values l;
  typename LagrangeTriangle<Order>::Gradients gl;
  edge_basis<Order>(m, xi, n, curl);
  nodal_basis<Order>(m, xi, l, gl);
  Eigen::Vector2cd et = Eigen::Vector2cd::Zero(), grad_ez = Eigen::Vector2cd::Zero();
  Complex curl_et = 0.0, ez = 0.0;
  for (int i = 0; i < NedelecTriangle<Order>::n_functions; ++i) {
    et += c_t[i] * n.col(i);
    curl_et += c_t[i] * curl[i];
  }
  for (int i = 0; i < LagrangeTriangle<Order>::n_functions; ++i) {
    ez += c_z[i] * l[i];
    grad_ez += c_z[i] * gl.col(i);
  }
  FieldSample s;
  // E_t = e_t/β, E_z = j e_z (formulation.md eq. 5, complex β)
  s.e << et.x() / beta, et.y() / beta, kJ * ez;
  // ∇×E from eqs. (2), (3) in the scaled unknowns (formulation.md eq. 16)
  const Eigen::Vector2cd curl_e_t(kJ * (grad_ez.y() + et.y()), -kJ * (grad_ez.x() + et.x()));
  const Complex curl_e_z = curl_et / beta;
  // Faraday: H = j μ⁻¹ (∇×E) / (k0 Z0), μ the (bent, stretched) tensor the solver assembled
  const double z0k0 = k0 * vacuum_impedance_ohm;
  const Eigen::Vector2cd h_t = kJ * (nu.t * curl_e_t) / z0k0;
  s.h << h_t.x(), h_t.y(), kJ * nu.zz * curl_e_z / z0k0;
  return s;
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
  int index[14];
  double sign[14];
  dofs_->element_dofs(t, index, sign);
  Complex c[14];
  for (int i = 0; i < dofs_->n_local(); ++i) {
    c[i] = index[i] < 0 ? Complex(0.0) : sign[i] * mode_->eigenvector[index[i]];
  }
  const ElementGeometry g = element_geometry(mesh, t);
  const MappedPoint m = map_point(g, xi);
  const int region = mesh.triangle_region[t];
  // μ varies inside PML and bent elements: evaluate the medium at the point itself.
  const InversePermeability nu = inverse_permeability(leaky_medium_at(*problem_, region, m.x));
  const int nt = dofs_->n_local_edge();
  return dofs_->order() == 1 ? raw_fields<1>(m, xi, c, c + nt, mode_->beta, k0_, nu)
                             : raw_fields<2>(m, xi, c, c + nt, mode_->beta, k0_, nu);
}

FieldSample LeakyModeFieldEvaluator::at_reference(int t, const Eigen::Vector2d& xi) const {
  FieldSample s = raw_at(t, xi);
  s.e *= scale_;
  s.h *= scale_;
  return s;
}

std::optional<FieldSample> LeakyModeFieldEvaluator::at_point(int t, const Point2& x) const {
  const ElementGeometry g = element_geometry(dofs_->mesh(), t);
  const Eigen::Vector2d target(x[0], x[1]);
  Eigen::Vector2d xi(1.0 / 3.0, 1.0 / 3.0);
  for (int it = 0; it < 30; ++it) {  // Newton on x(ξ) = x (one step for straight elements)
    const MappedPoint m = map_point(g, xi);
    const Eigen::Vector2d step = m.jacobian.lu().solve(m.x - target);
    xi -= step;
    if (step.norm() < 1e-14) break;
  }
  const double tol = 1e-10;
  if (xi.x() < -tol || xi.y() < -tol || xi.x() + xi.y() > 1.0 + tol ||
      (map_point(g, xi).x - target).norm() > 1e-9 * (1.0 + target.norm())) {
    return std::nullopt;
  }
  return at_reference(t, xi);
}

NodalFields LeakyModeFieldEvaluator::at_nodes() const {
  const Mesh& mesh = dofs_->mesh();
  const int nn = mesh.n_nodes();
  NodalFields f;
  f.e.assign(nn, Eigen::Vector3cd::Zero());
  f.h.assign(nn, Eigen::Vector3cd::Zero());
  f.s_z.assign(nn, 0.0);
  std::vector<int> count(nn, 0);
  static const Eigen::Vector2d ref_nodes[6] = {{0.0, 0.0}, {1.0, 0.0}, {0.0, 1.0},
                                               {0.5, 0.0}, {0.5, 0.5}, {0.0, 0.5}};
  for (int t = 0; t < mesh.n_triangles(); ++t) {
    for (int i = 0; i < mesh.nodes_per_triangle(); ++i) {
      const int node = mesh.triangles[t][i];
      const FieldSample s = at_reference(t, ref_nodes[i]);
      f.e[node] += s.e;
      f.h[node] += s.h;
      ++count[node];
    }
  }
  for (int i = 0; i < nn; ++i) {
    if (count[i] == 0) continue;
    f.e[i] /= count[i];
    f.h[i] /= count[i];
    f.s_z[i] = FieldSample{f.e[i], f.h[i]}.s_z();
  }
  return f;
}

}  // namespace cladwise
