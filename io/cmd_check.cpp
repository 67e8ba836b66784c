// `cladwise check CASE.toml`: validate a case and mesh it, no solve. Prints the regions with
// their materials and areas, the triangle count, element order and mesh quality; optionally
// writes the mesh for inspection (.msh for Gmsh, .vtu for ParaView-compatible viewers).
#include <cmath>
#include <cstdio>
#include <iostream>

#include "io/case_file.hpp"
#include "io/case_keys.hpp"
#include "io/cli_options.hpp"
#include "io/commands.hpp"
#include "io/mesh_case.hpp"
#include "io/staged_output.hpp"
#include "io/vtk_export.hpp"
#include "mesh/gmsh_mesher.hpp"

namespace cladwise::io {
namespace {

/// Area of the region's shapes as drawn, before later regions paint over them; for the
/// background the domain area less the drawn areas of all regions. Only meaningful without a
/// symmetry cut (the drawn shapes are not cut).
std::vector<double> drawn_areas(const CaseSpec& c, const Mesh& mesh) {
  std::vector<double> drawn(mesh.regions.size(), std::nan(""));
  if (c.import || c.geometry.symmetry != SymmetryCut::none) return drawn;
  double painted = 0;
  for (std::size_t r = 0; r < mesh.regions.size(); ++r) {
    for (const auto& spec : c.geometry.regions) {
      if (spec.name != mesh.regions[r].name) continue;
      double a = 0;
      for (const auto& s : spec.shapes) a += exact_area(s.geometry);
      drawn[r] = a;
      painted += a;
    }
  }
  for (std::size_t r = 0; r < mesh.regions.size(); ++r) {
    if (mesh.regions[r].name == c.geometry.background_name) drawn[r] = domain_area(c.geometry) - painted;
  }
  return drawn;
}

}  // namespace

int run_check(const Args& args) {
  for (const auto& a : args) {
    if (a == "--list-keys") {
      std::cout << case_key_reference_markdown();
      return 0;
    }
  }
  CommandLine cl("check", "Validate a case file and mesh its cross-section; no solve.",
                 {{"write-mesh", "DIR", "also write mesh.msh and mesh.vtu into DIR", false},
                  {"list-keys", "", "print the reference of every case-file key (Markdown)", false},
                  {"quiet", "", "print nothing but errors", false}},
                 {"CASE.toml"});
  if (!cl.parse(args)) return 0;
  const CaseSpec c = read_case_file(cl.positional()[0]);
  MeshReport report;
  const Mesh mesh = mesh_case(c, &report);

  if (auto dir = cl.text_or_none("write-mesh")) {
    StagedOutput out(*dir);
    write_msh(mesh, (out.staging() / "mesh.msh").string());
    std::vector<double> index(mesh.n_triangles());
    for (int t = 0; t < mesh.n_triangles(); ++t) {
      const MaterialSpec* m = c.find_material(mesh.regions[mesh.triangle_region[t]].material);
      index[t] = m ? m->max_index(c.wavelength_um) : std::nan("");
    }
    write_vtu(mesh, {VtkArray{"index", 1, index, true}}, out.staging() / "mesh.vtu");
    out.commit();
  }
  if (cl.has("quiet")) return 0;

  std::printf("case        %s  \"%s\"\n", c.path.string().c_str(), c.title.c_str());
  std::printf("wavelength  %.6g um\n", c.wavelength_um);
  std::printf("mesh        %d triangles, order %d%s, %d nodes (%d vertices), %d edges\n",
              report.n_triangles, report.order, report.order == 2 ? " (curved)" : "",
              report.n_nodes, report.n_vertices, mesh.n_edges());
  std::printf("quality     min %.3f, mean %.3f (%s)", report.min_quality, report.mean_quality,
              report.quality_measure.c_str());
  if (report.order == 2) std::printf(", min curved/straight Jacobian %.3f", report.min_jacobian_ratio);
  std::printf("\ntime        %.3f s to mesh\n\n", report.seconds);

  const auto drawn = drawn_areas(c, mesh);
  std::printf("%-16s %-16s %-9s %10s %18s %18s %9s\n", "region", "material", "role", "index",
              "area_um2", "drawn_um2", "min_q");
  double total = 0;
  for (std::size_t r = 0; r < report.regions.size(); ++r) {
    const auto& rr = report.regions[r];
    const MaterialSpec* m = c.find_material(rr.material);
    char drawn_text[32] = "-";
    if (std::isfinite(drawn[r])) std::snprintf(drawn_text, sizeof drawn_text, "%.10g", drawn[r]);
    std::printf("%-16s %-16s %-9s %10.6g %18.10g %18s %9.3f\n", rr.name.c_str(), rr.material.c_str(),
                rr.role == RegionRole::pml ? "pml" : "physical", m ? m->max_index(c.wavelength_um) : std::nan(""),
                rr.area, drawn_text, rr.min_quality);
    if (rr.role == RegionRole::physical) total += rr.area;
  }
  char domain_text[32] = "-";
  if (!c.import) std::snprintf(domain_text, sizeof domain_text, "%.10g", domain_area(c.geometry));
  std::printf("%-16s %-16s %-9s %10s %18.10g %18s\n", "domain", "", "", "", total, domain_text);
  std::printf("\n(drawn_um2: area of the region's shapes before later regions paint over them)\n");
  return 0;
}

}  // namespace cladwise::io
