// Element-level recovery of the electric field of a mode from its eigenvector, shared by the
// real (solver/mode_fields.hpp) and complex (solver/leaky_mode_fields.hpp) field evaluators and
// by the |E|² integrals of solver/complex_mode_solver.cpp.
//
// From the scaled unknowns of Lee, Sun & Cendes (docs/formulation.md §6, eq. 5 and eq. 16):
//   E_t = e_t / β,  E_z = j e_z,
//   (∇×E)_x = j(∂_y e_z + e_y),  (∇×E)_y = −j(∂_x e_z + e_x),  (∇×E)_z = (∇_t × e_t)/β.
// Templated on the scalar of the eigenvector and of β (double on the lossless path,
// std::complex<double> on the lossy and PML path), so that both paths run one piece of code and
// each keeps the arithmetic of its own scalar. H = j μ⁻¹ (∇×E) / (k0 Z0) is left to the callers:
// the real path has a diagonal μ⁻¹ per region, the complex path a full tensor evaluated at the
// point (bend, PML).
#pragma once

#include <Eigen/Core>
#include <Eigen/LU>

#include <complex>
#include <optional>
#include <vector>

#include "mesh/mesh.hpp"
#include "solver/dof_map.hpp"
#include "solver/element_kernels.hpp"
#include "solver/mode_fields.hpp"

namespace cladwise {

/// Local unknowns of one element: at most 8 edge + 6 nodal functions (order 2).
inline constexpr int kMaxLocalDofs = 14;

/// The local coefficients of triangle t in the eigenvector x: edge signs applied, 0 on DOFs the
/// DofMap eliminated (electric walls). `c` holds kMaxLocalDofs entries.
template <typename Scalar>
void element_coefficients(const DofMap& dofs, int t, const Eigen::Matrix<Scalar, Eigen::Dynamic, 1>& x,
                          Scalar* c) {
  int index[kMaxLocalDofs];
  double sign[kMaxLocalDofs];
  dofs.element_dofs(t, index, sign);
  for (int i = 0; i < dofs.n_local(); ++i) c[i] = index[i] < 0 ? Scalar(0.0) : sign[i] * x[index[i]];
}

/// The finite-element interpolants of the scaled unknowns at one point of an element.
template <typename Scalar>
struct ScaledFieldValues {
  Eigen::Matrix<Scalar, 2, 1> e_t = Eigen::Matrix<Scalar, 2, 1>::Zero();       ///< e_t = β E_t
  Scalar curl_e_t = Scalar(0.0);                                                ///< ∇_t × e_t
  Scalar e_z = Scalar(0.0);                                                     ///< e_z = −j E_z
  Eigen::Matrix<Scalar, 2, 1> grad_e_z = Eigen::Matrix<Scalar, 2, 1>::Zero();  ///< ∇_t e_z
};

/// Interpolation of the local coefficients c_t (edge functions) and c_z (nodal functions) at the
/// reference point xi of an element of order `Order`, whose geometry map there is m.
template <int Order, typename Scalar>
ScaledFieldValues<Scalar> interpolate_scaled_fields(const MappedPoint& m, const Eigen::Vector2d& xi,
                                                    const Scalar* c_t, const Scalar* c_z) {
  typename NedelecTriangle<Order>::Values n;
  typename NedelecTriangle<Order>::Curls curl;
  typename LagrangeTriangle<Order>::Values l;
  typename LagrangeTriangle<Order>::Gradients gl;
  edge_basis<Order>(m, xi, n, curl);
  nodal_basis<Order>(m, xi, l, gl);
  ScaledFieldValues<Scalar> v;
  for (int i = 0; i < NedelecTriangle<Order>::n_functions; ++i) {
    v.e_t += c_t[i] * n.col(i);
    v.curl_e_t += c_t[i] * curl[i];
  }
  for (int i = 0; i < LagrangeTriangle<Order>::n_functions; ++i) {
    v.e_z += c_z[i] * l[i];
    v.grad_e_z += c_z[i] * gl.col(i);
  }
  return v;
}

/// E and ∇×E at one point, before any normalisation.
struct ElectricField {
  Eigen::Vector3cd e;       ///< E, components x, y, z
  Eigen::Vector3cd curl_e;  ///< ∇×E with ∂/∂z → −jβ
};

template <typename Scalar>
ElectricField electric_field(const ScaledFieldValues<Scalar>& v, Scalar beta) {
  constexpr std::complex<double> j{0.0, 1.0};
  ElectricField f;
  // E_t = e_t/β, E_z = j e_z (formulation.md eq. 5)
  f.e << v.e_t.x() / beta, v.e_t.y() / beta, j * v.e_z;
  // ∇×E from eqs. (2), (3) in the scaled unknowns (formulation.md eq. 16)
  f.curl_e << j * (v.grad_e_z.y() + v.e_t.y()), -j * (v.grad_e_z.x() + v.e_t.x()), v.curl_e_t / beta;
  return f;
}

/// E and ∇×E inside the element with local coefficients c (element_coefficients) at the
/// reference point xi, where its geometry map is m.
template <typename Scalar>
ElectricField element_electric_field(const DofMap& dofs, const MappedPoint& m, const Eigen::Vector2d& xi,
                                     const Scalar* c, Scalar beta) {
  const int nt = dofs.n_local_edge();
  return dofs.order() == 1 ? electric_field(interpolate_scaled_fields<1>(m, xi, c, c + nt), beta)
                           : electric_field(interpolate_scaled_fields<2>(m, xi, c, c + nt), beta);
}

/// Reference coordinates ξ of the physical point x (µm) in the element of geometry g, or nullopt
/// if x is not in it.
inline std::optional<Eigen::Vector2d> reference_coordinates(const ElementGeometry& g, const Point2& x) {
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
  return xi;
}

/// Nodal values: each element evaluates its own fields at the mesh node (at_reference(t, ξ) of
/// the evaluator), and the node takes the arithmetic mean over the elements that share it.
template <class AtReference>
NodalFields nodal_average(const Mesh& mesh, const AtReference& at_reference) {
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
