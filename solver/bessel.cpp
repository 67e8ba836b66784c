// Bessel functions for the step-index fibre; see bessel.hpp for the sources and the strategy.
#include "solver/bessel.hpp"

#include <cassert>
#include <cmath>
#include <cstdlib>
#include <numbers>

#include "solver/scalar_root.hpp"

namespace cladwise::bessel {
namespace {

// Above this argument K_0, K_1 are taken from their asymptotic series (A&S 9.7.2); below it the
// library values are far from underflow (K_0(500) ~ 1e-219).
constexpr double kLargeArgument = 500.0;

// Σ_k a_k(nu) / x^k with a_k = Π_{i<=k} (4nu² − (2i−1)²) / (k! 8^k): K_nu(x) = sqrt(π/2x) e^{−x} Σ.
// For x > 500 the terms fall by a factor ~ 1/(8x) each, so 12 terms reach double precision.
double k_asymptotic_sum(int nu, double x) {
  const double mu = 4.0 * nu * nu;
  double term = 1.0, sum = 1.0;
  for (int i = 1; i <= 12; ++i) {
    term *= (mu - (2.0 * i - 1.0) * (2.0 * i - 1.0)) / (i * 8.0 * x);
    sum += term;
  }
  return sum;
}

double log_k0(double x) {
  if (x > kLargeArgument) {
    return 0.5 * std::log(std::numbers::pi / (2.0 * x)) - x + std::log(k_asymptotic_sum(0, x));
  }
  return std::log(std::cyl_bessel_k(0.0, x));
}

// K_0(x)/K_1(x).
double k0_over_k1(double x) {
  if (x > kLargeArgument) return k_asymptotic_sum(0, x) / k_asymptotic_sum(1, x);
  return std::cyl_bessel_k(0.0, x) / std::cyl_bessel_k(1.0, x);
}

}  // namespace

double j(int n, double x) {
  const double v = std::cyl_bessel_j(static_cast<double>(std::abs(n)), x);
  return (n < 0 && (-n) % 2 == 1) ? -v : v;
}

double k(int n, double x) { return std::cyl_bessel_k(static_cast<double>(std::abs(n)), x); }

double k_ratio(int n, double x) {
  assert(n >= 1 && x > 0);
  // r_m = K_{m-1}/K_m; K_{m+1} = K_{m-1} + (2m/x) K_m  =>  r_{m+1} = 1 / (r_m + 2m/x).
  double r = k0_over_k1(x);
  for (int m = 1; m < n; ++m) r = 1.0 / (r + 2.0 * m / x);
  return r;
}

double log_k(int n, double x) {
  assert(x > 0);
  n = std::abs(n);
  if (x <= kLargeArgument) {
    const double direct = std::cyl_bessel_k(static_cast<double>(n), x);
    if (std::isfinite(direct) && direct > 1e-290) return std::log(direct);
  }
  // log K_n = log K_0 − Σ_{m=1..n} log(K_{m-1}/K_m).
  double result = log_k0(x);
  double r = k0_over_k1(x);
  for (int m = 1; m <= n; ++m) {
    result -= std::log(r);
    r = 1.0 / (r + 2.0 * m / x);
  }
  return result;
}

double j_ratio(int n, double x) {
  assert(n >= 1 && x > 0);
  if (x >= n) {
    // Past the turning point J_n is not small (|J_n(x)| ≳ 0.4 n^{-1/3} at x = n): direct ratio.
    return std::cyl_bessel_j(n - 1.0, x) / std::cyl_bessel_j(static_cast<double>(n), x);
  }
  // f_m = J_m/J_{m-1} = 1/(2m/x − f_{m+1}), started far above n where f ≈ x/(2m) ≪ 1; the
  // truncation error shrinks by about (x/2m)² per step of the backward sweep.
  const int start = n + 60 + static_cast<int>(std::sqrt(40.0 * n));
  double f = 0.0;
  for (int m = start; m >= n; --m) f = 1.0 / (2.0 * m / x - f);
  return 1.0 / f;
}

std::vector<double> j_zeros(int n, double x_max) {
  assert(n >= 0);
  // Zeros of J_n lie above n (j_{n,1} > n, A&S 9.5.2) and are more than 2.4 apart (A&S Table 9.5,
  // spacing tends to π), so a scan with step 0.25 sees each one as a single sign change.
  std::vector<double> zeros;
  const double step = 0.25;
  auto f = [n](double x) { return std::cyl_bessel_j(static_cast<double>(n), x); };
  double a = (n == 0) ? 0.5 : static_cast<double>(n);
  double fa = f(a);
  while (true) {
    const double b = a + step;
    const double fb = f(b);
    if (fa == 0.0) {
      zeros.push_back(a);
    } else if ((fa < 0) != (fb < 0) && fb != 0.0) {
      zeros.push_back(brent_root(f, a, b, fa, fb));
    }
    if (!zeros.empty() && zeros.back() >= x_max) break;
    a = b;
    fa = fb;
  }
  return zeros;
}

}  // namespace cladwise::bessel
