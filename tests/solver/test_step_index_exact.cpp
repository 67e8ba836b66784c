// Independent check of the exact vector modes: the 4×4 boundary-matching determinant of the field
// coefficients, written directly from Maxwell's equations and evaluated with Boost.Math Bessel
// functions (independent of the std:: functions and of the reduced equation the module solves).
//
// Fields ∝ exp(j(ωt − βz) + jνφ-dependence); in each region E_z and H_z solve the Helmholtz
// equation: core A J_ν(κr), B J_ν(κr); cladding C K_ν(γr), D K_ν(γr), with κ = U/a, γ = W/a and
// E_z ∝ cos νφ, H_z ∝ sin νφ. The transverse fields from Maxwell's curl equations in cylindrical
// coordinates (e.g. D. M. Pozar, "Microwave Engineering", eq. 3.110; from memory):
//   E_φ = (−j/k_c²)[(β/r) ∂_φ E_z − ωμ0 ∂_r H_z],  H_φ = (−j/k_c²)[ωε ∂_r E_z + (β/r) ∂_φ H_z],
// k_c² = κ² in the core, −γ² in the cladding. Continuity of E_z, H_z, E_φ, H_φ at r = a gives four
// homogeneous equations in (A, Z0 B, C K_ν(W), Z0 D K_ν(W)) (column scalings by K_ν(W) > 0 keep
// the sign of the determinant); a guided mode is a zero of the determinant for n_clad < n_eff <
// n_core, found by a fine scan and bisection.
#include <gtest/gtest.h>

#include <Eigen/Dense>
#include <algorithm>
#include <boost/math/special_functions/bessel.hpp>
#include <boost/math/special_functions/bessel_prime.hpp>
#include <cmath>
#include <cstdio>
#include <map>
#include <numbers>

#include "solver/step_index.hpp"

using namespace cladwise;
namespace bm = boost::math;

namespace {

// det M(b) for azimuthal order nu at normalised propagation constant b = W²/V².
double boundary_determinant(const StepIndexFibre& f, int nu, double b) {
  const double k = 2.0 * std::numbers::pi / f.wavelength_um, a = f.radius_um;
  const double n1sq = f.n_core * f.n_core, n2sq = f.n_clad * f.n_clad;
  const double v = k * a * std::sqrt(n1sq - n2sq);
  const double u = v * std::sqrt(1.0 - b), w = v * std::sqrt(b);
  const double beta = k * std::sqrt(n2sq + (n1sq - n2sq) * b);
  const double kappa = u / a, gamma = w / a;
  const double j = bm::cyl_bessel_j(nu, u), jp = bm::cyl_bessel_j_prime(nu, u);
  const double kk = bm::cyl_bessel_k_prime(nu, w) / bm::cyl_bessel_k(nu, w);  // K'/K
  const double core_e = beta * nu / (a * kappa * kappa), clad_e = beta * nu / (a * gamma * gamma);
  Eigen::Matrix4d m;
  // unknowns:      A                     Z0 B              C K_ν(W)             Z0 D K_ν(W)
  m << j,                    0.0,              -1.0,                0.0,                  // E_z
       0.0,                  j,                0.0,                 -1.0,                 // H_z
       -core_e * j,          -k / kappa * jp,  -clad_e,             -k / gamma * kk,      // E_φ
       k * n1sq / kappa * jp, core_e * j,      k * n2sq / gamma * kk, clad_e;             // Z0 H_φ
  return m.determinant();
}

// n_eff of every zero of the determinant for order nu, descending.
std::vector<double> determinant_modes(const StepIndexFibre& f, int nu) {
  const int n = 6000;
  std::vector<double> out;
  auto det = [&](double b) { return boundary_determinant(f, nu, b); };
  // b = t², dense near b = 0 where modes sit just above cutoff.
  double b_prev = std::pow(0.5 / n, 2), d_prev = det(b_prev);
  for (int i = 1; i < n; ++i) {
    const double b = std::pow((i + 0.5) / n, 2), d = det(b);
    if ((d > 0) != (d_prev > 0)) {
      double lo = b_prev, hi = b, dlo = d_prev;
      for (int it = 0; it < 200 && hi - lo > 1e-17; ++it) {
        const double mid = 0.5 * (lo + hi), dm = det(mid);
        if ((dm > 0) == (dlo > 0)) {
          lo = mid;
          dlo = dm;
        } else {
          hi = mid;
        }
      }
      const double bb = 0.5 * (lo + hi);
      const double n1sq = f.n_core * f.n_core, n2sq = f.n_clad * f.n_clad;
      out.push_back(std::sqrt(n2sq + (n1sq - n2sq) * bb));
    }
    b_prev = b;
    d_prev = d;
  }
  std::sort(out.rbegin(), out.rend());
  return out;
}

// Module modes grouped by azimuthal order (TE and TM are order 0), each group descending.
std::map<int, std::vector<double>> module_modes_by_order(const StepIndexFibre& f) {
  std::map<int, std::vector<double>> out;
  for (const auto& m : solve_vector_modes(f)) out[m.nu].push_back(m.n_eff);
  for (auto& [nu, list] : out) std::sort(list.rbegin(), list.rend());
  return out;
}

// Compares every order up to two beyond the highest the module reports (those must be empty).
double compare_with_determinant(const StepIndexFibre& f, int expected_total) {
  const auto mine = module_modes_by_order(f);
  const int nu_max = mine.empty() ? 0 : mine.rbegin()->first;
  double max_err = 0.0;
  int total = 0;
  for (int nu = 0; nu <= nu_max + 2; ++nu) {
    const auto ref = determinant_modes(f, nu);
    const auto it = mine.find(nu);
    const std::vector<double> got = it == mine.end() ? std::vector<double>{} : it->second;
    EXPECT_EQ(got.size(), ref.size()) << "order " << nu << " of fibre a = " << f.radius_um;
    for (std::size_t i = 0; i < std::min(got.size(), ref.size()); ++i) {
      EXPECT_NEAR(got[i], ref[i], 1e-9) << "order " << nu << " mode " << i;
      max_err = std::max(max_err, std::fabs(got[i] - ref[i]));
    }
    total += static_cast<int>(ref.size());
  }
  EXPECT_EQ(total, expected_total);
  return max_err;
}

}  // namespace

