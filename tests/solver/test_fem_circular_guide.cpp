// Hollow circular metallic waveguide of radius R on curved (6-node isoparametric) elements.
// Exact: β² = k0² − (x/R)² with x = x'_11 (first zero of J1', TE11, a degenerate pair) and
// x = x_01 (first zero of J0, TM01) (Pozar, "Microwave Engineering", 4th ed., §3.4). The zeros
// are computed here from the C++17 special functions with a bracketing root finder and checked
// against Abramowitz & Stegun Table 9.5 (x'_11 = 1.84118, x_01 = 2.40483).
#include <gtest/gtest.h>

#include <boost/math/tools/roots.hpp>

#include <cmath>
#include <cstdint>
#include <numbers>

#include "solver/mode_solver.hpp"
#include "fem_test_meshes.hpp"

namespace cladwise {
namespace {

constexpr double kR = 1.0, kK0 = 3.0;  // TE11 and TM01 propagate; TE21 (x' = 3.054) does not

double root(const std::function<double(double)>& f, double lo, double hi) {
  std::uintmax_t it = 200;
  const auto r = boost::math::tools::toms748_solve(f, lo, hi, boost::math::tools::eps_tolerance<double>(50), it);
  return 0.5 * (r.first + r.second);
}

TEST(FemCircularGuide, Te11AndTm01OnCurvedElementsWithRates) {
  const double x11p = root([](double x) { return std::cyl_bessel_j(0.0, x) - std::cyl_bessel_j(2.0, x); }, 1.5, 2.2);
  const double x01 = root([](double x) { return std::cyl_bessel_j(0.0, x); }, 2.0, 3.0);
  ASSERT_NEAR(x11p, 1.84118, 1e-5);  // A&S Table 9.5
  ASSERT_NEAR(x01, 2.40483, 1e-5);   // A&S Table 9.5
  const double exact[3] = {kK0 * kK0 - std::pow(x11p / kR, 2), kK0 * kK0 - std::pow(x11p / kR, 2),
                           kK0 * kK0 - std::pow(x01 / kR, 2)};
  for (bool curved : {true, false}) {
    std::vector<double> err;
    for (int rings : {4, 8, 16}) {
      Mesh mesh = testing::disk_mesh(kR, rings, 2);
      if (!curved) {  // same mesh with mid-edge nodes moved back to the chords
        for (const auto& tri : mesh.triangles) {
          for (int k = 0; k < 3; ++k) {
            const auto& a = mesh.nodes[tri[k]];
            const auto& b = mesh.nodes[tri[(k + 1) % 3]];
            mesh.nodes[tri[3 + k]] = {0.5 * (a[0] + b[0]), 0.5 * (a[1] + b[1])};
          }
        }
      }
      ModeProblem p{&mesh, {isotropic_material(1.0)}, 2 * std::numbers::pi / kK0, 2, {WallType::electric}};
      ModeSolver solver(p);
      SolveRequest req;
      req.all_guided = true;
      const SolveResult r = solver.solve(req);
      ASSERT_EQ(r.status, EigenStatus::converged);
      ASSERT_EQ(r.modes.size(), 3u) << "rings " << rings << (curved ? " curved" : " straight");
      double e = 0.0;
      for (int i = 0; i < 3; ++i) {
        e = std::max(e, std::abs(r.modes[i].beta * r.modes[i].beta - exact[i]));
        EXPECT_LT(r.modes[i].residual, 1e-8);
      }
      err.push_back(e);
      std::printf("%s order 2, %d rings, %6d dofs: n_eff TE11 %.8f %.8f TM01 %.8f  max |Δβ²| %.2e\n",
                  curved ? "curved  " : "straight", rings, r.n_dofs, r.modes[0].n_eff, r.modes[1].n_eff,
                  r.modes[2].n_eff, e);
    }
    const double rate = std::log(err[1] / err[2]) / std::log(2.0);
    std::printf("%s observed rate %.2f\n", curved ? "curved  " : "straight", rate);
    if (curved) {
      EXPECT_GE(rate, 3.5);
      EXPECT_LT(err.back(), 1e-4 * exact[0]);
    } else {
      // chords: the O(h²) geometry error dominates (checks.md §8, common practice)
      EXPECT_LT(rate, 2.6);
      EXPECT_GT(rate, 1.5);
    }
  }
}

// Asking for one mode returns both polarisations of the degenerate TE11 pair.
TEST(FemCircularGuide, DegeneratePartnerIsReturnedWithTheRequestedMode) {
  const Mesh mesh = testing::disk_mesh(kR, 6, 2);
  ModeProblem p{&mesh, {isotropic_material(1.0)}, 2 * std::numbers::pi / kK0, 2, {WallType::electric}};
  ModeSolver solver(p);
  SolveRequest req;
  req.n_modes = 1;
  const SolveResult r = solver.solve(req);
  ASSERT_EQ(r.status, EigenStatus::converged);
  ASSERT_EQ(r.modes.size(), 2u);
  EXPECT_NEAR(r.modes[0].n_eff, r.modes[1].n_eff, 1e-9);
  // the two polarisations are independent (B-orthogonality is not required, independence is)
  const double c = std::abs(r.modes[0].eigenvector.normalized().dot(r.modes[1].eigenvector.normalized()));
  EXPECT_LT(c, 0.99);
}

}  // namespace
}  // namespace cladwise
