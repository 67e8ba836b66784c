// Form birefringence of a slightly elliptical, weakly guiding step-index core against the
// first-order perturbation result (derived; docs/metrics.md "Elliptical core: form birefringence
// by perturbation"):
//
//   core boundary r = ρ(1 + ε cos 2φ) (semi-axes ρ(1 + ε) along x, ρ(1 − ε) along y),
//   B = n_x − n_y = (2Δ)^{3/2} ε g(V) / (2 k0 ρ),   g(V) = U² W² S / (p² V³),
//   p = U J1(U)/J0(U) = W K1(W)/K0(W),
//   α = V² / [U J1(U)/J2(U) + W K1(W)/K2(W)],
//   S = p² + 2p + W² − α [p + W K1(W)/K2(W)],
//
// with U, W of the round-core LP01 mode (solve_lp_modes) and Δ = (n_core² − n_clad²)/(2 n_core²).
// Eccentricity form: e² = 1 − (1 − ε)²/(1 + ε)² ≈ 4ε, so B ≈ (2Δ)^{3/2} e² g(V)/(8 k0 ρ).
// Validity: leading order in ε and in Δ. B is odd in ε (swapping the axes flips its sign), so B/ε
// has O(ε²) corrections only; the O(Δ) vector corrections left out are about Δ relative (the same
// formula for the round core gives the HE11 − LP01 shift of checks.md §8 to 0.7 %).
// The derivation uses the weak-guidance polarisation correction δβ_x = −(1/2β)∫ψ ∂xψ ∂x ln n² dA
// / ∫ψ² dA (Snyder & Love, Optical Waveguide Theory (1983), ch. 13; from memory) applied to the
// scalar mode of the deformed core to first order in ε; no published table was found stored.
//
// FEM: a quarter of the cross-section. x-polarised fundamental: magnetic wall on y = 0, electric
// on x = 0; y-polarised: the reverse. The outer wall is electric, at 9ρ (field ~e^{−Wr/ρ}).
#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>

#include "mode_metrics_fibres.hpp"
#include "solver/mode_metrics.hpp"
#include "solver/step_index.hpp"

