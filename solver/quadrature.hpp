// Quadrature on the reference triangle T̂ = {(ξ, η): ξ, η ≥ 0, ξ + η ≤ 1} (area 1/2).
//
// Rules are Stroud's conical-product Gauss rules (A. H. Stroud, "Approximate Calculation of
// Multiple Integrals", Prentice-Hall 1971, §2.7): the collapse ξ = u, η = v(1 − u) maps the unit
// square onto T̂ with Jacobian (1 − u), and an n × n Gauss–Legendre product rule in (u, v) then
// integrates every polynomial of total degree ≤ 2n − 2 in (ξ, η) exactly (the extra factor
// (1 − u)^{b+1} raises the u-degree by one). The Gauss–Legendre nodes are computed by Newton's
// method on P_n, so no tables are copied. Element kernels ask for degree ≥ 2p + 2 (mass terms of
// order-p elements on curved triangles carry the Jacobian as well).
#pragma once

#include <Eigen/Core>

#include <array>
#include <cassert>
#include <cmath>
#include <numbers>
#include <vector>

namespace cladwise {

struct QuadratureRule {
  int degree = 0;                        ///< all polynomials of total degree ≤ degree are exact
  std::vector<Eigen::Vector2d> points;   ///< reference coordinates (ξ, η)
  std::vector<double> weights;           ///< sum to 1/2, the area of T̂
  int n_points() const { return static_cast<int>(points.size()); }
};

/// n-point Gauss–Legendre nodes and weights on [0, 1].
inline void gauss_legendre_01(int n, std::vector<double>& x, std::vector<double>& w) {
  assert(n >= 1);
  x.assign(n, 0.0);
  w.assign(n, 0.0);
  for (int i = 0; i < n; ++i) {
    // Chebyshev-like initial guess, then Newton on P_n(t) (Abramowitz & Stegun 25.4.29 weights).
    double t = std::cos(std::numbers::pi * (i + 0.75) / (n + 0.5));
    double dp = 1.0;
    for (int it = 0; it < 100; ++it) {
      double p0 = 1.0, p1 = t;
      for (int k = 2; k <= n; ++k) {
        const double p2 = ((2.0 * k - 1.0) * t * p1 - (k - 1.0) * p0) / k;
        p0 = p1;
        p1 = p2;
      }
      dp = n * (t * p1 - p0) / (t * t - 1.0);
      const double dt = p1 / dp;
      t -= dt;
      if (std::abs(dt) < 1e-16) break;
    }
    // recompute derivative at the converged node
    double p0 = 1.0, p1 = t;
    for (int k = 2; k <= n; ++k) {
      const double p2 = ((2.0 * k - 1.0) * t * p1 - (k - 1.0) * p0) / k;
      p0 = p1;
      p1 = p2;
    }
    dp = n * (t * p1 - p0) / (t * t - 1.0);
    x[i] = 0.5 * (1.0 - t);
    w[i] = 1.0 / ((1.0 - t * t) * dp * dp);  // = (2/((1−t²)P'²)) · ½ for the map to [0, 1]
  }
}

/// Conical-product rule exact to total degree `degree` (cached; safe to call from threads after
/// the first call returns, and the first call itself is a thread-safe static initialisation).
inline const QuadratureRule& triangle_rule(int degree) {
  assert(degree >= 0 && degree <= 20);
  static const std::array<QuadratureRule, 21> rules = [] {
    std::array<QuadratureRule, 21> r;
    for (int d = 0; d <= 20; ++d) {
      const int n = (d + 3) / 2;  // 2n − 2 ≥ d
      std::vector<double> x, w;
      gauss_legendre_01(n, x, w);
      r[d].degree = d;
      for (int i = 0; i < n; ++i) {
        for (int j = 0; j < n; ++j) {
          const double u = x[i], v = x[j];
          r[d].points.emplace_back(u, v * (1.0 - u));
          r[d].weights.push_back(w[i] * w[j] * (1.0 - u));
        }
      }
    }
    return r;
  }();
  return rules[degree];
}

}  // namespace cladwise
