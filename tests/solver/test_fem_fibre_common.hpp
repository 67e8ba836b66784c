// Relative L2 error of FEM mode fields against the exact step-index fields (test helper).
//
// The FEM modes of a degenerate pair are any two independent combinations of the exact even and
// odd fields (and a single mode has an arbitrary phase), so each exact field E is compared with
// its least-squares projection onto the span of the FEM fields of the same mode:
//   min_c ‖E − Σ c_i F_i‖ / ‖E‖,  G c = r,  G_ij = ∫ F_i*·F_j dA,  r_i = ∫ F_i*·E dA,
// integrated by element quadrature over the whole (curved) mesh.
#pragma once

#include <Eigen/Dense>

#include <algorithm>
#include <cmath>
#include <complex>
#include <vector>

#include "solver/lagrange_triangle.hpp"
#include "solver/mode_fields.hpp"
#include "solver/quadrature.hpp"
#include "solver/step_index.hpp"

namespace cladwise::testing {

struct FieldComparison {
  double relative_l2_error = 0;  ///< ‖E − P E‖ / ‖E‖ (worst over the exact fields given)
  Eigen::MatrixXcd coefficients;  ///< c per exact field (columns)
};

/// Physical point of reference coordinates xi in triangle t (isoparametric for order 2).
inline Point2 physical_point(const Mesh& mesh, int t, const Eigen::Vector2d& xi) {
  const auto& tri = mesh.triangles[t];
  Point2 x{0.0, 0.0};
  if (mesh.order == 2) {
    LagrangeTriangle<2>::Values v;
    LagrangeTriangle<2>::Gradients g;
    LagrangeTriangle<2>::evaluate(xi, v, g);
    for (int i = 0; i < 6; ++i) x = {x[0] + v[i] * mesh.nodes[tri[i]][0], x[1] + v[i] * mesh.nodes[tri[i]][1]};
  } else {
    LagrangeTriangle<1>::Values v;
    LagrangeTriangle<1>::Gradients g;
    LagrangeTriangle<1>::evaluate(xi, v, g);
    for (int i = 0; i < 3; ++i) x = {x[0] + v[i] * mesh.nodes[tri[i]][0], x[1] + v[i] * mesh.nodes[tri[i]][1]};
  }
  return x;
}

/// |det J| at xi (area element of the reference-to-physical map).
inline double jacobian(const Mesh& mesh, int t, const Eigen::Vector2d& xi) {
  const auto& tri = mesh.triangles[t];
  Eigen::Matrix2d j = Eigen::Matrix2d::Zero();
  auto add = [&](int node, const Eigen::Vector2d& grad) {
    j.col(0) += mesh.nodes[node][0] * grad;  // row 0: ∂x/∂ξ, ∂x/∂η
    j.col(1) += mesh.nodes[node][1] * grad;
  };
  if (mesh.order == 2) {
    LagrangeTriangle<2>::Values v;
    LagrangeTriangle<2>::Gradients g;
    LagrangeTriangle<2>::evaluate(xi, v, g);
    for (int i = 0; i < 6; ++i) add(tri[i], g.col(i));
  } else {
    LagrangeTriangle<1>::Values v;
    LagrangeTriangle<1>::Gradients g;
    LagrangeTriangle<1>::evaluate(xi, v, g);
    for (int i = 0; i < 3; ++i) add(tri[i], g.col(i));
  }
  return std::abs(j.determinant());
}

/// Compares the exact fields `exact` (e.g. the even and odd HE11) with the FEM fields of `fem`
/// (the modes of the same pair, or the one mode of TE0m/TM0m).
inline FieldComparison compare_fields(const Mesh& mesh, const std::vector<const ModeFieldEvaluator*>& fem,
                                      const std::vector<const StepIndexField*>& exact) {
  const int nf = static_cast<int>(fem.size()), ne = static_cast<int>(exact.size());
  Eigen::MatrixXcd g = Eigen::MatrixXcd::Zero(nf, nf), r = Eigen::MatrixXcd::Zero(nf, ne);
  Eigen::VectorXd ee = Eigen::VectorXd::Zero(ne);
  const QuadratureRule& q = triangle_rule(2 * mesh.order + 2);
  std::vector<Eigen::Vector3cd> f(nf);
  for (int t = 0; t < mesh.n_triangles(); ++t) {
    for (int k = 0; k < q.n_points(); ++k) {
      const Eigen::Vector2d& xi = q.points[k];
      const double w = q.weights[k] * jacobian(mesh, t, xi);
      const Point2 x = physical_point(mesh, t, xi);
      for (int i = 0; i < nf; ++i) f[i] = fem[i]->at_reference(t, xi).e;
      for (int i = 0; i < nf; ++i) {
        for (int j = 0; j < nf; ++j) g(i, j) += w * f[i].dot(f[j]);  // dot conjugates the first
      }
      for (int e = 0; e < ne; ++e) {
        const Eigen::Vector3cd ex = exact[e]->at(x[0], x[1]).e_xyz;
        ee[e] += w * ex.squaredNorm();
        for (int i = 0; i < nf; ++i) r(i, e) += w * f[i].dot(ex);
      }
    }
  }
  FieldComparison out;
  out.coefficients = g.ldlt().solve(r);
  for (int e = 0; e < ne; ++e) {
    // ‖E − Fc‖² = ‖E‖² − rᴴ G⁻¹ r (the projection's Pythagoras)
    const double proj = (r.col(e).adjoint() * out.coefficients.col(e)).value().real();
    const double err2 = std::max(0.0, ee[e] - proj);
    out.relative_l2_error = std::max(out.relative_l2_error, std::sqrt(err2 / ee[e]));
  }
  return out;
}

}  // namespace cladwise::testing
