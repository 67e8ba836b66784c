// Group index and chromatic dispersion of the exact step-index modes with dispersive glasses
// (solver/step_index.hpp, docs/step-index.md "Dispersion"), and the finite-element group index and
// D of HE11 against them.
//
// References: the exact vector eigenvalue equation (A. W. Snyder & J. D. Love, "Optical Waveguide
// Theory", 1983, ch. 12); fused silica by the Malitson 1965 Sellmeier fit and GeO2-SiO2 by linear
// mixing of the Malitson and Fleming 1984 coefficients (../shared/docs/checks.md §1, common
// practice for the mixing rule). Two independent routes to n_g (Richardson differences of the
// exact roots; implicit differentiation of the characteristic equation) must agree.
#include <gtest/gtest.h>

#include <chrono>
#include <cmath>
#include <numbers>

#include "round_core_fibre.hpp"
#include "solver/group_index.hpp"
#include "solver/material.hpp"
#include "solver/material_catalogue.hpp"
#include "solver/mode_solver.hpp"
#include "solver/step_index.hpp"

using namespace cladwise;

namespace {

constexpr double kPi = std::numbers::pi;

// A standard-like single-mode fibre of our own: 3.5 mol% GeO2 core of radius 4.1 µm in silica.
DispersiveStepIndexFibre germania_fibre() {
  return {index_model(germania_silica(0.035)), index_model(silica_malitson1965()), 4.1};
}

// A silica rod of radius 1 µm in air (n = 1): strong guidance, several vector modes.
DispersiveStepIndexFibre silica_rod() {
  return {index_model(silica_malitson1965()), index_model(1.0), 1.0};
}

struct Which {
  ModeFamily family;
  int nu, m;
};

}  // namespace

TEST(StepIndexDispersion, RichardsonAndImplicitGroupIndexAgreeForEveryMode) {
  // Weak guidance (V ≈ 3.0 at 1.10 µm: HE11 and the LP11 group) and the strongly guiding rod.
  struct Case {
    DispersiveStepIndexFibre fibre;
    double lambda;
    std::vector<Which> modes;
  };
  const std::vector<Case> cases{
      {germania_fibre(), 1.10,
       {{ModeFamily::HE, 1, 1}, {ModeFamily::TE, 0, 1}, {ModeFamily::TM, 0, 1}, {ModeFamily::HE, 2, 1},
        {ModeFamily::LP, 0, 1}, {ModeFamily::LP, 1, 1}}},
      {silica_rod(), 1.55,
       {{ModeFamily::HE, 1, 1}, {ModeFamily::TE, 0, 1}, {ModeFamily::TM, 0, 1}, {ModeFamily::HE, 2, 1},
        {ModeFamily::EH, 1, 1}, {ModeFamily::HE, 1, 2}}},
  };
  for (const auto& c : cases) {
    for (const auto& w : c.modes) {
      const auto d = step_index_dispersion(c.fibre, c.lambda, w.family, w.nu, w.m);
      const auto ng = step_index_group_index_implicit(c.fibre, c.lambda, w.family, w.nu, w.m);
      ASSERT_TRUE(d && ng) << mode_label(w.family, w.nu, w.m);
      EXPECT_NEAR(d->n_group, *ng, 1e-9) << d->mode.label;
      // The plain central difference is already close; the Richardson step removes its h² term.
      EXPECT_LT(d->n_group_error, 1e-5) << d->mode.label;
      // A guided mode travels slower than a plane wave in the cladding glass (n_g > n_eff here).
      EXPECT_GT(d->n_group, d->mode.n_eff) << d->mode.label;
    }
  }
}

TEST(StepIndexDispersion, DispersionAgreesWithDifferencesOfTheImplicitGroupIndex) {
  // D = (1/c) dn_g/dλ: the Richardson second difference of β against a Richardson first
  // difference in λ of the implicit n_g (an independent route).
  const auto fibre = germania_fibre();
  for (double lambda : {1.31, 1.55}) {
    const auto d = step_index_dispersion(fibre, lambda, ModeFamily::HE, 1, 1);
    ASSERT_TRUE(d);
    auto ng = [&](double lam) { return *step_index_group_index_implicit(fibre, lam, ModeFamily::HE, 1, 1); };
    const double h = 2e-3;
    const double d1h = (ng(lambda + h) - ng(lambda - h)) / (2 * h);
    const double d12h = (ng(lambda + 2 * h) - ng(lambda - 2 * h)) / (4 * h);
    const double d_fd = dispersion_from_group_index_slope((4 * d1h - d12h) / 3);
    EXPECT_NEAR(d->dispersion_ps_per_nm_km, d_fd, 1e-3) << lambda;
    EXPECT_LT(d->dispersion_error_ps_per_nm_km, 1e-2);
  }
}

TEST(StepIndexDispersion, LargeCoreTendsToTheCoreGlass) {
  // As V → ∞ the waveguide contribution vanishes (∝ 1/V²): HE11's n_g and D approach the core
  // glass's own n − λ dn/dλ and −(λ/c) d²n/dλ² (Agrawal, "Nonlinear Fiber Optics", §1.2.3).
  const DispersionModel core = germania_silica(0.035);
  const DispersiveStepIndexFibre big{index_model(core), index_model(silica_malitson1965()), 100.0};
  const auto d = step_index_dispersion(big, 1.55, ModeFamily::HE, 1, 1);
  ASSERT_TRUE(d);
  EXPECT_NEAR(d->n_group, core.group_index(1.55), 2e-5);
  EXPECT_NEAR(d->dispersion_ps_per_nm_km, core.dispersion_ps_per_nm_km(1.55), 0.1);
  // ... and a 4.1 µm core shows a clear waveguide dispersion below the glass's (negative term).
  const auto small = step_index_dispersion(germania_fibre(), 1.55, ModeFamily::HE, 1, 1);
  EXPECT_LT(small->dispersion_ps_per_nm_km, core.dispersion_ps_per_nm_km(1.55) - 2.0);
}

