// Benchmark (not a test): times every stage of the pipeline and the peak memory on cases large
// enough to matter. Run with `cmake --build build --target benchmark`; figures go into
// docs/performance.md.
//
//   bench_pipeline mesh N        mesh an order-2 multicore section of about N triangles
//   bench_pipeline pcf N         mesh an order-2 four-ring air-hole fibre of about N triangles
//   bench_pipeline fibre N       solve HE11 of the weakly guiding fibre with about N unknowns
#include <sys/resource.h>

#include <chrono>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <string>

#include "mesh/cross_section.hpp"
#include "mesh/gmsh_mesher.hpp"
#include "solver/material.hpp"
#include "solver/mode_solver.hpp"
#include "solver/step_index.hpp"

using namespace cladwise;

namespace {

double peak_rss_mib() {
  rusage u{};
  getrusage(RUSAGE_SELF, &u);
  return static_cast<double>(u.ru_maxrss) / 1024.0;  // Linux reports KiB
}

double seconds_since(std::chrono::steady_clock::time_point t0) {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
}

CrossSection fibre_section(double core_size, double clad_size) {
  CrossSection s;
  s.background_material = "cladding";
  s.outer.kind = OuterBoundary::Kind::disk;
  s.outer.radius = 8 * 4.1;
  RegionSpec core;
  core.name = "core";
  core.material = "core";
  core.shapes = {Shape{Disk{4.1}, {}}};
  core.mesh_size = core_size;
  core.guiding = true;
  s.regions = {core};
  s.controls.order = 2;
  s.controls.default_size = clad_size;
  return s;
}

int bench_mesh(long target_triangles) {
  // Seven-core fibre: the element size is scaled so the triangle count lands near the target.
  CrossSection s;
  s.background_material = "cladding";
  s.outer.radius = 45.0;
  RegionSpec cores;
  cores.name = "cores";
  cores.material = "core";
  cores.shapes = core_ring(6, 20.0, 4.1, true);
  cores.guiding = true;
  s.regions = {cores};
  s.controls.order = 2;
  const double area = 3.14159 * 45.0 * 45.0;
  const double h = std::sqrt(2.0 * area / (1.15 * static_cast<double>(target_triangles)));
  s.controls.default_size = h;
  s.regions[0].mesh_size = h;
  const auto t0 = std::chrono::steady_clock::now();
  MeshReport report;
  const Mesh mesh = mesh_cross_section(s, &report);
  std::printf("mesh   order 2  triangles %d  nodes %d  seconds %.2f  peak_MiB %.0f\n",
              mesh.n_triangles(), mesh.n_nodes(), seconds_since(t0), peak_rss_mib());
  return 0;
}

int bench_pcf(long target_triangles) {
  // Our own scenario: 60 air holes (d = 1.4 µm, pitch 2.3 µm, four rings, solid centre) in a
  // silica disk of radius 11 µm; uniform size scaled to land near the target count.
  CrossSection s;
  s.background_material = "silica";
  s.outer.radius = 11.0;
  RegionSpec holes;
  holes.name = "holes";
  holes.material = "air";
  holes.shapes = hexagonal_lattice(2.3, 1.4, 4, true);
  s.regions = {holes};
  s.controls.order = 2;
  const double area = 3.14159 * 11.0 * 11.0;
  const double h = std::sqrt(2.33 * area / static_cast<double>(target_triangles));
  s.controls.default_size = h;
  s.regions[0].mesh_size = h;
  const auto t0 = std::chrono::steady_clock::now();
  const Mesh mesh = mesh_cross_section(s);
  std::printf("pcf    order 2  holes %zu  triangles %d  nodes %d  seconds %.2f  peak_MiB %.0f\n",
              holes.shapes.size(), mesh.n_triangles(), mesh.n_nodes(), seconds_since(t0), peak_rss_mib());
  return 0;
}

int bench_fibre(long target_unknowns) {
  // Order 2 has about 7 unknowns per triangle (2 per edge ×1.5 edges + 2 interior + ~2 nodal),
  // and Gmsh's frontal-Delaunay gives about 2.33 area / h² triangles at size h (measured: 38,181
  // triangles, 266,358 unknowns at h = 0.4536 on this disk).
  const double area = 3.14159 * 32.8 * 32.8;
  const double h = std::sqrt(2.33 * area * 7.0 / static_cast<double>(target_unknowns));
  const auto t0 = std::chrono::steady_clock::now();
  const Mesh mesh = mesh_cross_section(fibre_section(h, h));
  const double mesh_s = seconds_since(t0);
  ModeProblem p;
  p.mesh = &mesh;
  p.region_materials = {isotropic_material(1.4447, "cladding"), isotropic_material(1.4504, "core")};
  p.wavelength_um = 1.55;
  p.order = 2;
  p.boundary_walls.assign(mesh.boundaries.size(), WallType::electric);
  ModeSolver solver(p);
  const double exact = solve_vector_modes({1.4504, 1.4447, 4.1, 1.55}).front().n_eff;
  for (int n_modes : {2, 6}) {
    SolveRequest req;
    req.n_modes = n_modes;
    const auto t1 = std::chrono::steady_clock::now();
    const SolveResult r = solver.solve(req);
    std::printf("fibre  order 2  triangles %d  unknowns %d  modes %d  mesh_s %.2f  assembly_s %.2f  "
                "factorization_s %.2f  eigensolve_s %.2f  solve_total_s %.2f  peak_MiB %.0f  "
                "operator_applications %ld  arnoldi_runs %d  n_eff1 %.12f  HE11_error %.2e  status %s\n",
                mesh.n_triangles(), r.n_dofs, n_modes, mesh_s, r.timing.assembly_s,
                r.timing.factorization_s, r.timing.eigensolve_s, seconds_since(t1), peak_rss_mib(),
                r.n_operator_applications, r.n_arnoldi_runs, r.modes.empty() ? 0.0 : r.modes[0].n_eff,
                r.modes.empty() ? 0.0 : std::abs(r.modes[0].n_eff - exact),
                std::string(to_string(r.status)).c_str());
    std::fflush(stdout);
  }
  return 0;
}

}  // namespace

int main(int argc, char** argv) {
  if (argc != 3) {
    std::fprintf(stderr, "usage: bench_pipeline mesh|pcf|fibre N\n");
    return 2;
  }
  const std::string what = argv[1];
  const long n = std::atol(argv[2]);
  if (what == "mesh") return bench_mesh(n);
  if (what == "pcf") return bench_pcf(n);
  if (what == "fibre") return bench_fibre(n);
  std::fprintf(stderr, "unknown benchmark '%s'\n", what.c_str());
  return 2;
}
