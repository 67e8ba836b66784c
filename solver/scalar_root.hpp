// Scalar root finding on a sign-changing bracket: Brent's method (R. P. Brent, "Algorithms for
// Minimization without Derivatives", Prentice-Hall 1973, ch. 4, procedure zero), with a bisection
// prelude so that the ends of the bracket may be poles (values ±inf) of the function.
#pragma once

#include <algorithm>
#include <cassert>
#include <cmath>
#include <limits>
#include <utility>

namespace cladwise {

/// Root of f on [a, b], given f(a) = fa and f(b) = fb of opposite signs (either may be ±inf, e.g.
/// at a pole; f is then never evaluated there). Converges to |Δx| <= 4 eps |x| + x_tol.
template <typename F>
double brent_root(F&& f, double a, double b, double fa, double fb, double x_tol = 0.0) {
  assert(!(fa > 0 && fb > 0) && !(fa < 0 && fb < 0));
  constexpr double eps = std::numeric_limits<double>::epsilon();
  if (fa == 0) return a;
  if (fb == 0) return b;
  // Pull infinite ends inwards by bisection first: interpolation needs finite values.
  for (int it = 0; it < 200 && (!std::isfinite(fa) || !std::isfinite(fb)); ++it) {
    const double m = 0.5 * (a + b);
    const double fm = f(m);
    if (fm == 0) return m;
    if ((fm > 0) == (fa > 0)) {
      a = m;
      fa = fm;
    } else {
      b = m;
      fb = fm;
    }
  }
  double c = b, fc = fb, d = b - a, e = d;
  for (int it = 0; it < 300; ++it) {
    if ((fb > 0) == (fc > 0)) {
      c = a;
      fc = fa;
      d = e = b - a;
    }
    if (std::fabs(fc) < std::fabs(fb)) {
      a = b;
      b = c;
      c = a;
      fa = fb;
      fb = fc;
      fc = fa;
    }
    const double tol = 2.0 * eps * std::fabs(b) + 0.5 * x_tol;
    const double m = 0.5 * (c - b);
    if (std::fabs(m) <= tol || fb == 0) return b;
    if (std::fabs(e) >= tol && std::fabs(fa) > std::fabs(fb)) {
      // Secant or inverse quadratic interpolation (Brent 1973, ch. 4).
      double p, q;
      const double s = fb / fa;
      if (a == c) {
        p = 2.0 * m * s;
        q = 1.0 - s;
      } else {
        const double qa = fa / fc, r = fb / fc;
        p = s * (2.0 * m * qa * (qa - r) - (b - a) * (r - 1.0));
        q = (qa - 1.0) * (r - 1.0) * (s - 1.0);
      }
      if (p > 0) q = -q;
      else p = -p;
      if (2.0 * p < std::min(3.0 * m * q - std::fabs(tol * q), std::fabs(e * q))) {
        e = d;
        d = p / q;
      } else {
        d = m;
        e = m;
      }
    } else {
      d = m;
      e = m;
    }
    a = b;
    fa = fb;
    b += (std::fabs(d) > tol) ? d : (m > 0 ? tol : -tol);
    fb = f(b);
  }
  return b;
}

}  // namespace cladwise
