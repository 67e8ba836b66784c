// `cladwise splice FROM.toml TO.toml`: butt-coupling (splice) efficiency of one mode of the first
// cross-section into every computed mode of the second, with a lateral offset and a tilt of the
// second guide. Both cases must be lossless and at the same wavelength; both are meshed and solved
// as `cladwise solve` would. The overlap is solver/mode_overlap.hpp (symmetric mode-matching form).
#include <cmath>
#include <cstdio>
#include <iostream>

#include "io/case_file.hpp"
#include "io/cli_options.hpp"
#include "io/commands.hpp"
#include "io/json_writer.hpp"
#include "io/mesh_case.hpp"
#include "io/progress.hpp"
#include "io/solve_case.hpp"
#include "mesh/error.hpp"
#include "solver/mesh_locator.hpp"
#include "solver/mode_labels.hpp"
#include "solver/mode_overlap.hpp"

namespace cladwise::io {

int run_splice(const Args& args) {
  CommandLine cl(
      "splice",
      "Butt-coupling efficiency and loss from one mode of FROM into each mode of TO (a splice or a "
      "butt joint, reflection neglected), with TO offset by (x, y) and tilted about the y axis.",
      {{"from-mode", "N", "mode of FROM to launch, counted from 1 by descending n_eff (default 1)", false},
       {"offset-x-um", "DX", "lateral offset of TO along x (default 0)", false},
       {"offset-y-um", "DY", "lateral offset of TO along y (default 0)", false},
       {"tilt-deg", "T", "tilt of TO about the y axis, small angles (default 0)", false},
       {"json", "", "print the result as JSON", false},
       {"quiet", "", "no progress on stderr", false}},
      {"FROM.toml", "TO.toml"});
  if (!cl.parse(args)) return 0;
  const CaseSpec from = read_case_file(cl.positional()[0]);
  const CaseSpec to = read_case_file(cl.positional()[1]);
  if (std::abs(from.wavelength_um - to.wavelength_um) > 1e-12 * from.wavelength_um) {
    throw InputError(to.path.string() + " key 'wavelength_um'",
                     "both cases must be at the same wavelength to splice (" +
                         std::to_string(from.wavelength_um) + " and " + std::to_string(to.wavelength_um) + " um)");
  }
  for (const CaseSpec* c : {&from, &to}) {
    if (!c->import && c->geometry.symmetry != SymmetryCut::none) {
      throw InputError(c->path.string() + " [domain] key 'symmetry'",
                       "splicing needs the whole cross-section; remove the symmetry cut");
    }
  }
  JunctionAlignment align;
  align.offset_x_um = cl.number_or_none("offset-x-um").value_or(0.0);
  align.offset_y_um = cl.number_or_none("offset-y-um").value_or(0.0);
  align.tilt_deg = cl.number_or_none("tilt-deg").value_or(0.0);
  if (std::abs(align.tilt_deg) > 10.0) throw InputError("option --tilt-deg", "the paraxial tilt phase holds for small angles; give at most 10 degrees");
  // The tilt phase runs in the medium at the junction: the background of the receiving guide.
  align.medium_index = to.import ? 1.0 : to.find_material(to.geometry.background_material)->max_index(to.wavelength_um);

  Progress progress(cl.has("quiet") || cl.has("json"));
  progress.update("meshing " + from.path.filename().string());
  const Mesh mesh_from = mesh_case(from);
  progress.update("meshing " + to.path.filename().string());
  const Mesh mesh_to = mesh_case(to);
  for (const auto* pair : {&from, &to}) {
    if (needs_complex_solver(*pair, pair == &from ? mesh_from : mesh_to)) {
      throw InputError(pair->path.string(), "splice works with lossless guides (no PML, bend or lossy material)");
    }
  }
  const LosslessSolve a = run_lossless_solver(from, mesh_from, &progress);
  const LosslessSolve b = run_lossless_solver(to, mesh_to, &progress);
  const int n_from = static_cast<int>(a.result.modes.size());
  const long from_mode = cl.has("from-mode") ? cl.integer("from-mode", 1, n_from) : 1;
  progress.update("overlaps");
  const MeshLocator locator_to(mesh_to);
  const Mode& launched = a.result.modes[from_mode - 1];
  const JunctionSide side_a{&a.solver->problem(), &a.solver->dof_map(), &launched};

  struct Row {
    std::string label;
    double n_eff, efficiency, loss_db;
  };
  std::vector<Row> rows;
  double total = 0;
  for (const Mode& m : b.result.modes) {
    const JunctionSide side_b{&b.solver->problem(), &b.solver->dof_map(), &m};
    const CouplingResult r = butt_coupling(side_a, side_b, locator_to, align);
    rows.push_back({label_mode(b.solver->problem(), b.solver->dof_map(), m, {}).generic_label, m.n_eff, r.efficiency, r.loss_db});
    total += r.efficiency;
  }
  const std::string from_label = label_mode(a.solver->problem(), a.solver->dof_map(), launched, {}).generic_label;
  progress.note("done");

  if (cl.has("json")) {
    JsonWriter j(std::cout);
    j.begin_object();
    j.key("from").value(from.path.string()).key("to").value(to.path.string());
    j.key("wavelength_um").value(from.wavelength_um);
    j.key("from_mode").begin_object().key("index").value(from_mode).key("label").value(from_label)
        .key("n_eff").value(launched.n_eff).end_object();
    j.key("offset_x_um").value(align.offset_x_um).key("offset_y_um").value(align.offset_y_um);
    j.key("tilt_deg").value(align.tilt_deg);
    j.key("modes").begin_array();
    for (const auto& r : rows) {
      j.begin_object().key("label").value(r.label).key("n_eff").value(r.n_eff)
          .key("efficiency").value(r.efficiency).key("loss_db").value(r.loss_db).end_object();
    }
    j.end_array();
    j.key("total_efficiency").value(total).key("total_loss_db").value(-10.0 * std::log10(total));
    j.end_object();
    return 0;
  }
  std::printf("launch      mode %ld of %s (%s, n_eff %.10f)\n", from_mode, from.path.string().c_str(),
              from_label.c_str(), launched.n_eff);
  std::printf("into        %s, offset (%.4g, %.4g) um, tilt %.4g deg\n\n", to.path.string().c_str(),
              align.offset_x_um, align.offset_y_um, align.tilt_deg);
  std::printf("%-5s %-22s %16s %12s %10s\n", "mode", "label", "n_eff", "efficiency", "loss_db");
  for (std::size_t i = 0; i < rows.size(); ++i) {
    std::printf("%-5zu %-22s %16.10f %12.6f %10.4f\n", i + 1, rows[i].label.c_str(), rows[i].n_eff,
                rows[i].efficiency, rows[i].loss_db);
  }
  std::printf("\ninto all computed modes: efficiency %.6f, loss %.4f dB\n", total, -10.0 * std::log10(total));
  return 0;
}

}  // namespace cladwise::io
