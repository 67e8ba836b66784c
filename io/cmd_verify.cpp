// `cladwise verify [--quick]`: the built-in verification. Each case is solved with the same
// pipeline as `cladwise solve` (Gmsh mesh -> edge-element FEM -> shift-invert eigensolve) and
// compared with an exact reference; the table prints case, quantity, reference, computed, error
// and tolerance, and the exit status is 1 if any check fails.
//
// Cases (mesh sizes chosen by the measurements in docs/verification.md, with margin):
//   * weakly guiding fibre n1 = 1.4504, n2 = 1.4447, a = 4.1 µm, λ = 1.55 µm, electric wall at
//     8a (issue 4, "Must show"): order 2 curved, HE11 within 1e-8 with at most 30k unknowns and
//     within 1e-10 with at most 150k; order 1 within 1e-6 with at most 40k; the two HE11
//     polarisations agree to the same tolerance;
//   * silica rod in air n1 = 1.444024, a = 1 µm (checks.md §8): every guided vector mode;
//   * hollow rectangular metallic guide 2 × 1.2 µm, k0 = 4 µm⁻¹: TE10, TE01 (Pozar,
//     "Microwave Engineering", 4th ed., §3.3: β² = k0² − (mπ/a)² − (nπ/b)²).
// References for the fibres: the exact vector eigenvalue equation of the step-index fibre
// (Snyder & Love, "Optical Waveguide Theory", 1983, ch. 12), solved by solver/step_index.
#include <chrono>
#include <cmath>
#include <cstdio>
#include <numbers>
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

struct Row {
  std::string case_name, quantity;
  double reference = 0, computed = 0, tolerance = 0;
  int n_dofs = 0;
  double seconds = 0;
  bool pass() const { return std::abs(computed - reference) <= tolerance; }  // false for NaN
};

/// One verification case: a cross-section solved through the case pipeline, and the expected
/// modes (descending n_eff; both members of a degenerate pair listed).
struct VerifyCase {
  std::string name;
  CaseSpec spec;
  std::vector<std::pair<std::string, double>> expected;  ///< label, exact n_eff
  double tolerance = 0;                                  ///< |Δn_eff|, and the pair split
  int max_unknowns = 0;                                  ///< 0: no limit
  bool check_pairs = false;                              ///< rows for |n_a − n_b| of each pair
  /// Leaky case: the published loss of the first mode (dB/m) and its relative tolerance.
  double loss_db_per_m = 0;
  double loss_tolerance = 0;
  /// Leaky case: a second reference computed in this project (n_eff, loss dB/m) and its
  /// tolerances (absolute on n_eff, relative on the loss); 0: none.
  double computed_n_eff = 0, computed_n_eff_tolerance = 0;
  double computed_loss_db_per_m = 0, computed_loss_tolerance = 0;
  std::string computed_label;
};

/// Six-hole silica microstructured fibre of White et al., JOSA B 19, 2322 (2002) (multipole
/// method; checks.md §3): quarter domain, PML, the x-polarised fundamental mode.
VerifyCase six_hole_fibre_case() {
  VerifyCase v;
  v.name = "six-hole fibre, PML";
  CaseSpec& c = v.spec;
  c.path = "verify:" + v.name;
  c.title = v.name;
  c.wavelength_um = 1.45;
  c.wavelengths_um = {1.45};
  c.materials = {constant_index_material("silica", 1.45, "verify"), constant_index_material("air", 1.0, "verify")};
  auto& g = c.geometry;
  g.background_material = "silica";
  g.outer.kind = OuterBoundary::Kind::disk;
  g.outer.radius = 11.0;
  g.outer.pml_thickness = 4.0;
  g.outer.where = "verify";
  g.symmetry = SymmetryCut::quarter;
  c.walls.x_axis = WallKind::magnetic;
  c.walls.y_axis = WallKind::electric;
  c.pml.strength = 8.0;
  RegionSpec core;
  core.name = "core";
  core.material = "silica";
  core.shapes = {Shape{Disk{4.0}, {}}};
  core.mesh_size = 0.5;
  core.where = "verify";
  RegionSpec holes;
  holes.name = "holes";
  holes.material = "air";
  holes.shapes = hexagonal_lattice(6.75, 5.0, 1, true);
  holes.mesh_size = 0.35;
  holes.guiding = true;
  holes.where = "verify";
  g.regions = {core, holes};
  g.controls.order = 2;
  g.controls.default_size = 0.8;
  g.controls.interface_size = 0.35;
  g.controls.growth = 1.2;
  c.solve.n_modes = 1;
  c.solve.target_index = 1.4454;
  // Multipole method: n_eff = 1.445395345 + i 3.150e-8, 1.186 dB/m (as quoted). The FEM's
  // converged real part lies 1.1e-7 below it on every mesh and PML tried; an independent
  // multipole computation converges to the FEM's value and gives the quoted one only when
  // truncated at |m| <= 5 (docs/verification.md), hence the 2e-7 tolerance.
  v.expected = {{"fund.", 1.445395345}};
  v.tolerance = 2e-7;
  v.loss_db_per_m = 1.186;
  v.loss_tolerance = 0.05;
  // The converged multipole value computed by tests/benchmark/multipole_six_hole.py (the published
  // method implemented here; not a published number): 1.445395232149 + i 3.194525e-8, 1.20235 dB/m.
  v.computed_label = "conv.";  // explained under the table
  v.computed_n_eff = 1.445395232149;
  v.computed_n_eff_tolerance = 1e-7;
  v.computed_loss_db_per_m = 1.20235;
  v.computed_loss_tolerance = 0.005;
  return v;
}

