// Hollow rectangular metallic waveguide a × b = 2 × 1 µm, ε = 1, electric walls.
// Exact: β² = k0² − (mπ/a)² − (nπ/b)² for TE_mn (m + n ≥ 1) and TM_mn (m, n ≥ 1)
// (D. M. Pozar, "Microwave Engineering", 4th ed., Wiley 2012, §3.3, eqs. 3.84 and 3.103).
// With k0 = 4 µm⁻¹ exactly five modes propagate: TE10; TE20 and TE01 (degenerate, kc = π);
// TE11 and TM11 (degenerate, kc = π√1.25). Next: TE21/TM21 at kc = π√2 = 4.44 > k0.
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <numbers>
#include <vector>

#include "solver/mode_fields.hpp"
#include "solver/mode_solver.hpp"
#include "fem_test_meshes.hpp"

namespace cladwise {
namespace {

constexpr double kA = 2.0, kB = 1.0, kK0 = 4.0;
const double kPi = std::numbers::pi;

std::vector<double> exact_beta_sq(double k0, bool propagating_only) {
  std::vector<double> out;
  for (int m = 0; m <= 6; ++m) {
    for (int n = 0; n <= 6; ++n) {
      if (m + n == 0) continue;
      const double b2 = k0 * k0 - std::pow(m * kPi / kA, 2) - std::pow(n * kPi / kB, 2);
      if (propagating_only && b2 <= 0) continue;
      out.push_back(b2);                      // TE_mn
      if (m > 0 && n > 0) out.push_back(b2);  // TM_mn
    }
  }
  std::sort(out.rbegin(), out.rend());
  return out;
}

struct BoxRun {
  SolveResult result;
  int n_dofs;
};

BoxRun solve_box(int ny, int order, const SolveRequest& req) {
  const Mesh mesh = testing::rectangle_mesh(0.0, kA, 0.0, kB, 2 * ny, ny, order);
  ModeProblem p{&mesh, {isotropic_material(1.0)}, 2 * kPi / kK0, order,
                std::vector<WallType>(4, WallType::electric)};
  ModeSolver solver(p);
  BoxRun r{solver.solve(req), solver.n_dofs()};
  return r;
}

TEST(FemHollowGuide, AllPropagatingModesWithMultiplicityAndNoSpurious) {
  const std::vector<double> exact = exact_beta_sq(kK0, true);
  ASSERT_EQ(exact.size(), 5u);
  for (int order : {1, 2}) {
    SolveRequest req;
    req.all_guided = true;  // β² > 0 (uniform filling: lower bound 0)
    const BoxRun run = solve_box(order == 1 ? 16 : 6, order, req);
    ASSERT_EQ(run.result.status, EigenStatus::converged) << to_string(run.result.status);
    ASSERT_EQ(run.result.modes.size(), exact.size()) << "order " << order;
    for (std::size_t i = 0; i < exact.size(); ++i) {
      const double b2 = run.result.modes[i].beta * run.result.modes[i].beta;
      EXPECT_NEAR(b2, exact[i], (order == 1 ? 2e-2 : 2e-4) * kK0 * kK0) << "mode " << i;
      EXPECT_LT(run.result.modes[i].residual, 1e-8);
    }
    // No spurious modes: every converged eigenvalue near the target is a waveguide mode, the
    // β² = 0 null space of the formulation, or an evanescent mode of the exact list.
    const std::vector<double> all = exact_beta_sq(kK0, false);
    for (double b2 : run.result.beta_sq_found) {
      if (std::abs(b2) < 1e-8 * kK0 * kK0) continue;  // null space e_t = 0 (λ = 0)
      double nearest = 1e300;
      for (double e : all) nearest = std::min(nearest, std::abs(e - b2));
      EXPECT_LT(nearest, (order == 1 ? 0.05 : 2e-3) * std::max(1.0, std::abs(b2)))
          << "spurious eigenvalue β² = " << b2 << " (order " << order << ")";
    }
  }
}

// Observed h-convergence of β² (Vardapetyan & Demkowicz, Math. Comp. 72, 105 (2003): O(h^{2p});
// checks.md §8 marks the rates "from memory / common practice").
TEST(FemHollowGuide, ConvergenceRatesOfBetaSquared) {
  const std::vector<double> exact = exact_beta_sq(kK0, true);
  for (int order : {1, 2}) {
    const std::vector<int> levels = order == 1 ? std::vector<int>{4, 8, 16} : std::vector<int>{2, 4, 8};
    std::vector<double> err;
    SolveRequest req;
    req.n_modes = 5;
    for (int ny : levels) {
      const BoxRun run = solve_box(ny, order, req);
      ASSERT_EQ(run.result.status, EigenStatus::converged);
      ASSERT_GE(run.result.modes.size(), 5u);
      double e = 0.0;
      for (std::size_t i = 0; i < 5; ++i) {
        e = std::max(e, std::abs(run.result.modes[i].beta * run.result.modes[i].beta - exact[i]));
        EXPECT_LT(run.result.modes[i].residual, 1e-8);
      }
      err.push_back(e);
      std::printf("order %d  h = %.4f µm  dofs %6d  max |Δβ²| = %.3e µm⁻²  (solve %.3f s)\n", order,
                  kB / ny, run.n_dofs, e, run.result.timing.eigensolve_s + run.result.timing.factorization_s);
    }
    for (std::size_t i = 1; i < err.size(); ++i) {
      const double rate = std::log(err[i - 1] / err[i]) / std::log(2.0);
      std::printf("order %d  observed rate %.2f\n", order, rate);
      EXPECT_GE(rate, order == 1 ? 1.8 : 3.5) << "order " << order << " level " << i;
    }
  }
}

// 1 W normalisation of TE10 against the exact field: E_y = E0 sin(πx/a), with
// P = a b |E0|² β / (4 ω μ0) = a b |E0|² β / (4 k0 Z0)  (Pozar §3.3, eq. 3.90).
TEST(FemHollowGuide, Te10FieldsNormalisedToOneWatt) {
  const Mesh mesh = testing::rectangle_mesh(0.0, kA, 0.0, kB, 16, 8, 2);
  ModeProblem p{&mesh, {isotropic_material(1.0)}, 2 * kPi / kK0, 2,
                std::vector<WallType>(4, WallType::electric)};
  ModeSolver solver(p);
  SolveRequest req;
  req.n_modes = 1;
  const SolveResult r = solver.solve(req);
  ASSERT_EQ(r.modes.size(), 1u);
  const Mode& m = r.modes[0];
  const ModeFieldEvaluator f(p, solver.dof_map(), m);
  const double beta_exact = std::sqrt(kK0 * kK0 - std::pow(kPi / kA, 2));
  // β and k0 in 1/m; area in m²
  const double e0 = std::sqrt(4.0 * (kK0 * 1e6) * vacuum_impedance_ohm / (kA * kB * 1e-12 * beta_exact * 1e6));
  double worst = 0.0;
  for (int t = 0; t < mesh.n_triangles(); t += 7) {
    const auto s = f.at_reference(t, Eigen::Vector2d(0.3, 0.2));
    const double x = map_point(element_geometry(mesh, t), Eigen::Vector2d(0.3, 0.2)).x.x();
    const double ey = e0 * std::sin(kPi * x / kA);
    worst = std::max(worst, std::abs(std::abs(s.e.y()) - ey) / e0);
    EXPECT_LT(std::abs(s.e.x()), 5e-3 * e0);  // discretisation error only
    EXPECT_LT(std::abs(s.e.z()), 1e-9 * e0);  // TE: exactly zero
    // H_x = −(β/ωμ0) E_y,  H_z = (jπ/(a ωμ0)) E0 cos(πx/a)  (Pozar eq. 3.89a,c with our sign)
    EXPECT_NEAR(std::abs(s.h.x()), beta_exact / (kK0 * vacuum_impedance_ohm) * ey, 2e-3 * e0 / vacuum_impedance_ohm);
  }
  EXPECT_LT(worst, 2e-3);
  const NodalFields nf = f.at_nodes();
  double total = 0.0;  // nodal S_z on the structured mesh: max at the centre line x = a/2
  for (double s : nf.s_z) total = std::max(total, s);
  const double sz_exact = 0.5 * e0 * e0 * beta_exact / (kK0 * vacuum_impedance_ohm);
  EXPECT_NEAR(total / sz_exact, 1.0, 5e-3);  // nodal averaging of an O(h²) field error
}

}  // namespace
}  // namespace cladwise
