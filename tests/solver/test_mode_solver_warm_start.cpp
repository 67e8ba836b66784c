// Warm-started Arnoldi along a wavelength sweep (SolveRequest::start_vectors): the modes found from
// the previous wavelength's eigenvectors are the modes of a cold solve (same n_eff to rounding),
// both match the exact step-index fibre (characteristic equation, Snyder & Love ch. 12, through
// solver/step_index), and the warm start needs fewer operator applications. Also: a warm start
// from the wrong modes still returns the modes nearest the target.
#include <gtest/gtest.h>

#include <cmath>

#include "round_core_fibre.hpp"
#include "solver/step_index.hpp"

using namespace cladwise;

namespace {

constexpr double kCore = 1.4504, kClad = 1.4447, kRadius = 4.1;

CrossSection fibre() { return cladwise::testing::round_core_section(8.0 * kRadius, kRadius); }

ModeProblem problem(const Mesh& mesh, double lambda) {
  return cladwise::testing::round_core_problem(mesh, lambda, kClad, kCore);
}

double exact_n_eff(double lambda, ModeFamily family, int nu) {
  const auto m = solve_mode(StepIndexFibre{kCore, kClad, kRadius, lambda}, family, nu, 1);
  EXPECT_TRUE(m.has_value());
  return m ? m->n_eff : 0.0;
}

}  // namespace

TEST(WarmStart, SweepStepGivesTheColdSolveModesWithFewerOperatorApplications) {
  const Mesh mesh = mesh_cross_section(fibre());
  SolveRequest request;
  request.n_modes = 2;  // the HE11 pair
  ModeSolver sweep(problem(mesh, 1.50));
  const SolveResult first = sweep.solve(request);
  ASSERT_EQ(first.status, EigenStatus::converged);
  ASSERT_EQ(first.modes.size(), 2u);

  sweep.set_wavelength(1.5125);  // one step of a 41-point sweep over 1.2–1.7 µm
  SolveRequest warm = request;
  for (const Mode& m : first.modes) warm.start_vectors.push_back(m.eigenvector);
  const SolveResult w = sweep.solve(warm);

  ModeSolver fresh(problem(mesh, 1.5125));
  const SolveResult cold = fresh.solve(request);
  ASSERT_EQ(w.status, EigenStatus::converged);
  ASSERT_EQ(cold.status, EigenStatus::converged);
  ASSERT_EQ(w.modes.size(), cold.modes.size());
  const double exact = exact_n_eff(1.5125, ModeFamily::HE, 1);
  for (std::size_t i = 0; i < w.modes.size(); ++i) {
    EXPECT_NEAR(w.modes[i].n_eff, cold.modes[i].n_eff, 1e-12);
    EXPECT_NEAR(w.modes[i].n_eff, exact, 2e-8);  // mesh error of this mesh, ~1e-9 (verification.md)
    EXPECT_LT(w.modes[i].residual, 1e-8);
  }
  EXPECT_LT(w.n_operator_applications, cold.n_operator_applications);
  RecordProperty("operator_applications_warm", static_cast<int>(w.n_operator_applications));
  RecordProperty("operator_applications_cold", static_cast<int>(cold.n_operator_applications));
}

TEST(WarmStart, StartFromOtherModesStillReturnsTheModesNearestTheTarget) {
  // V = 2.76 at 1.2 µm: HE11, then TE01/HE21/TM01 are guided. Start the search for the HE11 pair
  // from the three LP11-group modes: the HE11 pair (nearest the default target n_core) must win.
  const Mesh mesh = mesh_cross_section(fibre());
  ModeSolver s(problem(mesh, 1.2));
  SolveRequest six;
  six.n_modes = 6;
  const SolveResult all = s.solve(six);
  ASSERT_GE(all.modes.size(), 6u);
  SolveRequest request;
  request.n_modes = 2;
  for (std::size_t i = 2; i < 6; ++i) request.start_vectors.push_back(all.modes[i].eigenvector);
  const SolveResult r = s.solve(request);
  ASSERT_EQ(r.status, EigenStatus::converged);
  ASSERT_EQ(r.modes.size(), 2u);
  const double exact = exact_n_eff(1.2, ModeFamily::HE, 1);
  for (const Mode& m : r.modes) EXPECT_NEAR(m.n_eff, exact, 2e-8);
}

TEST(WarmStart, VectorsOfAnotherSizeAreIgnored) {
  const Mesh mesh = mesh_cross_section(fibre());
  ModeSolver s(problem(mesh, 1.55));
  SolveRequest request;
  request.n_modes = 2;
  request.start_vectors = {Eigen::VectorXd::Ones(7)};
  const SolveResult r = s.solve(request);
  ASSERT_EQ(r.status, EigenStatus::converged);
  ASSERT_EQ(r.modes.size(), 2u);
  EXPECT_NEAR(r.modes[0].n_eff, exact_n_eff(1.55, ModeFamily::HE, 1), 2e-8);
}