TEST(StepIndexDispersion, LocalTaylorIndexModelGivesTheSameDerivatives) {
  // n, dn/dλ, d²n/dλ² at λ0 fix n_g and D at λ0: the quadratic model must reproduce the full
  // Sellmeier result up to the O(h⁴) stencil terms that see n'''.
  const auto full = germania_fibre();
  const double lambda = 1.55;
  const DispersiveStepIndexFibre local{index_model(lambda, germania_silica(0.035).derivatives(lambda)),
                                       index_model(lambda, silica_malitson1965().derivatives(lambda)), 4.1};
  const auto a = step_index_dispersion(full, lambda, ModeFamily::HE, 1, 1);
  const auto b = step_index_dispersion(local, lambda, ModeFamily::HE, 1, 1);
  EXPECT_NEAR(a->n_group, b->n_group, 1e-10);
  EXPECT_NEAR(a->dispersion_ps_per_nm_km, b->dispersion_ps_per_nm_km, 1e-3);
  EXPECT_DOUBLE_EQ(a->mode.n_eff, b->mode.n_eff);
}

TEST(StepIndexDispersion, WalledTeCutoffTendsToTheBesselZero) {
  // Open cladding: TE01 cuts off at V = j_{0,1} = 2.404826 (Abramowitz & Stegun Table 9.5); a wall
  // at R raises it by about 2 (a/R)² / j_{0,1} (docs/step-index.md).
  EXPECT_NEAR(te_cutoff_v_with_electric_wall(1, 0.0), 2.404825557695773, 1e-12);
  EXPECT_NEAR(te_cutoff_v_with_electric_wall(2, 0.0), 5.520078110286311, 1e-12);
  for (double r : {0.05, 0.1, 0.2}) {
    const double v = te_cutoff_v_with_electric_wall(1, r);
    EXPECT_NEAR(v - 2.404825557695773, 2 * r * r / 2.404825557695773, 3 * std::pow(r, 4)) << r;
  }
  EXPECT_FALSE(step_index_dispersion(germania_fibre(), 1.40, ModeFamily::TE, 0, 1));  // beyond cutoff
}

// ---- FEM against the analytic module ----------------------------------------------------------

namespace {

CrossSection fibre_section(double wall) { return cladwise::testing::round_core_section(wall); }

}  // namespace

TEST(StepIndexDispersion, FemGroupIndexAndDispersionOfHe11MatchTheExactFibre) {
  const auto start = std::chrono::steady_clock::now();
  const Mesh mesh = mesh_cross_section(fibre_section(32.8));
  const DispersionModel clad = silica_malitson1965(), core = germania_silica(0.035);
  const auto exact = germania_fibre();
  auto materials = [&](double lam) {
    return std::vector<Material>{isotropic_material(clad.index(lam), "cladding"),
                                 isotropic_material(core.index(lam), "core")};
  };
  auto deps = [&](double lam) {
    std::vector<std::array<double, 3>> out;
    for (const DispersionModel* m : {&clad, &core}) {
      const IndexDerivatives nd = m->derivatives(lam);
      const double e = permittivity_derivative_dk0(nd.n, nd.dn_dlambda, lam);
      out.push_back({e, e, e});
    }
    return out;
  };
  ModeProblem p;
  p.mesh = &mesh;
  p.order = 2;
  p.wavelength_um = 1.55;
  p.region_materials = materials(1.55);
  p.boundary_walls.assign(mesh.boundaries.size(), WallType::electric);
  ModeSolver solver(p);
  SolveRequest q;
  q.n_modes = 1;
  auto fem_ng = [&](double lam) {
    solver.set_wavelength(lam, materials(lam));
    const Mode m = solver.solve(q).modes.at(0);
    return group_index(solver, m, deps(lam));
  };
  for (double lambda : {1.31, 1.55}) {
    // 3-point D as in io/sweep.cpp (even grid), with a step whose stencil error (h²/6 c⁻¹ n_g''')
    // is ~1e-4 ps/(nm·km).
    const double h = 0.02;
    const double ng_m = fem_ng(lambda - h), ng_0 = fem_ng(lambda), ng_p = fem_ng(lambda + h);
    const double d_fem = dispersion_from_group_index_slope((ng_p - ng_m) / (2 * h));
    const auto ref = step_index_dispersion(exact, lambda, ModeFamily::HE, 1, 1);
    ASSERT_TRUE(ref);
    EXPECT_NEAR(ng_0, ref->n_group, 1e-6) << lambda;
    EXPECT_NEAR(d_fem, ref->dispersion_ps_per_nm_km, 0.05) << lambda;
    std::printf("lambda %.2f: n_g FEM %.9f exact %.9f (diff %.2e); D FEM %.4f exact %.4f ps/(nm km)\n", lambda,
                ng_0, ref->n_group, ng_0 - ref->n_group, d_fem, ref->dispersion_ps_per_nm_km);
  }
  std::printf("6 FEM solves: %.1f s\n", std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count());
}
