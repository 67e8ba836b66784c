// `cladwise verify [--quick]`: the built-in verification. Each case is solved with the same
// pipeline as `cladwise solve` (Gmsh mesh -> edge-element FEM -> shift-invert eigensolve) and
// compared with an exact reference; the table prints case, reference, computed, error and
// tolerance, and the exit status is 1 if any check fails.
#include <chrono>
#include <cmath>
#include <cstdio>
#include <string>
#include <vector>

#include "io/case_file.hpp"
#include "io/cli_options.hpp"
#include "io/commands.hpp"
#include "io/solve_case.hpp"
#include "mesh/gmsh_mesher.hpp"
#include "solver/step_index.hpp"

namespace cladwise::io {
namespace {

struct FibreCase {
  std::string name;
  StepIndexFibre fibre;
  double wall_radius_um;     ///< electric wall
  int order;
  double core_size_um;       ///< element size in the core
  double clad_size_um;       ///< element size far out
  double n_target;
  std::vector<std::string> expected_labels;  ///< FEM modes in order, both polarisations listed
  double tolerance;          ///< |Δn_eff|
  const char* source;
};

/// The case of a round fibre in a disk with an electric outer wall, through the case pipeline.
CaseSpec fibre_case(const FibreCase& fc) {
  CaseSpec c;
  c.path = "verify:" + fc.name;
  c.title = fc.name;
  c.wavelength_um = fc.fibre.wavelength_um;
  c.materials = {constant_index_material("cladding", fc.fibre.n_clad, "verify"),
                 constant_index_material("core", fc.fibre.n_core, "verify")};
  auto& g = c.geometry;
  g.background_material = "cladding";
  g.outer.kind = OuterBoundary::Kind::disk;
  g.outer.radius = fc.wall_radius_um;
  g.outer.where = "verify";
  RegionSpec core;
  core.name = "core";
  core.material = "core";
  core.shapes = {Shape{Disk{fc.fibre.radius_um}, {}}};
  core.mesh_size = fc.core_size_um;
  core.guiding = true;
  core.where = "verify";
  g.regions = {core};
  g.controls.order = fc.order;
  g.controls.default_size = fc.clad_size_um;
  c.solve.n_modes = static_cast<int>(fc.expected_labels.size());
  c.solve.target_index = fc.n_target;
  return c;
}

struct Row {
  std::string case_name, quantity;
  double reference = 0, computed = 0, tolerance = 0;
  int n_dofs = 0;
  double seconds = 0;
  bool pass() const { return std::abs(computed - reference) <= tolerance; }
};

std::vector<Row> run_fibre_case(const FibreCase& fc) {
  const auto t0 = std::chrono::steady_clock::now();
  const CaseSpec c = fibre_case(fc);
  const Mesh mesh = mesh_cross_section(c.geometry);
  const CaseSolution sol = solve_case(c, mesh);
  const double seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
  const auto exact = solve_vector_modes(fc.fibre);
  std::vector<Row> rows;
  for (std::size_t i = 0; i < fc.expected_labels.size(); ++i) {
    Row r;
    r.case_name = fc.name;
    r.quantity = "n_eff " + fc.expected_labels[i];
    r.tolerance = fc.tolerance;
    r.n_dofs = sol.n_dofs;
    r.seconds = seconds;
    r.reference = std::nan("");
    for (const auto& m : exact) {
      if (m.label == fc.expected_labels[i]) r.reference = m.n_eff;
    }
    r.computed = i < sol.modes.size() ? sol.modes[i].mode.n_eff : std::nan("");
    rows.push_back(r);
  }
  return rows;
}

}  // namespace

int run_verify(const Args& args) {
  CommandLine cl("verify",
                 "Solve the built-in verification cases with the finite-element pipeline and compare "
                 "them with exact solutions. Exit status 1 if any check fails.",
                 {{"quick", "", "only the fastest cases (a few seconds)", false}});
  if (!cl.parse(args)) return 0;
  const bool quick = cl.has("quick");

  // References: the exact vector eigenvalue equation of the step-index fibre (Snyder & Love,
  // Optical Waveguide Theory, 1983, ch. 12), solved by solver/step_index.
  const StepIndexFibre weak{1.4504, 1.4447, 4.1, 1.55};
  const StepIndexFibre rod{1.444024, 1.0, 1.0, 1.55};  // silica rod in air (../shared/docs/checks.md §8)
  std::vector<FibreCase> cases = {
      {"weak SMF order 2", weak, 8 * 4.1, 2, 0.45, 2.5, 1.4504, {"HE11", "HE11"}, 1e-8,
       "exact vector equation (Snyder & Love ch. 12)"},
      {"weak SMF order 1", weak, 8 * 4.1, 1, 0.12, 1.2, 1.4504, {"HE11", "HE11"}, 1e-6,
       "exact vector equation (Snyder & Love ch. 12)"},
      {"silica rod in air order 2", rod, 5.0, 2, 0.12, 0.6, 1.444024,
       {"HE11", "HE11", "TE01", "HE21", "HE21", "TM01"}, 1e-6,
       "exact vector equation (Snyder & Love ch. 12)"},
  };
  if (quick) cases.erase(cases.begin() + 1);

  std::printf("%-26s %-12s %18s %18s %10s %9s %8s %7s  %s\n", "case", "quantity", "reference",
              "computed", "error", "tolerance", "unknowns", "time_s", "result");
  int failures = 0, passes = 0;
  for (const auto& fc : cases) {
    for (const auto& r : run_fibre_case(fc)) {
      const bool ok = r.pass();
      (ok ? passes : failures) += 1;
      std::printf("%-26s %-12s %18.12f %18.12f %10.2e %9.0e %8d %7.2f  %s\n", r.case_name.c_str(),
                  r.quantity.c_str(), r.reference, r.computed, std::abs(r.computed - r.reference),
                  r.tolerance, r.n_dofs, r.seconds, ok ? "pass" : "FAIL");
    }
    std::fflush(stdout);
  }
  std::printf("\nverify: %d passed, %d failed\n", passes, failures);
  return failures ? 1 : 0;
}

}  // namespace cladwise::io