struct FibreMesh {
  int order;
  double core_size, interface_size, growth, clad_size;
};

/// A round fibre in a disk with an electric outer wall (plain mesher mesh, no symmetry cut).
VerifyCase fibre_case(const std::string& name, const StepIndexFibre& fibre, double wall_radius,
                      const FibreMesh& m, int n_modes_limit, double tolerance, int max_unknowns) {
  VerifyCase v;
  v.name = name;
  CaseSpec& c = v.spec;
  c.path = "verify:" + name;
  c.title = name;
  c.wavelength_um = fibre.wavelength_um;
  c.materials = {constant_index_material("cladding", fibre.n_clad, "verify"),
                 constant_index_material("core", fibre.n_core, "verify")};
  auto& g = c.geometry;
  g.background_material = "cladding";
  g.outer.kind = OuterBoundary::Kind::disk;
  g.outer.radius = wall_radius;
  g.outer.where = "verify";
  RegionSpec core;
  core.name = "core";
  core.material = "core";
  core.shapes = {Shape{Disk{fibre.radius_um}, {}}};
  core.mesh_size = m.core_size;
  core.guiding = true;
  core.where = "verify";
  g.regions = {core};
  g.controls.order = m.order;
  g.controls.default_size = m.clad_size;
  g.controls.interface_size = m.interface_size;
  g.controls.growth = m.growth;
  for (const auto& mode : solve_vector_modes(fibre)) {
    for (int k = 0; k < mode.degeneracy(); ++k) {
      if (static_cast<int>(v.expected.size()) < n_modes_limit) v.expected.push_back({mode.label, mode.n_eff});
    }
  }
  c.solve.n_modes = static_cast<int>(v.expected.size());
  c.solve.target_index = fibre.n_core;
  v.tolerance = tolerance;
  v.max_unknowns = max_unknowns;
  v.check_pairs = true;
  return v;
}

/// Hollow rectangular guide a × b with electric walls, filled with n = 1.
VerifyCase hollow_guide_case(double a, double b, double k0, double size, double tolerance) {
  VerifyCase v;
  v.name = "hollow metal guide";
  CaseSpec& c = v.spec;
  c.path = "verify:" + v.name;
  c.title = v.name;
  c.wavelength_um = 2.0 * std::numbers::pi / k0;
  c.materials = {constant_index_material("air", 1.0, "verify")};
  auto& g = c.geometry;
  g.background_material = "air";
  g.outer.kind = OuterBoundary::Kind::rectangle;
  g.outer.width = a;
  g.outer.height = b;
  g.outer.where = "verify";
  // The mesher fragments the domain with at least one shape: an air disk at the centre (an
  // interface between equal media, which changes nothing but the mesh).
  RegionSpec centre;
  centre.name = "centre";
  centre.material = "air";
  centre.shapes = {Shape{Disk{0.25 * std::min(a, b)}, {}}};
  centre.where = "verify";
  g.regions = {centre};
  g.controls.order = 2;
  g.controls.default_size = size;
  auto n_eff = [&](int m, int n) {
    return std::sqrt(k0 * k0 - std::pow(m * std::numbers::pi / a, 2) - std::pow(n * std::numbers::pi / b, 2)) / k0;
  };
  v.expected = {{"TE10", n_eff(1, 0)}, {"TE01", n_eff(0, 1)}};
  c.solve.n_modes = 2;
  c.solve.target_index = 1.0;
  v.tolerance = tolerance;
  return v;
}

std::vector<Row> run_leaky_case(const VerifyCase& v) {
  const auto t0 = std::chrono::steady_clock::now();
  const Mesh mesh = mesh_cross_section(v.spec.geometry);
  const CaseSolution sol = solve_case(v.spec, mesh);
  const double seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
  const bool found = !sol.modes.empty();
  Row n{v.name, "n_eff " + v.expected[0].first, v.expected[0].second,
        found ? sol.modes[0].mode.n_eff : std::nan(""), v.tolerance, sol.n_dofs, seconds};
  Row loss{v.name, "loss dB/m", v.loss_db_per_m, found ? sol.modes[0].loss_db_per_m : std::nan(""),
           v.loss_tolerance * v.loss_db_per_m, sol.n_dofs, seconds};
  std::vector<Row> rows = {n, loss};
  if (v.computed_n_eff > 0) {
    rows.push_back({v.name, "n_eff " + v.computed_label, v.computed_n_eff,
                    found ? sol.modes[0].mode.n_eff : std::nan(""), v.computed_n_eff_tolerance, sol.n_dofs, seconds});
    rows.push_back({v.name, "loss " + v.computed_label, v.computed_loss_db_per_m,
                    found ? sol.modes[0].loss_db_per_m : std::nan(""),
                    v.computed_loss_tolerance * v.computed_loss_db_per_m, sol.n_dofs, seconds});
  }
  return rows;
}

