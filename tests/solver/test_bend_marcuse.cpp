// Bend loss of the weakly guiding step-index fibre (checks.md §2, §5: n_co 1.4494, n_cl 1.4440,
// a 4.1 µm, λ 1.55 µm) by the exact equivalent straight guide (D. M. Shyroki, IEEE Trans. MTT 56,
// 414 (2008)) with a cylindrical PML, against Marcuse's curvature-loss formula (D. Marcuse, JOSA 66,
// 216 (1976); formula from memory, checks.md §5 table: 38.54 dB/m at R = 10 mm). Where the formula
// applies (R ≫ a, loss ≪ 1 dB/mm): within a factor 1.5, and the slope d ln α/dR within 10 % of
// −2γ³/(3β²). Heavier sweeps: tests/benchmark/bench_leaky.cpp (bend).
#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <numbers>

#include "leaky_cases.hpp"

namespace cladwise {
namespace {

TEST(BendMarcuse, LossAndItsSlopeFollowMarcuse) {
  const StepIndexFibre f{1.4494, 1.4440, 4.1, 1.55};
  EXPECT_NEAR(testing::marcuse_loss_db_per_m(f, 10000.0), 38.54, 0.05);  // checks.md §5 table
  const double radii[2] = {10000.0, 12500.0};
  double loss[2];
  for (int i = 0; i < 2; ++i) {
    const LeakyMode m = testing::bent_fibre_mode(radii[i], 30.0, 6.0, 10.0, 0.6, 1.5,
                                                 BendModel::exact_transformation);
    loss[i] = m.loss_db_per_m;
    const double ref = testing::marcuse_loss_db_per_m(f, radii[i]);
    std::printf("R %.1f mm: n_eff %.9f %+.3e, %.3f dB/m (%.4f dB per turn), Marcuse %.3f, ratio %.3f, phys %.4f\n",
                radii[i] / 1000, m.n_eff.real(), m.n_eff.imag(), loss[i],
                bend_loss_db(loss[i], radii[i], 2 * std::numbers::pi), ref, loss[i] / ref, m.physical_fraction);
    EXPECT_GT(m.physical_fraction, 0.99);
    EXPECT_LT(m.n_eff.imag(), 0.0);
    EXPECT_GT(loss[i] / ref, 1.0 / 1.5);
    EXPECT_LT(loss[i] / ref, 1.5);
  }
  // Slope against the exponent of the formula, −2γ³/(3β²), with γ, β of LP01.
  const auto lp = solve_lp_modes(f);
  const double k0 = f.k0_per_um(), beta = lp[0].beta;
  const double gamma = std::sqrt(beta * beta - f.n_clad * f.n_clad * k0 * k0);
  const double c = 2 * gamma * gamma * gamma / (3 * beta * beta);
  const double slope = std::log(loss[1] / loss[0]) / (radii[1] - radii[0]);
  std::printf("d ln α/dR: FEM %.4e /µm, −2γ³/(3β²) = %.4e /µm, ratio %.3f\n", slope, -c, -slope / c);
  EXPECT_NEAR(-slope / c, 1.0, 0.10);
  // Per-turn bookkeeping: a 90° turn is a quarter of a full turn.
  EXPECT_NEAR(bend_loss_db(loss[0], radii[0], std::numbers::pi / 2) * 4,
              bend_loss_db(loss[0], radii[0], 2 * std::numbers::pi), 1e-12);
}

}  // namespace
}  // namespace cladwise
