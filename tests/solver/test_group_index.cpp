// Group index from one solve (first-order perturbation of the discrete eigenvalue in k0) against
// finite differences of the FEM β(k0) and of the exact step-index β(k0) (Snyder & Love ch. 12
// eigenvalue equation, solver/step_index), with and without material dispersion.
#include <gtest/gtest.h>

#include <cmath>
#include <numbers>

#include "round_core_fibre.hpp"
#include "solver/group_index.hpp"
#include "solver/material.hpp"
#include "solver/material_catalogue.hpp"
#include "solver/step_index.hpp"

using namespace cladwise;

namespace {

CrossSection fibre(double wall) { return cladwise::testing::round_core_section(wall); }

ModeProblem problem(const Mesh& mesh, double lambda, double n_clad, double n_core) {
  return cladwise::testing::round_core_problem(mesh, lambda, n_clad, n_core);
}

double fem_beta(const Mesh& mesh, double lambda, double n_clad, double n_core) {
  ModeSolver s(problem(mesh, lambda, n_clad, n_core));
  SolveRequest q;
  q.n_modes = 1;
  return s.solve(q).modes.at(0).beta;
}

}  // namespace

TEST(GroupIndex, NonDispersiveFibreMatchesFiniteDifferencesAndExactFibre) {
  const Mesh mesh = mesh_cross_section(fibre(32.8));
  const double lambda = 1.55, n1 = 1.4504, n2 = 1.4447;
  ModeSolver s(problem(mesh, lambda, n2, n1));
  SolveRequest q;
  q.n_modes = 1;
  const Mode m = s.solve(q).modes.at(0);
  const double ng = group_index(s, m);

  // Centred differences of the FEM β in k0 on the same mesh (O(h_k²) ~ 1e-9 with δk0 = 1e-4 k0).
  const double k0 = 2 * std::numbers::pi / lambda, dk = 1e-4 * k0;
  const double bp = fem_beta(mesh, 2 * std::numbers::pi / (k0 + dk), n2, n1);
  const double bm = fem_beta(mesh, 2 * std::numbers::pi / (k0 - dk), n2, n1);
  EXPECT_NEAR(ng, (bp - bm) / (2 * dk), 2e-7);

  // The exact fibre's group index by centred differences of its exact β.
  auto exact_beta = [&](double kk) {
    return solve_vector_modes(StepIndexFibre{n1, n2, 4.1, 2 * std::numbers::pi / kk}).at(0).beta;
  };
  const double ng_exact = (exact_beta(k0 + dk) - exact_beta(k0 - dk)) / (2 * dk);
  EXPECT_NEAR(ng, ng_exact, 1e-6);
  // Waveguide dispersion only: n_g lies between the two indices... and above n_eff (common practice).
  EXPECT_GT(ng, m.n_eff);
}

TEST(GroupIndex, MaterialDispersionEntersThroughDepsDk0) {
  // A fibre of fused silica (Malitson 1965) with a core raised by a constant 0.0057: the group
  // index includes the glass's dn/dλ. Checked against finite differences of FEM solves that
  // re-evaluate the Sellmeier index at each wavelength.
  const Mesh mesh = mesh_cross_section(fibre(32.8));
  const DispersionModel silica = silica_malitson1965();
  const double lambda = 1.55, dn = 0.0057;
  auto indices = [&](double lam) { return std::pair{silica.index(lam), silica.index(lam) + dn}; };
  const auto [n2, n1] = indices(lambda);
  ModeSolver s(problem(mesh, lambda, n2, n1));
  SolveRequest q;
  q.n_modes = 1;
  const Mode m = s.solve(q).modes.at(0);
  const double dndl = silica.derivatives(lambda).dn_dlambda;
  const double de2 = permittivity_derivative_dk0(n2, dndl, lambda);
  const double de1 = permittivity_derivative_dk0(n1, dndl, lambda);
  const double ng = group_index(s, m, {{de2, de2, de2}, {de1, de1, de1}});

  const double k0 = 2 * std::numbers::pi / lambda, dk = 1e-4 * k0;
  auto beta_at = [&](double kk) {
    const double lam = 2 * std::numbers::pi / kk;
    const auto [c2, c1] = indices(lam);
    return fem_beta(mesh, lam, c2, c1);
  };
  const double ng_fd = (beta_at(k0 + dk) - beta_at(k0 - dk)) / (2 * dk);
  EXPECT_NEAR(ng, ng_fd, 2e-7);
  // Dominated by the glass: close to silica's own group index 1.462596 (checks.md §1, computed
  // from the formula), raised slightly by the core and waveguide terms.
  EXPECT_NEAR(ng, 1.4626, 0.01);
}
