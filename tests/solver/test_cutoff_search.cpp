// Cutoff wavelength by a bracketing search on the tracked mode's n_eff − n_clad
// (solver/cutoff_search.hpp), for TE01 of a step-index fibre of dispersive glasses against the
// exact cutoffs: the walled structure's (TE0m with an electric wall at R, solver/step_index.hpp,
// derived in docs/step-index.md) and the open cladding's V = j_{0,1} = 2.404826 (Abramowitz &
// Stegun Table 9.5; Snyder & Love Table 12-4), with the number of solves it takes.
#include <gtest/gtest.h>

#include <chrono>
#include <cmath>
#include <numbers>

#include "mesh/error.hpp"
#include "mesh/gmsh_mesher.hpp"
#include "solver/cutoff_search.hpp"
#include "solver/material.hpp"
#include "solver/material_catalogue.hpp"
#include "solver/scalar_root.hpp"
#include "solver/step_index.hpp"

using namespace cladwise;

namespace {

constexpr double kCoreRadius = 4.1;
constexpr double kWallRadius = 41.0;  // R = 10 a

// A standard-like fibre of our own (3.5 mol% GeO2 core, Malitson silica cladding): open-cladding
// TE01/LP11 cutoff near 1.31 µm. Quarter of the cross-section with electric walls on both cuts:
// the symmetry class of TE01 (E azimuthal: normal to both axes) and of one HE21 orientation; HE11
// and TM01 are excluded.
struct Fixture {
  DispersionModel clad = silica_malitson1965();
  DispersionModel core = germania_silica(0.035);
  Mesh mesh;
  Fixture() {
    CrossSection s;
    s.background_material = "cladding";
    s.outer.radius = kWallRadius;
    s.symmetry = SymmetryCut::quarter;
    RegionSpec c;
    c.name = "core";
    c.material = "core";
    c.shapes = {Shape{Disk{kCoreRadius}, {}}};
    c.mesh_size = 0.5;
    c.guiding = true;
    s.regions = {c};
    s.controls.order = 2;
    s.controls.default_size = 3.0;
    mesh = mesh_cross_section(s);
  }
  ModeProblem problem(double lambda) const {
    ModeProblem p;
    p.mesh = &mesh;
    p.order = 2;
    p.wavelength_um = lambda;
    p.region_materials = {isotropic_material(clad.index(lambda), "cladding"),
                          isotropic_material(core.index(lambda), "core")};
    p.boundary_walls.assign(mesh.boundaries.size(), WallType::electric);
    return p;
  }
  // The wavelength at which this fibre's V equals v (V falls monotonically with λ).
  double wavelength_at_v(double v) const {
    auto g = [&](double lam) {
      return StepIndexFibre{core.index(lam), clad.index(lam), kCoreRadius, lam}.v_number() - v;
    };
    return brent_root(g, 0.9, 1.8, g(0.9), g(1.8), 1e-13);
  }
  CutoffSearchRequest request() const {
    CutoffSearchRequest r;
    r.start_wavelength_um = 1.0;
    r.max_wavelength_um = 1.7;
    r.mode_index = 0;  // TE01 is the highest mode of this class (checked below)
    r.background_index = [this](double lam) { return clad.index(lam); };
    return r;
  }
};

const Fixture& fixture() {
  static const Fixture f;
  return f;
}

}  // namespace

TEST(CutoffSearch, Te01OfAStepIndexFibreMatchesTheExactWalledAndOpenCutoffs) {
  const Fixture& f = fixture();
  const auto start = std::chrono::steady_clock::now();
  const CutoffSearchResult r =
      find_cutoff_wavelength([&](double lam) { return f.problem(lam); }, f.request());
  const double seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
  ASSERT_EQ(r.status, CutoffStatus::found) << to_string(r.status);

  // The followed mode at the start is TE01 (exact n_eff within the FEM error; HE21 lies 2e-6 below).
  const StepIndexFibre at_start{f.core.index(1.0), f.clad.index(1.0), kCoreRadius, 1.0};
  const auto te01 = solve_mode(at_start, ModeFamily::TE, 0, 1);
  const auto he21 = solve_mode(at_start, ModeFamily::HE, 2, 1);
  ASSERT_TRUE(te01 && he21);
  EXPECT_LT(std::fabs(r.samples.front().n_eff - te01->n_eff), 0.25 * (te01->n_eff - he21->n_eff));

  // Exact cutoff of the walled structure: the FEM's own target, to the discretisation error.
  const double lc_walled = f.wavelength_at_v(te_cutoff_v_with_electric_wall(1, kCoreRadius / kWallRadius));
  EXPECT_NEAR(r.cutoff_wavelength_um, lc_walled, 2e-4 * lc_walled);
  // Open cladding: λ_c = 2π a NA / 2.404826. The wall at R = 10 a raises V_c by 2(a/R)²/j01
  // = 0.35 %, so λ_c lies 0.35 % short of the open value; 0.5 % bounds that.
  const double lc_open = f.wavelength_at_v(2.404825557695773);
  EXPECT_LT(r.cutoff_wavelength_um, lc_open);
  EXPECT_NEAR(r.cutoff_wavelength_um, lc_open, 5e-3 * lc_open);
  // A bracketing search, not a sweep.
  EXPECT_LE(r.n_solves, 15);
  // Every step kept the same mode: a clear overlap with the nearest earlier solve (the field
  // spreads into the cladding past cutoff, so the overshooting bracket end overlaps least), and
  // while guided the top mode of its class (past cutoff the walled HE21, whose open-cladding
  // cutoff V = 2.408 lies just above TE01's, can pass above it).
  for (const auto& s : r.samples) {
    EXPECT_GT(s.overlap, 0.7) << s.wavelength_um;
    if (s.n_eff > s.background_index) {
      EXPECT_EQ(s.mode_position, 0) << s.wavelength_um;
    }
    std::printf("  lambda %.6f  n_eff - n_clad %+.3e  overlap %.4f\n", s.wavelength_um, s.n_eff - s.background_index, s.overlap);
  }
  std::printf("TE01 cutoff: FEM %.6f um, walled exact %.6f, open exact %.6f; %d solves, %.1f s\n",
              r.cutoff_wavelength_um, lc_walled, lc_open, r.n_solves, seconds);
}

TEST(CutoffSearch, ReportsAMissingBracketAndAModeThatIsNotGuided) {
  const Fixture& f = fixture();
  auto problem = [&](double lam) { return f.problem(lam); };
  CutoffSearchRequest r = f.request();
  r.max_wavelength_um = 1.1;  // the cutoff (≈ 1.31 µm) lies beyond
  EXPECT_EQ(find_cutoff_wavelength(problem, r).status, CutoffStatus::not_bracketed);
  r = f.request();
  r.start_wavelength_um = 1.5;  // already past cutoff
  r.max_wavelength_um = 1.7;
  const auto s = find_cutoff_wavelength(problem, r);
  EXPECT_EQ(s.status, CutoffStatus::not_guided_at_start);
  EXPECT_EQ(s.n_solves, 1);
  r = f.request();
  r.background_index = nullptr;
  EXPECT_THROW(find_cutoff_wavelength(problem, r), InputError);
}