std::vector<Row> run_case(const VerifyCase& v) {
  if (v.loss_db_per_m > 0) return run_leaky_case(v);
  const auto t0 = std::chrono::steady_clock::now();
  const Mesh mesh = mesh_cross_section(v.spec.geometry);
  // The case pipeline's solve without the per-mode metrics (effective area, MFD, ...): only
  // n_eff is verified here.
  const LosslessSolve sol = run_lossless_solver(v.spec, mesh);
  const auto& modes = sol.result.modes;
  const double seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
  std::vector<Row> rows;
  auto row = [&](std::string quantity, double reference, double computed, double tolerance) {
    Row r;
    r.case_name = v.name;
    r.quantity = std::move(quantity);
    r.reference = reference;
    r.computed = computed;
    r.tolerance = tolerance;
    r.n_dofs = sol.result.n_dofs;
    r.seconds = seconds;
    rows.push_back(r);
  };
  for (std::size_t i = 0; i < v.expected.size(); ++i) {
    row("n_eff " + v.expected[i].first, v.expected[i].second,
        i < modes.size() ? modes[i].n_eff : std::nan(""), v.tolerance);
  }
  if (v.check_pairs) {
    for (std::size_t i = 0; i + 1 < v.expected.size() && i + 1 < modes.size(); ++i) {
      if (v.expected[i].first != v.expected[i + 1].first) continue;
      row("split " + v.expected[i].first, 0.0, std::abs(modes[i].n_eff - modes[i + 1].n_eff),
          v.tolerance);
      ++i;
    }
  }
  if (v.max_unknowns > 0) {
    // passes while unknowns ≤ max_unknowns: |computed − reference| ≤ tolerance on [0, max]
    row("unknowns", 0.5 * v.max_unknowns, sol.result.n_dofs, 0.5 * v.max_unknowns);
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

  const StepIndexFibre weak{1.4504, 1.4447, 4.1, 1.55};
  const StepIndexFibre rod{1.444024, 1.0, 1.0, 1.55};  // silica rod in air (checks.md §8)
  const double wall = 8 * weak.radius_um;
  // Measured on these meshes (docs/verification.md): HE11 errors 1.9e-9 / 2.6e-9 at 19.9k
  // unknowns (order 2), 5.7e-11 / 6.1e-11 at 131k (order 2), 5.8e-7 / 6.0e-7 at 34k (order 1).
  std::vector<VerifyCase> cases = {
      fibre_case("weak fibre, order 2", weak, wall, {2, 0.4, 0.4, 1.15, 8.0}, 2, 1e-8, 30000),
      fibre_case("silica rod, order 2", rod, 16.0, {2, 0.1, 0.07, 1.3, 2.0}, quick ? 6 : 10,
                 quick ? 1e-5 : 5e-6, 0),
      hollow_guide_case(2.0, 1.2, 4.0, 0.1, 1e-6),
      six_hole_fibre_case(),
  };
  if (!quick) {
    cases.insert(cases.begin() + 1,
                 {fibre_case("weak fibre, order 2, fine", weak, wall, {2, 0.15, 0.15, 1.06, 8.0}, 2,
                             1e-10, 150000),
                  fibre_case("weak fibre, order 1", weak, wall, {1, 0.12, 0.12, 1.1, 3.0}, 2, 1e-6,
                             40000)});
  }

  std::printf("%-26s %-12s %18s %18s %10s %9s %8s %7s  %s\n", "case", "quantity", "reference",
              "computed", "error", "tolerance", "unknowns", "time_s", "result");
  int failures = 0, passes = 0;
  for (const auto& v : cases) {
    for (const auto& r : run_case(v)) {
      const bool ok = r.pass();
      (ok ? passes : failures) += 1;
      if (r.quantity == "unknowns") {
        std::printf("%-26s %-12s %18s %18d %10s %9s %8d %7.2f  %s\n", r.case_name.c_str(), "unknowns",
                    ("<= " + std::to_string(static_cast<int>(2 * r.reference))).c_str(), r.n_dofs, "", "",
                    r.n_dofs, r.seconds, ok ? "pass" : "FAIL");
        continue;
      }
      std::printf("%-26s %-12s %18.12f %18.12f %10.2e %9.0e %8d %7.2f  %s\n", r.case_name.c_str(),
                  r.quantity.c_str(), r.reference, r.computed, std::abs(r.computed - r.reference),
                  r.tolerance, r.n_dofs, r.seconds, ok ? "pass" : "FAIL");
    }
    std::fflush(stdout);
  }
  std::printf("\nconv.: the six-hole fibre's converged multipole value, computed in this project by\n"
              "tests/benchmark/multipole_six_hole.py (a second reference, not a published number;\n"
              "docs/verification.md, \"The six-hole reference value\").\n");
  std::printf("\nverify: %d passed, %d failed\n", passes, failures);
  return failures ? 1 : 0;
}

}  // namespace cladwise::io
