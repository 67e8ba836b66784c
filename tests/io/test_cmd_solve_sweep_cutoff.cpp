// Cutoff wavelength of a case's mode (io/sweep.hpp case_cutoff): the case's own mesh, walls and
// Sellmeier materials, against the exact TE01 cutoff of the same fibre inside the same electric
// wall (solver/step_index.hpp te_cutoff_v_with_electric_wall; open-cladding limit V = 2.404826,
// Abramowitz & Stegun Table 9.5), with the glasses of checks.md §1.
#include <gtest/gtest.h>

#include <cmath>

#include "io/case_file.hpp"
#include "io/mesh_case.hpp"
#include "io/sweep.hpp"
#include "mesh/error.hpp"
#include "solver/material_catalogue.hpp"
#include "solver/scalar_root.hpp"
#include "solver/step_index.hpp"

using namespace cladwise;

namespace {

// The fibre of cases/dispersion_smf.toml on a quarter domain (electric walls on both cuts: the
// class of TE01, without HE11 and TM01) with the outer wall at 10 core radii.
const char* kCase = R"(
title = "TE01 cutoff of a standard-like fibre"
wavelength_um = 1.0
[materials]
silica = { model = "silica" }
doped = { model = "germania_silica", mole_fraction = 0.035 }
[domain]
shape = "disk"
radius_um = 41.0
material = "silica"
symmetry = "quarter"
x_axis_wall = "electric"
y_axis_wall = "electric"
[[region]]
name = "core"
material = "doped"
shape = "disk"
radius_um = 4.1
guiding = true
mesh_size_um = 0.5
[mesh]
order = 2
size_um = 3.0
)";

}  // namespace

TEST(SolveSweepCutoff, CaseCutoffOfTe01MatchesTheExactWalledFibre) {
  const io::CaseSpec c = io::read_case_text(kCase, "te01_cutoff.toml");
  const Mesh mesh = io::mesh_case(c);
  const CutoffSearchResult r = io::case_cutoff(c, mesh, 0, 1.0, 1.7);
  ASSERT_EQ(r.status, CutoffStatus::found) << to_string(r.status);
  EXPECT_LE(r.n_solves, 15);

  const DispersionModel clad = silica_malitson1965(), core = germania_silica(0.035);
  auto lambda_at_v = [&](double v) {
    auto g = [&](double lam) { return StepIndexFibre{core.index(lam), clad.index(lam), 4.1, lam}.v_number() - v; };
    return brent_root(g, 0.9, 1.8, g(0.9), g(1.8), 1e-13);
  };
  const double exact = lambda_at_v(te_cutoff_v_with_electric_wall(1, 4.1 / 41.0));  // 1.314195 µm
  EXPECT_NEAR(r.cutoff_wavelength_um, exact, 2e-4 * exact);
}

TEST(SolveSweepCutoff, RejectsCasesWithoutARealCladdingIndex) {
  std::string text = kCase;
  const std::string key = "symmetry = ";
  text.insert(text.find(key), "pml_thickness_um = 5.0\n");  // a PML: leaky modes, no real cutoff
  const io::CaseSpec c = io::read_case_text(text, "pml.toml");
  const Mesh mesh = io::mesh_case(c);
  EXPECT_THROW(io::case_cutoff(c, mesh, 0, 1.0, 1.7), InputError);
}
