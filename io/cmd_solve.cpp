// `cladwise solve CASE.toml`: the tutorial skeleton make_mesh -> setup_dofs -> assemble -> solve
// -> postprocess -> write_results. Writes DIR/modes.json, DIR/modes.csv, one DIR/mode_NN.vtu per
// mode and DIR/modes.pvd, through a staging folder renamed at the end.
#include <omp.h>

#include <chrono>
#include <cmath>
#include <cstdio>
#include <filesystem>
#include <map>
#include <optional>

#include "io/case_file.hpp"
#include "io/cli_options.hpp"
#include "io/commands.hpp"
#include "io/mesh_case.hpp"
#include "io/mode_pictures.hpp"
#include "io/progress.hpp"
#include "io/report_html.hpp"
#include "io/results.hpp"
#include "io/solve_case.hpp"
#include "io/sweep.hpp"
#include "io/staged_output.hpp"
#include "io/vtk_export.hpp"
#include "mesh/error.hpp"

namespace cladwise::io {

namespace fs = std::filesystem;

int run_solve(const Args& args) {
  CommandLine cl("solve", "Compute the modes of a case and write modes.json, modes.csv and VTK fields.",
                 {{"out", "DIR", "output folder (default: <case name>.out beside the case)", false},
                  {"threads", "N", "threads for assembly (default: all cores)", false},
                  {"quiet", "", "no progress on stderr", false}},
                 {"CASE.toml"});
  if (!cl.parse(args)) return 0;
  if (cl.has("threads")) omp_set_num_threads(static_cast<int>(cl.integer("threads", 1, 1024)));
  const fs::path case_path = cl.positional()[0];
  const CaseSpec c = read_case_file(case_path);
  const fs::path out_dir = cl.text_or_none("out").value_or(
      (case_path.parent_path() / (case_path.stem().string() + ".out")).string());

  Progress progress(cl.has("quiet"));
  const auto t0 = std::chrono::steady_clock::now();

  // 1. make_mesh
  progress.update("meshing");
  MeshReport report;
  const Mesh mesh = mesh_case(c, &report);
  progress.note("meshed: " + std::to_string(mesh.n_triangles()) + " triangles, order " +
                std::to_string(mesh.order));

  // 2-4. setup_dofs, assemble, solve (once per wavelength, on one mesh and one solver)
  std::vector<CaseSolution> sols = solve_sweep(c, mesh, &progress);
  const bool sweep = sols.size() > 1;
  const auto tracks = track_modes(sols);
  const auto zeros = sweep ? add_dispersion(sols, tracks) : std::vector<ZeroDispersion>{};
  progress.note("solved: " + std::to_string(sols.front().n_dofs) + " unknowns, " +
                std::to_string(sols.size()) + " wavelength(s)");

  // 5. postprocess and 6. write_results, all into the staging folder first.
  StagedOutput out(out_dir);
  RunResult run;
  run.case_path = case_path.string();
  run.n_triangles = mesh.n_triangles();
  run.order = mesh.order;
  run.n_dofs = sols.front().n_dofs;
  std::vector<PvdEntry> pvd;
  std::map<int, std::vector<PvdEntry>> track_pvd;
  ReportInputs report_inputs;
  report_inputs.title = c.title;
  report_inputs.pictures.resize(sols.size());
  for (std::size_t p = 0; p < sols.size(); ++p) {
    const CaseSolution& sol = sols[p];
    PointResult point;
    point.wavelength_um = sol.wavelength_um;
    for (std::size_t m = 0; m < sol.modes.size(); ++m) {
      progress.update("writing fields", static_cast<double>(p * sol.modes.size() + m) / (sols.size() * sol.modes.size()));
      const auto& mode = sol.modes[m];
      ModeRow row;
      row.n_eff = mode.mode.n_eff;
      row.n_eff_imag = mode.n_eff_imag;
      row.loss_db_per_m = mode.loss_db_per_m;
      row.label = mode.label;
      row.residual = mode.mode.residual;
      row.metrics = mode.metrics;
      point.modes.push_back(row);
      for (const auto& w : mode.warnings) {
        progress.note("warning: " + w);
        report_inputs.warnings.push_back(w);
      }
      if (!mode.fields) continue;
      char name[64];
      if (sweep) std::snprintf(name, sizeof name, "p%03zu_mode_%02zu.vtu", p + 1, m + 1);
      else std::snprintf(name, sizeof name, "mode_%02zu.vtu", m + 1);
      CaseSpec cp = c;
      cp.wavelength_um = sol.wavelength_um;
      const auto arrays = mode_field_arrays(cp, mesh, mode);
      write_vtu(mesh, arrays, out.staging() / name);
      // Pictures of every mode of a single solve, and of the first point of a sweep.
      if (p == 0) {
        report_inputs.pictures[p].resize(sol.modes.size());
        report_inputs.pictures[p][m] =
            write_mode_pictures(mesh, *mode.fields, {}, out.staging(), fs::path(name).stem().string());
        if (report_inputs.mesh_picture.empty()) {
          write_index_png(mesh, arrays.back().values, {}, out.staging() / "mesh_index.png");
          report_inputs.mesh_picture = "mesh_index.png";
        }
      }
      if (!sweep) pvd.push_back({static_cast<double>(m + 1), name});
      track_pvd[tracks[p][m]].push_back({sol.wavelength_um, name});
    }
    point.core_pairs = sol.core_pairs;
    run.points.push_back(point);
    run.assembly_s += sol.timing.assembly_s;
    run.factorization_s += sol.timing.factorization_s;
    run.eigensolve_s += sol.timing.eigensolve_s;
  }
  if (sweep) {
    // One collection per tracked mode, the wavelength as the series value.
    for (const auto& [t, entries] : track_pvd) {
      char name[32];
      std::snprintf(name, sizeof name, "track_%02d.pvd", t);
      write_pvd(entries, out.staging() / name);
    }
    write_text_file(out.staging() / "sweep.csv", sweep_csv(sols, tracks));
  } else {
    write_pvd(pvd, out.staging() / "modes.pvd");
  }
  for (const auto& z : zeros) run.zero_dispersion.push_back({z.track, z.wavelength_um, z.slope_ps_per_nm2_km});
  if (c.cutoff) {
    progress.update("cutoff search");
    const auto cr = case_cutoff(c, mesh, c.cutoff->mode - 1, c.cutoff->from_um.value_or(c.wavelengths_um.front()), c.cutoff->to_um);
    run.cutoff = RunResult::CutoffRow{c.cutoff->mode, std::string(to_string(cr.status)), cr.cutoff_wavelength_um, cr.n_solves};
  }
  run.mesh_s = report.seconds;
  run.total_s = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
  write_vtu(mesh, mesh_cell_arrays(c, mesh), out.staging() / "mesh.vtu");
  write_text_file(out.staging() / "modes.json", modes_json(run));
  write_text_file(out.staging() / "modes.csv", modes_csv(run));
  write_report_html(run, report_inputs, out.staging() / "report.html");
  out.commit();
  progress.note("wrote " + out_dir.string());

  if (!cl.has("quiet") && run.cutoff) {
    std::printf("cutoff of mode %d: %.6f um (%s, %d solves)\n\n", run.cutoff->mode, run.cutoff->wavelength_um,
                run.cutoff->status.c_str(), run.cutoff->n_solves);
  }
  if (!cl.has("quiet") && sweep) {
    std::printf("%s", sweep_csv(sols, tracks).c_str());
    for (const auto& z : zeros) {
      std::printf("\ntrack %d: zero dispersion at %.5f um (slope %.4g ps/(nm^2 km))", z.track, z.wavelength_um, z.slope_ps_per_nm2_km);
    }
    if (!zeros.empty()) std::printf("\n");
    return 0;
  }
  const PointResult& point = run.points.front();
  if (!cl.has("quiet")) {
    auto metric = [](const ModeRow& row, const std::string& key) -> std::optional<double> {
      for (const auto& [k, v] : row.metrics) {
        if (k == key) return v;
      }
      return std::nullopt;
    };
    bool lossy = false;
    for (const auto& row : point.modes) lossy = lossy || row.n_eff_imag > 0;
    if (lossy) {
      std::printf("%-5s %-12s %18s %12s %14s %12s\n", "mode", "label", "n_eff", "n_eff_imag", "loss_db_per_m", "residual");
    } else {
      const bool with_metrics = !point.modes.empty() && metric(point.modes[0], "effective_area_um2");
      std::printf("%-5s %-20s %18s %12s%s\n", "mode", "label", "n_eff", "residual",
                  with_metrics ? "  a_eff_um2   mfd_um" : "");
    }
    for (std::size_t m = 0; m < point.modes.size(); ++m) {
      const auto& row = point.modes[m];
      if (lossy) {
        std::printf("%-5zu %-12s %18.12f %12.4e %14.6g %12.2e\n", m + 1, row.label.c_str(), row.n_eff,
                    row.n_eff_imag, row.loss_db_per_m, row.residual);
      } else {
        std::printf("%-5zu %-20s %18.12f %12.2e", m + 1, row.label.c_str(), row.n_eff, row.residual);
        if (auto a = metric(row, "effective_area_um2")) std::printf(" %12.4f", *a);
        if (auto d = metric(row, "mfd_petermann_um")) std::printf(" %10.4f", *d);
        std::printf("\n");
      }
    }
    if (!point.core_pairs.empty()) {
      std::printf("\n%-4s %-12s %12s %14s %18s\n", "pol", "cores", "distance_um", "kappa_per_m", "coupling_length_m");
      for (const auto& p : point.core_pairs) {
        std::printf("%-4c %4d - %-5d %12.4f %14.6g %18.6g\n", p.polarisation, p.core_a, p.core_b,
                    p.distance_um, p.kappa_per_m, p.coupling_length_m);
      }
    }
    for (const auto& row : point.modes) {
      if (auto b = metric(row, "birefringence")) {
        std::printf("\nfundamental pair: birefringence %.6g, beat length %.6g mm\n", *b,
                    metric(row, "beat_length_mm").value_or(NAN));
        break;
      }
    }
  }
  return 0;
}

}  // namespace cladwise::io
