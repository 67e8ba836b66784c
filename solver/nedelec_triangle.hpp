// Nédélec edge elements of the first kind on the reference triangle, orders 1 and 2, for the
// transverse unknown e_t (docs/formulation.md §3).
//
// @warning "Order" follows docs/conventions.md: order p pairs with Lagrange order p for e_z, so
// that ∇(Lagrange_p) ⊂ Nédélec_p (the discrete exact sequence that keeps spurious modes out).
//   order 1 (Whitney, 3 functions): W_k = λ_a ∇λ_b − λ_b ∇λ_a on local edge k = (a, b) = (k, k+1)
//   order 2 (8 functions, hierarchical, after J. P. Webb, IEEE Trans. AP 47, 1244 (1999)):
//     2k   : W_k                        (odd under edge reversal: carries the edge sign)
//     2k+1 : G_k = ∇(λ_a λ_b)            (even under reversal: no sign)
//     6    : F_0 = λ_2 (λ_0 ∇λ_1 − λ_1 ∇λ_0)   (interior "face" functions, zero tangential trace
//     7    : F_1 = λ_0 (λ_1 ∇λ_2 − λ_2 ∇λ_1)    on every edge; the third, λ_1 W_20, is their
//                                                negative sum and is left out)
// Span{W, G, F} = P1² ⊕ {p ∈ P̃2²: p·x = 0}, the 8-dimensional first-kind space of degree 2.
// Tangential continuity: on edge k only W_k and G_k have a tangential trace; W_k·t = 1 (t the
// un-normalised edge vector a → b) and G_k·t = d(λ_aλ_b)/ds, which both neighbours share once W_k is
// multiplied by the sign of the local edge against the global low → high orientation.
//
// Values returned are reference-frame vectors N̂ and reference curls ∇̂×N̂; element_kernels.hpp maps
// them covariantly (N = J⁻ᵀ N̂, ∇×N = ∇̂×N̂ / det J).
#pragma once

#include <Eigen/Core>

#include <array>

#include "solver/lagrange_triangle.hpp"

namespace cladwise {

namespace detail {
inline double cross2(const Eigen::Vector2d& a, const Eigen::Vector2d& b) {
  return a.x() * b.y() - a.y() * b.x();
}
}  // namespace detail

template <int Order>
struct NedelecTriangle {
  static_assert(Order == 1 || Order == 2, "Nédélec triangles of order 1 and 2 only");
  static constexpr int n_functions = Order == 1 ? 3 : 8;
  using Values = Eigen::Matrix<double, 2, n_functions>;
  using Curls = Eigen::Matrix<double, 1, n_functions>;

  /// Local edge a function belongs to (−1 for interior functions).
  static constexpr int edge_of(int i) {
    if constexpr (Order == 1) return i;
    return i < 6 ? i / 2 : -1;
  }
  /// True when the function changes sign with the direction of its edge (the Whitney functions).
  static constexpr bool is_oriented(int i) {
    if constexpr (Order == 1) return true;
    return i < 6 && i % 2 == 0;
  }

  static void evaluate(const Eigen::Vector2d& xi, Values& ref_values, Curls& ref_curls) {
    using detail::cross2;
    const Barycentric b(xi);
    auto whitney = [&](int a, int c) -> Eigen::Vector2d {
      return b.l[a] * b.grad[c] - b.l[c] * b.grad[a];
    };
    for (int k = 0; k < 3; ++k) {
      const int a = k, c = (k + 1) % 3;
      const int col = Order == 1 ? k : 2 * k;
      ref_values.col(col) = whitney(a, c);
      ref_curls[col] = 2.0 * cross2(b.grad[a], b.grad[c]);
      if constexpr (Order == 2) {
        ref_values.col(col + 1) = b.l[a] * b.grad[c] + b.l[c] * b.grad[a];
        ref_curls[col + 1] = 0.0;
      }
    }
    if constexpr (Order == 2) {
      // curl(λ_c W_ab) = ∇λ_c × W_ab + λ_c ∇×W_ab
      const Eigen::Vector2d w01 = whitney(0, 1), w12 = whitney(1, 2);
      ref_values.col(6) = b.l[2] * w01;
      ref_curls[6] = cross2(b.grad[2], w01) + b.l[2] * 2.0 * cross2(b.grad[0], b.grad[1]);
      ref_values.col(7) = b.l[0] * w12;
      ref_curls[7] = cross2(b.grad[0], w12) + b.l[0] * 2.0 * cross2(b.grad[1], b.grad[2]);
    }
  }
};

}  // namespace cladwise
