// The Bessel helpers of the step-index module against Boost.Math (an independent implementation)
// where std:: functions lose range: large orders, tiny and large arguments.
#include <gtest/gtest.h>

#include <boost/math/special_functions/bessel.hpp>
#include <algorithm>
#include <cmath>
#include <stdexcept>

#include "solver/bessel.hpp"

using namespace cladwise;

// Below the turning point (x < n) the ratio comes from our continued fraction: relative 1e-12.
// Above it, from std::cyl_bessel_j, whose error is absolute, ~2e-13 of the envelope
// sqrt(2/(πx)) at x = 150 (measured against Boost and 30-digit values): the check is
// |ratio·J_n − J_{n−1}| <= 1e-12 · envelope · max(1, |ratio|).
TEST(StepIndexBessel, RatiosMatchBoostOverOrdersAndArguments) {
  for (int n : {1, 2, 5, 20, 60, 120}) {
    for (double x : {1e-6, 1e-3, 0.1, 1.0, 5.0, 0.5 * n, 0.99 * n, 1.01 * n + 0.3, 2.0 * n + 1, 150.0}) {
      const double jn = boost::math::cyl_bessel_j(n, x), jm = boost::math::cyl_bessel_j(n - 1, x);
      if (std::fabs(jn) < 1e-280) continue;  // Boost's own range
      if (x < n) {
        EXPECT_NEAR(bessel::j_ratio(n, x) / (jm / jn), 1.0, 1e-12) << "J ratio n=" << n << " x=" << x;
      } else {
        const double envelope = std::sqrt(2.0 / (M_PI * x));
        // Near a zero of J_n the ratio is large and inherits J_n's absolute error times the ratio.
        const double ratio = bessel::j_ratio(n, x);
        EXPECT_NEAR(ratio * jn, jm, 1e-12 * envelope * std::max(1.0, std::fabs(ratio)))
            << "J ratio n=" << n << " x=" << x;
      }
      double kb = 0.0;
      try {
        kb = boost::math::cyl_bessel_k(n - 1, x) / boost::math::cyl_bessel_k(n, x);
      } catch (const std::overflow_error&) {
        continue;  // K_n overflows a double; our ratio does not need it
      }
      EXPECT_NEAR(bessel::k_ratio(n, x) / kb, 1.0, 1e-12) << "K ratio n=" << n << " x=" << x;
    }
  }
  // J_{n−1}/J_n → 2n/x for x → 0 (A&S 9.1.7), also where J_n itself underflows.
  EXPECT_NEAR(bessel::j_ratio(80, 1e-8) * 1e-8 / 160.0, 1.0, 1e-12);
}

TEST(StepIndexBessel, LogKStaysFiniteWhereKOverflowsOrUnderflows) {
  // K_n(x) ~ ½ Γ(n) (2/x)^n for x → 0 (A&S 9.6.9): log K_100(1e-3) ≈ lgamma(100) − log 2 + 100 log 2000.
  const double small = bessel::log_k(100, 1e-3);
  EXPECT_NEAR(small, std::lgamma(100.0) - std::log(2.0) + 100 * std::log(2000.0), 1e-6);
  for (int n : {0, 1, 3, 40}) {
    for (double x : {0.01, 1.0, 30.0, 300.0}) {
      EXPECT_NEAR(bessel::log_k(n, x), std::log(boost::math::cyl_bessel_k(n, x)), 1e-12 * (1 + x))
          << n << " " << x;
    }
  }
  // Beyond the library's range: the asymptotic series, A&S 9.7.2 (K_0(x) ~ sqrt(π/2x) e^{−x}).
  const double x = 800.0;
  EXPECT_NEAR(bessel::log_k(0, x), 0.5 * std::log(M_PI / (2 * x)) - x + std::log1p(-1.0 / (8 * x) + 9.0 / (128 * x * x)), 1e-9);
  EXPECT_NEAR(bessel::k_ratio(1, x), (1 - 1.0 / (8 * x)) / (1 + 3.0 / (8 * x)), 1e-6);
}

TEST(StepIndexBessel, ZerosMatchBoost) {
  for (int n : {0, 1, 2, 7, 30, 55}) {
    const auto z = bessel::j_zeros(n, 60.0);
    ASSERT_FALSE(z.empty());
    EXPECT_GE(z.back(), 60.0);
    for (std::size_t i = 0; i < z.size(); ++i) {
      EXPECT_NEAR(z[i], boost::math::cyl_bessel_j_zero(double(n), int(i) + 1), 1e-12 * z[i]) << n;
    }
  }
  // A&S Table 9.5: j_{0,1} = 2.404825558, j_{1,1} = 3.831705970, j_{2,1} = 5.135622302.
  EXPECT_NEAR(bessel::j_zeros(0, 1.0)[0], 2.404825558, 1e-9);
  EXPECT_NEAR(bessel::j_zeros(1, 1.0)[0], 3.831705970, 1e-9);
  EXPECT_NEAR(bessel::j_zeros(2, 1.0)[0], 5.135622302, 1e-9);
}
