// Butt-coupling (splice) efficiency between FEM modes of two cross-sections:
//   * a mode with itself: η = 1 (0 dB) to 1e-9;
//   * the same fibre on two different meshes: the HE11 pair of mesh 2 takes all the power of an
//     HE11 of mesh 1 (Σ η = 1 to the discretisation error);
//   * a lateral offset d between identical near-Gaussian modes: η ≈ exp(−d²/w²), and a tilt θ:
//     η ≈ exp(−(π n w θ/λ)²), w the Gaussian-fit mode-field radius (D. Marcuse, "Loss analysis of
//     single-mode fiber splices", BSTJ 56, 703 (1977); formulas from memory), within a few %.
// Fibre: checks.md §2 model fibre (n1 = 1.4494, n2 = 1.4440, a = 4.1 µm, λ = 1.55 µm).
#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>

#include "mesh/error.hpp"
#include "mode_metrics_fibres.hpp"
#include "solver/mode_metrics.hpp"
#include "solver/mode_overlap.hpp"

namespace cladwise {
namespace {

constexpr double kN1 = 1.4494, kN2 = 1.4440, kA = 4.1, kLambda = 1.55;

struct Fibre {
  Mesh mesh;
  std::unique_ptr<ModeSolver> solver;
  SolveResult result;
  std::unique_ptr<MeshLocator> locator;
  explicit Fibre(double core_size) {
    testing::FibreSpec s;
    s.cores = {{"core", {0.0, 0.0}, kA}};
    s.wall_radius_um = 8 * kA;
    s.core_size_um = core_size;
    mesh = testing::fibre_mesh(s);
    solver = std::make_unique<ModeSolver>(testing::fibre_problem(mesh, kN1, kN2, kLambda, 2));
    SolveRequest req;
    req.n_modes = 2;
    result = solver->solve(req);
    locator = std::make_unique<MeshLocator>(mesh);
  }
  JunctionSide side(int k) const { return {&solver->problem(), &solver->dof_map(), &result.modes[k]}; }
};

Fibre& fine() {
  static Fibre f(0.45);
  return f;
}
Fibre& coarse() {
  static Fibre f(0.7);
  return f;
}

TEST(ModeOverlap, IdenticalFibresCoupleFully) {
  const Fibre& f = fine();
  ASSERT_EQ(f.result.modes.size(), 2u);
  const CouplingResult c = butt_coupling(f.side(0), f.side(0), *f.locator);
  std::printf("self: eta - 1 = %.3e, loss %.3e dB\n", c.efficiency - 1.0, c.loss_db);
  EXPECT_NEAR(c.efficiency, 1.0, 1e-9);
  EXPECT_LT(std::abs(c.loss_db), 1e-8);
  // The two polarisations of the pair are orthogonal.
  EXPECT_LT(butt_coupling(f.side(0), f.side(1), *f.locator).efficiency, 1e-8);
}

TEST(ModeOverlap, SameFibreOnTwoMeshes) {
  const Fibre& a = fine();
  const Fibre& b = coarse();
  ASSERT_EQ(b.result.modes.size(), 2u);
  for (int k = 0; k < 2; ++k) {
    const double eta = butt_coupling(a.side(k), b.side(0), *b.locator).efficiency +
                       butt_coupling(a.side(k), b.side(1), *b.locator).efficiency;
    std::printf("fine mode %d into the coarse HE11 pair: eta %.8f\n", k, eta);
    EXPECT_NEAR(eta, 1.0, 1e-4);
  }
}

TEST(ModeOverlap, OffsetAndTiltAgainstGaussianFormulas) {
  const Fibre& f = fine();
  MetricOptions opt;
  opt.intensity_widths = false;
  const ModeMetrics m = mode_metrics(f.solver->problem(), f.solver->dof_map(), f.result.modes[0], opt);
  const double w = 0.5 * m.mfd_gaussian_um;
  for (double d : {1.0, 2.0, 4.0}) {
    JunctionAlignment al;
    al.offset_x_um = d * 0.6;
    al.offset_y_um = d * 0.8;
    const CouplingResult c = butt_coupling(f.side(0), f.side(0), *f.locator, al);
    const double gauss = std::exp(-d * d / (w * w));
    std::printf("offset %.1f um: eta %.5f (%.3f dB), Gaussian %.5f (%+.2f %%)\n", d, c.efficiency,
                c.loss_db, gauss, 100 * (c.efficiency / gauss - 1));
    EXPECT_NEAR(c.efficiency / gauss, 1.0, 0.03) << d;
  }
  for (double theta : {0.5, 1.0}) {
    JunctionAlignment al;
    al.tilt_deg = theta;
    al.medium_index = kN2;
    const CouplingResult c = butt_coupling(f.side(0), f.side(0), *f.locator, al);
    const double arg = std::numbers::pi * kN2 * w * theta * std::numbers::pi / 180.0 / kLambda;
    const double gauss = std::exp(-arg * arg);
    std::printf("tilt %.1f deg: eta %.5f, Gaussian %.5f (%+.2f %%)\n", theta, c.efficiency, gauss,
                100 * (c.efficiency / gauss - 1));
    EXPECT_NEAR(c.efficiency / gauss, 1.0, 0.03) << theta;
  }
}

TEST(ModeOverlap, DifferentWavelengthsAreRejected) {
  const Fibre& f = fine();
  ModeProblem other = f.solver->problem();
  other.wavelength_um = 1.31;
  const JunctionSide s2{&other, &f.solver->dof_map(), &f.result.modes[0]};
  EXPECT_THROW(butt_coupling(f.side(0), s2, *f.locator), InputError);
}

}  // namespace
}  // namespace cladwise