namespace cladwise {
namespace {

constexpr double kLambda = 1.55;

struct Guide {
  double n_core, n_clad, rho_um;
};

double delta_of(const Guide& g) {
  return (g.n_core * g.n_core - g.n_clad * g.n_clad) / (2 * g.n_core * g.n_core);
}

/// Core mean radius ρ giving the V number v at kLambda.
Guide guide_at_v(double n_core, double n_clad, double v) {
  const double k0 = 2 * std::numbers::pi / kLambda;
  return {n_core, n_clad, v / (k0 * std::sqrt(n_core * n_core - n_clad * n_clad))};
}

/// g(V) of the header, from the round-core LP01 U, W (C++17 special functions).
double g_of_v(const Guide& g) {
  const StepIndexFibre f{g.n_core, g.n_clad, g.rho_um, kLambda};
  const auto lp = solve_lp_modes(f);
  const double u = lp.at(0).u, w = lp.at(0).w, v = f.v_number();
  const double p = u * std::cyl_bessel_j(1.0, u) / std::cyl_bessel_j(0.0, u);
  const double wk12 = w * std::cyl_bessel_k(1.0, w) / std::cyl_bessel_k(2.0, w);
  const double alpha = v * v / (u * std::cyl_bessel_j(1.0, u) / std::cyl_bessel_j(2.0, u) + wk12);
  const double s = p * p + 2 * p + w * w - alpha * (p + wk12);
  return u * u * w * w * s / (p * p * v * v * v);
}

/// Perturbation B = n_x − n_y of the header.
double perturbation_birefringence(const Guide& g, double eps) {
  const double k0 = 2 * std::numbers::pi / kLambda;
  return std::pow(2 * delta_of(g), 1.5) * eps * g_of_v(g) / (2 * k0 * g.rho_um);
}

struct FemPair {
  double n_x = 0, n_y = 0;
  int n_dofs = 0;
};

/// n_eff of the x- and y-polarised fundamentals of the core with semi-axes ρ(1 ± ε).
FemPair fem_pair(const Guide& g, double eps, double core_size_um) {
  testing::FibreSpec s;
  s.cores = {{"core", {0.0, 0.0}, g.rho_um * (1 + eps), g.rho_um * (1 - eps)}};
  if (eps == 0.0) s.cores[0].semi_axis_y_um = 0.0;  // the round core as a Disk
  s.wall_radius_um = 9 * g.rho_um;
  s.core_size_um = core_size_um;
  s.clad_size_um = 1.5 * g.rho_um;
  s.growth = 1.2;
  s.symmetry = SymmetryCut::quarter;
  const Mesh mesh = testing::fibre_mesh(s);
  FemPair out;
  for (int pol = 0; pol < 2; ++pol) {
    std::vector<WallType> walls;
    for (const auto& b : mesh.boundaries) {
      if (b.kind == BoundaryKind::symmetry_x) walls.push_back(pol == 0 ? WallType::magnetic : WallType::electric);
      else if (b.kind == BoundaryKind::symmetry_y) walls.push_back(pol == 0 ? WallType::electric : WallType::magnetic);
      else walls.push_back(WallType::electric);
    }
    ModeSolver solver(testing::fibre_problem(mesh, g.n_core, g.n_clad, kLambda, 2, walls));
    SolveRequest req;
    req.n_modes = 1;
    const SolveResult r = solver.solve(req);
    EXPECT_EQ(r.status, EigenStatus::converged);
    (pol == 0 ? out.n_x : out.n_y) = r.modes.at(0).n_eff;
    out.n_dofs = r.n_dofs;
  }
  return out;
}

// Fibres: Δ ≈ 1 % (1.4600 / 1.4454) so that B is ~7e-6 at ε = 0.05, far above the pair-splitting
// noise of the quarter mesh (< 1e-9 for the round core below); and Δ ≈ 0.4 % (1.4504 / 1.4447)
// and 0.2 % (1.4475 / 1.4447) for the Δ → 0 trend. Our own scenarios, λ = 1.55 µm.
constexpr double kStrongCore = 1.4600, kStrongClad = 1.4454;
constexpr double kWeakCore = 1.4504, kWeakClad = 1.4447;
constexpr double kWeakerCore = 1.4475, kWeakerClad = 1.4447;
constexpr double kCoreSize = 0.06;  // element size in the core, in units of ρ (order 2)

double fem_birefringence(const Guide& g, double eps) {
  const FemPair f = fem_pair(g, eps, kCoreSize * g.rho_um);
  const Birefringence b = birefringence(f.n_x, f.n_y, kLambda);
  if (eps > 0) {
    const double bf = perturbation_birefringence(g, eps);
    std::printf("Delta %.5f V %.2f rho %.3f um eps %.3f (%d dofs): B FEM %.5e, formula %.5e, ratio %.5f, "
                "L_B %.1f mm\n", delta_of(g), StepIndexFibre{g.n_core, g.n_clad, g.rho_um, kLambda}.v_number(),
                g.rho_um, eps, f.n_dofs, b.phase, bf, b.phase / bf, b.beat_length_mm);
  }
  return b.phase;
}

// The polarisation-correction step of the derivation, on the round core: the same boundary
// integral gives δβ = −(2Δ)^{3/2} U² W K0(W) / (2ρ V³ K1(W)) for HE11 − LP01 (Snyder & Love 1983,
// ch. 13; from memory), checked here against the exact vector and scalar step-index solutions
// (solve_vector_modes / solve_lp_modes) to within 3Δ relative (the neglected O(Δ) terms).
TEST(EllipticalBirefringence, PolarisationCorrectionMatchesExactHe11Shift) {
  for (const Guide& g : {guide_at_v(kStrongCore, kStrongClad, 2.0), guide_at_v(kWeakCore, kWeakClad, 2.0)}) {
    const StepIndexFibre f{g.n_core, g.n_clad, g.rho_um, kLambda};
    const auto lp = solve_lp_modes(f);
    const auto vec = solve_vector_modes(f);
    ASSERT_EQ(vec.at(0).label, "HE11");
    const double u = lp.at(0).u, w = lp.at(0).w, v = f.v_number(), d = delta_of(g);
    const double shift = -std::pow(2 * d, 1.5) * u * u * w * std::cyl_bessel_k(0.0, w) /
                         (2 * g.rho_um * v * v * v * std::cyl_bessel_k(1.0, w)) / f.k0_per_um();
    const double exact = vec.at(0).n_eff - lp.at(0).n_eff;
    std::printf("Delta %.5f: HE11 - LP01 exact %.5e, perturbation %.5e (ratio %.4f)\n", d, exact, shift, shift / exact);
    EXPECT_NEAR(shift / exact, 1.0, 3 * d);
  }
}

// Pair-splitting noise: the round core on the same kind of quarter mesh. x and y polarisations see
// different (unmirrored) meshes, so B is not exactly 0; it must stay far below the B checked below.
TEST(EllipticalBirefringence, RoundCoreSplitIsBelowOnePerMilleOfTheSignal) {
  const Guide g = guide_at_v(kStrongCore, kStrongClad, 2.0);
  const double b0 = fem_birefringence(g, 0.0);
  std::printf("round core: B = %.3e (formula for eps = 0.025: %.3e)\n", b0, perturbation_birefringence(g, 0.025));
  EXPECT_LT(std::abs(b0), 1e-3 * perturbation_birefringence(g, 0.025));
  EXPECT_LT(std::abs(b0), 2e-9);
}

// Three V values at Δ ≈ 1 %, ε = 0.05: FEM against the formula within 3 % (= 3Δ: the formula is
// leading order in Δ, the measured excess is +1.5…1.7 %, about 1.7Δ). The major (x) axis is the
// slow axis (B > 0), as the formula says.
//
// At V = 2 also against an independent full-vector point-matching solution of the same elliptical
// core, B = 7.05666882e-6 (tests/benchmark/elliptical_core_point_matching.py: cylindrical
// harmonics matched on the ellipse, converged to 1e-15; a number computed in this project, not a
// published one), within 0.3 % (measured −0.093 %, the FEM's mesh error).
TEST(EllipticalBirefringence, AgainstPerturbationFormulaAtThreeV) {
  for (double v : {1.6, 2.0, 2.4}) {
    const Guide g = guide_at_v(kStrongCore, kStrongClad, v);
    const double b = fem_birefringence(g, 0.05), bf = perturbation_birefringence(g, 0.05);
    EXPECT_GT(b, 0.0);
    EXPECT_NEAR(b / bf, 1.0, 3 * delta_of(g)) << "V = " << v;
    if (v == 2.0) {
      EXPECT_NEAR(b / 7.05666882e-6, 1.0, 3e-3);
    }
  }
}

// Within the stated validity the agreement improves as Δ → 0 (V = 2, ε = 0.05): |ratio − 1| falls
// with Δ and stays within 3Δ at each Δ. (The point-matching solution gives ratio 1 + 1.78Δ; the
// FEM's small-Δ ratios carry its ~1e-9 absolute error on B, docs/metrics.md.)
TEST(EllipticalBirefringence, AgreementImprovesAsDeltaShrinks) {
  double previous = 1.0;
  for (auto [n1, n2] : {std::pair{kStrongCore, kStrongClad}, std::pair{kWeakCore, kWeakClad},
                        std::pair{kWeakerCore, kWeakerClad}}) {
    const Guide g = guide_at_v(n1, n2, 2.0);
    const double dev = std::abs(fem_birefringence(g, 0.05) / perturbation_birefringence(g, 0.05) - 1.0);
    EXPECT_LT(dev, 3 * delta_of(g)) << "Delta = " << delta_of(g);
    EXPECT_LT(dev, previous) << "Delta = " << delta_of(g);
    previous = dev;
  }
}

// Eccentricity scaling (Δ ≈ 0.4 %, V = 2): B ∝ ε ≈ e²/4, B/ε constant to 0.5 % for ε = 0.025…0.1
// (B is odd in ε, so the first correction is O(ε²)). B/e² with the exact e² = 1 − (1−ε)²/(1+ε)²
// carries the factor (1+ε)² and is printed only.
TEST(EllipticalBirefringence, ScalesWithSquaredEccentricity) {
  const Guide g = guide_at_v(kWeakCore, kWeakClad, 2.0);
  std::vector<double> per_eps;
  for (double eps : {0.025, 0.05, 0.1}) {
    const double b = fem_birefringence(g, eps);
    const double e2 = 1.0 - std::pow((1 - eps) / (1 + eps), 2);
    per_eps.push_back(b / eps);
    std::printf("eps %.3f: B/eps %.5e, B/e^2 %.5e\n", eps, b / eps, b / e2);
  }
  EXPECT_NEAR(per_eps[0] / per_eps[2], 1.0, 5e-3);
  EXPECT_NEAR(per_eps[1] / per_eps[2], 1.0, 5e-3);
  EXPECT_NEAR(per_eps[2] / (perturbation_birefringence(g, 0.1) / 0.1), 1.0, 3 * delta_of(g));
}

}  // namespace
}  // namespace cladwise
