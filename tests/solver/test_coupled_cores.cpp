// Two identical weakly guiding step-index cores (checks.md §2/§4 model fibre: n1 = 1.4494,
// n2 = 1.4440, ρ = 4.1 µm, λ = 1.55 µm) at separations d:
//   * κ = (β_e − β_o)/2 of the FEM supermodes against the coupled-mode formula for identical cores
//     C = (2Δ)^½ U² K0(W d/ρ) / (ρ V³ K1²(W)) (Snyder & Love 1983, ch. 18, eq. 18-26; from memory,
//     checks.md §4), within a few % for d/ρ ≥ 4, and its log-slope d ln C/dd = −W/ρ;
//   * the even/odd x-polarised supermodes on a quarter of the cross-section (magnetic wall on y = 0;
//     electric wall on x = 0 for the even, magnetic for the odd supermode: same mesh, so the
//     discretisation error largely cancels in the splitting);
//   * the full cross-section: per-core power ½/½, and κ from the coupling matrix of
//     core_array_coupling equals the splitting κ.
#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>

#include "mode_metrics_fibres.hpp"
#include "solver/coupled_cores.hpp"
#include "solver/step_index.hpp"

namespace cladwise {
namespace {

constexpr double kN1 = 1.4494, kN2 = 1.4440, kRho = 4.1, kLambda = 1.55;

/// Coupled-mode C (1/m) of checks.md §4, recomputed from the isolated-core LP01 (U, W).
double cmt_coupling_per_m(double d) {
  const StepIndexFibre f{kN1, kN2, kRho, kLambda};
  const auto lp = solve_lp_modes(f);
  const double u = lp[0].u, w = lp[0].w, v = f.v_number();
  const double delta = (kN1 * kN1 - kN2 * kN2) / (2 * kN1 * kN1);
  const double k1 = std::cyl_bessel_k(1.0, w);
  return std::sqrt(2 * delta) * u * u * std::cyl_bessel_k(0.0, w * d / kRho) / (kRho * v * v * v * k1 * k1) * 1e6;
}

double quarter_kappa_per_m(double d) {
  testing::FibreSpec s;
  s.cores = {{"core", {0.5 * d, 0.0}, kRho}};
  s.wall_radius_um = 0.5 * d + 9 * kRho;
  s.core_size_um = 0.5;
  s.clad_size_um = 2.5;
  s.symmetry = SymmetryCut::quarter;
  const Mesh mesh = testing::fibre_mesh(s);
  double beta[2];
  for (int parity = 0; parity < 2; ++parity) {
    std::vector<WallType> walls;
    for (const auto& b : mesh.boundaries) {
      if (b.kind == BoundaryKind::symmetry_x) walls.push_back(WallType::magnetic);  // y = 0: x-pol
      else if (b.kind == BoundaryKind::symmetry_y) walls.push_back(parity == 0 ? WallType::electric : WallType::magnetic);
      else walls.push_back(WallType::electric);
    }
    ModeSolver solver(testing::fibre_problem(mesh, kN1, kN2, kLambda, 2, walls));
    SolveRequest req;
    req.n_modes = 1;
    const SolveResult r = solver.solve(req);
    EXPECT_EQ(r.status, EigenStatus::converged);
    beta[parity] = r.modes.at(0).beta;
  }
  return coupling_from_splitting(beta[0], beta[1]).kappa_per_m;
}

TEST(CoupledCores, ChecksTableRecomputed) {
  // checks.md §4 table (computed from the formula): C(20 µm) = 29.419 /m, C(25 µm) = 4.9113 /m.
  EXPECT_NEAR(cmt_coupling_per_m(20.0) / 29.419, 1.0, 2e-3);
  EXPECT_NEAR(cmt_coupling_per_m(25.0) / 4.9113, 1.0, 2e-3);
}

TEST(CoupledCores, TwoCoreSplittingAgainstCoupledModeTheory) {
  const double d1 = 20.0, d2 = 25.0;  // d/ρ = 4.9 and 6.1
  const double k1 = quarter_kappa_per_m(d1), k2 = quarter_kappa_per_m(d2);
  const double c1 = cmt_coupling_per_m(d1), c2 = cmt_coupling_per_m(d2);
  std::printf("d %.0f um: kappa FEM %.4f /m, CMT %.4f /m (%+.2f %%), L_c %.2f mm\n", d1, k1, c1,
              100 * (k1 / c1 - 1), 1e3 * coupling_from_splitting(0, -2e-6 * k1).coupling_length_m);
  std::printf("d %.0f um: kappa FEM %.4f /m, CMT %.4f /m (%+.2f %%)\n", d2, k2, c2, 100 * (k2 / c2 - 1));
  EXPECT_NEAR(k1 / c1, 1.0, 0.05);
  EXPECT_NEAR(k2 / c2, 1.0, 0.05);
  // d ln C / dd = −W/ρ (the K0 tail; the d^-½ prefactor of K0 is included in the CMT values, so
  // compare the slopes of FEM and formula, and the formula's slope with −W/ρ at large argument).
  const double slope_fem = std::log(k2 / k1) / (d2 - d1), slope_cmt = std::log(c2 / c1) / (d2 - d1);
  const auto lp = solve_lp_modes(StepIndexFibre{kN1, kN2, kRho, kLambda});
  std::printf("log-slope FEM %.5f /um, CMT %.5f /um, -W/rho %.5f /um\n", slope_fem, slope_cmt, -lp[0].w / kRho);
  EXPECT_NEAR(slope_fem / slope_cmt, 1.0, 0.03);
  // −W/ρ is the exponent of the K0 tail; its d^-½ prefactor adds −1/(2d) at the mid separation
  // (large-argument form K0(x) ≈ (π/2x)^½ e^{−x}, Abramowitz & Stegun 9.7.2).
  EXPECT_NEAR(slope_fem / (-lp[0].w / kRho - 1.0 / (d1 + d2)), 1.0, 0.02);
}

TEST(CoupledCores, FullCrossSectionPerCorePowerAndCouplingMatrix) {
  const double d = 20.0;
  testing::FibreSpec s;
  s.cores = {{"core_a", {-0.5 * d, 0.0}, kRho}, {"core_b", {0.5 * d, 0.0}, kRho}};
  s.wall_radius_um = 0.5 * d + 8 * kRho;
  s.core_size_um = 0.6;
  s.clad_size_um = 3.0;
  const Mesh mesh = testing::fibre_mesh(s);
  ModeSolver solver(testing::fibre_problem(mesh, kN1, kN2, kLambda, 2));
  SolveRequest req;
  req.n_modes = 4;
  const SolveResult r = solver.solve(req);
  ASSERT_EQ(r.status, EigenStatus::converged);
  ASSERT_EQ(r.modes.size(), 4u);
  const std::vector<Point2> centres{{-0.5 * d, 0.0}, {0.5 * d, 0.0}};
  std::vector<SupermodeCores> cores;
  for (const Mode& m : r.modes) {
    const ModeFieldEvaluator f(solver.problem(), solver.dof_map(), m);
    cores.push_back(supermode_cores(f, mesh, 2, centres));
    std::printf("n_eff %.9f %c-pol: power %.4f / %.4f, amplitude %+.4f %+.4f\n", m.n_eff,
                cores.back().polarisation, cores.back().power_fraction[0], cores.back().power_fraction[1],
                cores.back().amplitude[0], cores.back().amplitude[1]);
    EXPECT_NEAR(cores.back().power_fraction[0], 0.5, 1e-3);
  }
  const auto arrays = core_array_coupling(r.modes, cores, centres);
  ASSERT_EQ(arrays.size(), 2u);  // x and y
  const double c = cmt_coupling_per_m(d);
  for (const auto& a : arrays) {
    ASSERT_EQ(a.pairs.size(), 1u);
    std::printf("%c-pol: kappa %.4f /m, L_c %.2f mm (CMT %.4f /m)\n", a.polarisation,
                a.pairs[0].coupling.kappa_per_m, 1e3 * a.pairs[0].coupling.coupling_length_m, c);
    EXPECT_NEAR(a.pairs[0].coupling.kappa_per_m / c, 1.0, 0.05);
    // With two cores K_12 is exactly half the splitting of that polarisation.
    std::vector<double> b;
    for (std::size_t k = 0; k < r.modes.size(); ++k)
      if (cores[k].polarisation == a.polarisation) b.push_back(r.modes[k].beta);
    ASSERT_EQ(b.size(), 2u);
    EXPECT_NEAR(a.pairs[0].coupling.kappa_per_m, 0.5 * std::abs(b[0] - b[1]) * 1e6, 1e-6 * c);
  }
}

}  // namespace
}  // namespace cladwise
