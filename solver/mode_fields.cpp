// Mode-field recovery and 1 W normalisation (see mode_fields.hpp).
#include "solver/mode_fields.hpp"

#include <cmath>
#include <complex>
#include <numbers>
#include <string>

#include "mesh/error.hpp"
#include "solver/assembly.hpp"
#include "solver/element_kernels.hpp"

namespace cladwise {

namespace {

constexpr std::complex<double> kJ{0.0, 1.0};

template <int Order>
FieldSample raw_fields(const ElementGeometry& g, const double* c_t, const double* c_z, double beta,
                       double k0, const Material& mat, const Eigen::Vector2d& xi) {
  const MappedPoint m = map_point(g, xi);
  typename NedelecTriangle<Order>::Values n;
  typename NedelecTriangle<Order>::Curls curl;
  typename LagrangeTriangle<Order>::Values l;
  typename LagrangeTriangle<Order>::Gradients gl;
  edge_basis<Order>(m, xi, n, curl);
  nodal_basis<Order>(m, xi, l, gl);
  Eigen::Vector2d et = Eigen::Vector2d::Zero(), grad_ez = Eigen::Vector2d::Zero();
  double curl_et = 0.0, ez = 0.0;
  for (int i = 0; i < NedelecTriangle<Order>::n_functions; ++i) {
    et += c_t[i] * n.col(i);
    curl_et += c_t[i] * curl[i];
  }
  for (int i = 0; i < LagrangeTriangle<Order>::n_functions; ++i) {
    ez += c_z[i] * l[i];
    grad_ez += c_z[i] * gl.col(i);
  }
  FieldSample s;
  s.e << et.x() / beta, et.y() / beta, kJ * ez;
  const Eigen::Vector3cd curl_e(kJ * (grad_ez.y() + et.y()), -kJ * (grad_ez.x() + et.x()),
                                curl_et / beta);
  const double z0k0 = k0 * vacuum_impedance_ohm;
  s.h << kJ * mat.mu_inv_xx * curl_e.x() / z0k0, kJ * mat.mu_inv_yy * curl_e.y() / z0k0,
      kJ * mat.mu_inv_zz * curl_e.z() / z0k0;
  return s;
}

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
  int index[14];
  double sign[14];
  dofs_->element_dofs(t, index, sign);
  double c[14];
  for (int i = 0; i < dofs_->n_local(); ++i) {
    c[i] = index[i] < 0 ? 0.0 : sign[i] * mode_->eigenvector[index[i]];
  }
  const ElementGeometry g = element_geometry(mesh, t);
  const Material& mat = problem_->region_materials[mesh.triangle_region[t]];
  const int nt = dofs_->n_local_edge();
  return dofs_->order() == 1 ? raw_fields<1>(g, c, c + nt, mode_->beta, k0_, mat, xi)
                             : raw_fields<2>(g, c, c + nt, mode_->beta, k0_, mat, xi);
}

FieldSample ModeFieldEvaluator::at_reference(int t, const Eigen::Vector2d& xi) const {
  FieldSample s = raw_at(t, xi);
  s.e *= scale_;
  s.h *= scale_;
  return s;
}

std::optional<FieldSample> ModeFieldEvaluator::at_point(int t, const Point2& x) const {
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

NodalFields ModeFieldEvaluator::at_nodes() const {
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
