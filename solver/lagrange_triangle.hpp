// Lagrange (nodal) shape functions of order 1 and 2 on the reference triangle, used for the
// longitudinal unknown e_z and for the isoparametric geometry map.
//
// Barycentrics on T̂ = (0,0), (1,0), (0,1): λ0 = 1 − ξ − η, λ1 = ξ, λ2 = η.
// Local node order (docs/conventions.md, mesh/mesh.hpp): vertices 0, 1, 2, then (order 2) the
// mid-edge nodes of local edges 0 = (v0, v1), 1 = (v1, v2), 2 = (v2, v0).
//   order 1: L_i = λ_i
//   order 2: L_i = λ_i (2λ_i − 1) (vertices),  L_{3+k} = 4 λ_k λ_{k+1} (edges)
// The edge functions are symmetric in their two vertices, so no orientation enters the nodal space.
#pragma once

#include <Eigen/Core>

#include <array>

namespace cladwise {

/// Barycentric coordinates of a reference point and their (constant) reference gradients.
struct Barycentric {
  std::array<double, 3> l;
  std::array<Eigen::Vector2d, 3> grad;
  explicit Barycentric(const Eigen::Vector2d& xi)
      : l{1.0 - xi.x() - xi.y(), xi.x(), xi.y()},
        grad{Eigen::Vector2d(-1.0, -1.0), Eigen::Vector2d(1.0, 0.0), Eigen::Vector2d(0.0, 1.0)} {}
};

template <int Order>
struct LagrangeTriangle {
  static_assert(Order == 1 || Order == 2, "Lagrange triangles of order 1 and 2 only");
  static constexpr int n_functions = Order == 1 ? 3 : 6;
  using Values = Eigen::Matrix<double, n_functions, 1>;
  using Gradients = Eigen::Matrix<double, 2, n_functions>;

  /// Values and reference gradients ∇̂L_i at the reference point xi.
  static void evaluate(const Eigen::Vector2d& xi, Values& values, Gradients& ref_grads) {
    const Barycentric b(xi);
    if constexpr (Order == 1) {
      for (int i = 0; i < 3; ++i) {
        values[i] = b.l[i];
        ref_grads.col(i) = b.grad[i];
      }
    } else {
      for (int i = 0; i < 3; ++i) {
        values[i] = b.l[i] * (2.0 * b.l[i] - 1.0);
        ref_grads.col(i) = (4.0 * b.l[i] - 1.0) * b.grad[i];
      }
      for (int k = 0; k < 3; ++k) {
        const int a = k, c = (k + 1) % 3;
        values[3 + k] = 4.0 * b.l[a] * b.l[c];
        ref_grads.col(3 + k) = 4.0 * (b.l[a] * b.grad[c] + b.l[c] * b.grad[a]);
      }
    }
  }
};

}  // namespace cladwise