// Weakly guiding single-mode fibre of checks.md §2/§8 (n1 = 1.4494, n2 = 1.4440, a = 4.1 µm,
// λ = 1.55 µm, V = 2.077): HE11 only; checks.md §8 gives 1.446376694 (computed from the formula).
TEST(StepIndexExact, WeakFibreAgreesWithBoundaryDeterminant) {
  const StepIndexFibre f{1.4494, 1.4440, 4.1, 1.55};
  const double err = compare_with_determinant(f, 1);
  EXPECT_LT(err, 1e-12);
  std::printf("weak fibre: max |n_eff - determinant| = %.3g\n", err);
  EXPECT_NEAR(determinant_modes(f, 1).at(0), 1.446376694, 1e-9);  // checks.md §8
}

// Few-mode fibre (our scenario: the command's example indices with a 10 µm core, V = 5.21).
TEST(StepIndexExact, FewModeFibreAgreesWithBoundaryDeterminant) {
  const StepIndexFibre f{1.4504, 1.4447, 10.0, 1.55};
  ASSERT_NEAR(f.v_number(), 5.207, 1e-3);
  // V = 5.21 guides LP01 (HE11), LP11 (TE01, TM01, HE21), LP21 (EH11, HE31), LP02 (HE12) and
  // LP31 (EH21, HE41; cutoff j21 = 5.1356, A&S Table 9.5), not LP12 (j02 = 5.5201 > V): 9 modes.
  const double err = compare_with_determinant(f, 9);
  EXPECT_LT(err, 1e-12);
  std::printf("few-mode fibre: max |n_eff - determinant| = %.3g\n", err);
}

// High-contrast silica rods in air (checks.md §8: n1 = 1.444024, a = 0.5 and 1.0 µm), and a 2 µm
// rod (V = 8.45) with more orders.
TEST(StepIndexExact, HighContrastRodsAgreeWithBoundaryDeterminant) {
  const StepIndexFibre thin{1.444024, 1.0, 0.5, 1.55};
  compare_with_determinant(thin, 1);
  EXPECT_NEAR(determinant_modes(thin, 1).at(0), 1.171679808, 1e-9);  // checks.md §8
  const StepIndexFibre rod{1.444024, 1.0, 1.0, 1.55};
  compare_with_determinant(rod, 6);
  const auto te_tm = determinant_modes(rod, 0);
  ASSERT_EQ(te_tm.size(), 2u);
  EXPECT_NEAR(te_tm[0], 1.234710532, 1e-9);  // TE01, checks.md §8
  EXPECT_NEAR(te_tm[1], 1.197601462, 1e-9);  // TM01, checks.md §8
  const auto order1 = determinant_modes(rod, 1);
  ASSERT_EQ(order1.size(), 3u);
  EXPECT_NEAR(order1[0], 1.352729373, 1e-9);  // HE11
  EXPECT_NEAR(order1[1], 1.052604075, 1e-9);  // EH11
  EXPECT_NEAR(order1[2], 1.009083833, 1e-9);  // HE12
  EXPECT_NEAR(determinant_modes(rod, 2).at(0), 1.202253591, 1e-9);  // HE21
  const StepIndexFibre wide{1.444024, 1.0, 2.0, 1.55};
  int total = 0;
  for (int nu = 0; nu < 12; ++nu) total += static_cast<int>(determinant_modes(wide, nu).size());
  EXPECT_GT(total, 15);
  const double err = compare_with_determinant(wide, total);
  std::printf("2 um rod: %d modes, max |n_eff - determinant| = %.3g\n", total, err);
}
