// Bessel functions of integer order for the step-index fibre: J_n, K_n of any sign of order,
// robust ratios J_{n-1}/J_n and K_{n-1}/K_n, log K_n (which over- or underflows long before the
// fields do), and the positive zeros j_{n,m} of J_n.
//
// Values come from the C++17 special functions std::cyl_bessel_j / std::cyl_bessel_k. Where those
// lose range we use ratios instead:
//  - J_{n-1}/J_n for x < n from the continued fraction J_n/J_{n-1} = 1/(2n/x − J_{n+1}/J_n)
//    (Abramowitz & Stegun 9.1.73), evaluated backwards, which is stable for the minimal solution;
//  - K_{n-1}/K_n from the forward recurrence K_{n+1} = K_{n-1} + (2n/x) K_n (A&S 9.6.26), stable
//    for K; for x > 500, where K_0 and K_1 underflow, from the asymptotic series A&S 9.7.2.
#pragma once

#include <vector>

namespace cladwise::bessel {

/// J_n(x) for any integer n (J_{-n} = (−1)^n J_n, A&S 9.1.5), x >= 0.
double j(int n, double x);
/// K_n(x) for any integer n (K_{-n} = K_n, A&S 9.6.6), x > 0. May overflow to inf / underflow to 0.
double k(int n, double x);
/// log K_n(x), finite for every x > 0 and every order the fibre needs.
double log_k(int n, double x);
/// J_{n-1}(x) / J_n(x) for n >= 1, x > 0 (±inf at the zeros of J_n).
double j_ratio(int n, double x);
/// K_{n-1}(x) / K_n(x) for n >= 1, x > 0 (always in (0, 1]).
double k_ratio(int n, double x);
/// All positive zeros of J_n below x_max in increasing order, followed by the first zero >= x_max
/// (so the list always ends beyond x_max). Each to full double precision.
std::vector<double> j_zeros(int n, double x_max);

}  // namespace cladwise::bessel
