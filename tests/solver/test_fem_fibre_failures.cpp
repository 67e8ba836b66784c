// Bad input and failure paths of the mode solver, on a small weakly guiding fibre (n1 = 1.4504,
// n2 = 1.4447, a = 4.1 µm, λ = 1.55 µm; its only guided mode is HE11 at n_eff = 1.44730804 from
// the exact vector equation, Snyder & Love ch. 12, solver/step_index): each is an exception with
// a message naming the key, or an EigenStatus value (docs/conventions.md, errors).
#include <gtest/gtest.h>

#include <string>

#include "../benchmark/fibre_meshes.hpp"
#include "mesh/error.hpp"
#include "solver/mode_solver.hpp"

namespace cladwise {
namespace {

const StepIndexFibre kWeak{1.4504, 1.4447, 4.1, 1.55};

class FemFibreFailures : public ::testing::Test {
protected:
  static void SetUpTestSuite() {
    spec_ = new bench::FibreMeshSpec{kWeak, 8 * 4.1, 2, 1.0, 1.0, 1.3, 8.0, true};
    mesh_ = new Mesh(bench::fibre_mesh(*spec_));
  }
  static void TearDownTestSuite() {
    delete mesh_;
    delete spec_;
  }
  static ModeProblem problem() { return bench::fibre_problem(*mesh_, *spec_); }
  static bench::FibreMeshSpec* spec_;
  static Mesh* mesh_;
};
bench::FibreMeshSpec* FemFibreFailures::spec_ = nullptr;
Mesh* FemFibreFailures::mesh_ = nullptr;

std::string message_of(const std::function<void()>& f) {
  try {
    f();
  } catch (const InputError& e) {
    return e.what();
  }
  return "no InputError";
}

TEST_F(FemFibreFailures, TargetIndexAboveEveryMaterialIsAnInputError) {
  ModeSolver solver(problem());
  SolveRequest req;
  req.n_target = 1.46;  // above the core index 1.4504
  const std::string msg = message_of([&] { solver.solve(req); });
  EXPECT_NE(msg.find("n_target"), std::string::npos) << msg;
  EXPECT_NE(msg.find("above every material index"), std::string::npos) << msg;
  req.n_target = -1.0;
  EXPECT_NE(message_of([&] { solver.solve(req); }).find("n_target"), std::string::npos);
  req.n_target.reset();
  req.n_modes = 0;
  EXPECT_NE(message_of([&] { solver.solve(req); }).find("n_modes"), std::string::npos);
}

TEST_F(FemFibreFailures, BadProblemIsAnInputError) {
  ModeProblem p = problem();
  p.wavelength_um = -1.0;
  EXPECT_NE(message_of([&] { ModeSolver s(p); }).find("wavelength_um"), std::string::npos);
  p = problem();
  p.region_materials.pop_back();
  EXPECT_NE(message_of([&] { ModeSolver s(p); }).find("materials"), std::string::npos);
  p.mesh = nullptr;
  EXPECT_NE(message_of([&] { ModeSolver s(p); }).find("mesh"), std::string::npos);
}

TEST_F(FemFibreFailures, NoGuidedModeInTheRangeIsNoModesFound) {
  ModeSolver solver(problem());
  SolveRequest req;
  req.all_guided = true;
  req.n_lower_bound = 1.4500;  // above HE11 (1.44730804), below the core index
  const SolveResult r = solver.solve(req);
  EXPECT_EQ(r.status, EigenStatus::no_modes_found);
  EXPECT_TRUE(r.modes.empty());
  EXPECT_EQ(to_string(r.status), "no modes found");
}

TEST_F(FemFibreFailures, SingularShiftedMatrixIsFactorizationFailed) {
  // n_target so small that σ = −(k0 n_target)² underflows to 0: A − σB = A, whose nodal block
  // is identically zero (docs/formulation.md eq. 13), so the LU meets exact zero pivots.
  ModeSolver solver(problem());
  SolveRequest req;
  req.n_target = 1e-170;
  const SolveResult r = solver.solve(req);
  EXPECT_EQ(r.status, EigenStatus::factorization_failed);
  EXPECT_TRUE(r.modes.empty());
  // the same solver recovers at a regular shift (refactorised, pattern kept)
  req.n_target.reset();
  const SolveResult ok = solver.solve(req);
  EXPECT_EQ(ok.status, EigenStatus::converged);
  ASSERT_EQ(ok.modes.size(), 2u);
  EXPECT_NEAR(ok.modes[0].n_eff, 1.44730804, 1e-6);
}

TEST_F(FemFibreFailures, NoConvergenceIsNotConverged) {
  ModeSolver solver(problem());
  SolveRequest req;
  req.n_modes = 6;
  req.max_restarts = 0;  // only the first Krylov space: the cladding modes cannot converge
  req.krylov_dimension = 14;
  const SolveResult r = solver.solve(req);
  EXPECT_EQ(r.status, EigenStatus::not_converged);
}

TEST_F(FemFibreFailures, ResidualAboveToleranceIsReportedAndTheModeLeftOut) {
  ModeSolver solver(problem());
  SolveRequest req;
  req.residual_tolerance = 1e-300;
  const SolveResult r = solver.solve(req);
  EXPECT_EQ(r.status, EigenStatus::residual_too_large);
  EXPECT_TRUE(r.modes.empty());
}

}  // namespace
}  // namespace cladwise
