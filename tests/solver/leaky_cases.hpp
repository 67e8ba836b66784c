// Cross-sections of the leaky/lossy-mode tests and benchmarks (tests/solver/test_pml_*,
// test_complex_*, test_bend_*, tests/benchmark/bench_leaky.cpp), built with the Gmsh mesher.
#pragma once

#include <map>
#include <string>
#include <vector>

#include "mesh/cross_section.hpp"
#include "mesh/gmsh_mesher.hpp"
#include "solver/complex_mode_solver.hpp"

namespace cladwise::testing {

/// Materials of every mesh region by material name; throws if a name is missing.
inline std::vector<TensorMaterial> materials_by_name(const Mesh& mesh,
                                                     const std::map<std::string, TensorMaterial>& by_name) {
  std::vector<TensorMaterial> out;
  for (const auto& r : mesh.regions) out.push_back(by_name.at(r.material));
  return out;
}

/// Wall per boundary: the outer wall, and the two symmetry cuts "cut_y0" (y = 0) and "cut_x0".
inline std::vector<WallType> walls(const Mesh& mesh, WallType outer, WallType cut_y0 = WallType::magnetic,
                                   WallType cut_x0 = WallType::electric) {
  std::vector<WallType> w;
  for (const auto& b : mesh.boundaries) {
    w.push_back(b.kind == BoundaryKind::symmetry_x ? cut_y0 : b.kind == BoundaryKind::symmetry_y ? cut_x0 : outer);
  }
  return w;
}

/// Six-hole silica microstructured fibre of White et al., JOSA B 19, 2322 (2002) (checks.md §3):
/// holes d = 5 µm on a hexagonal ring of pitch 6.75 µm, silica matrix n = 1.45, air holes.
/// Physical disk of radius `r_phys`, PML shell of thickness `t_pml`.
inline CrossSection six_hole_fibre(double r_phys, double t_pml, double h_core, double h_hole,
                                   double h_clad, SymmetryCut cut) {
  CrossSection s;
  s.background_material = "silica";
  s.outer.kind = OuterBoundary::Kind::disk;
  s.outer.radius = r_phys;
  s.outer.pml_thickness = t_pml;
  s.symmetry = cut;
  RegionSpec holes;
  holes.name = "holes";
  holes.material = "air";
  holes.shapes = hexagonal_lattice(6.75, 5.0, 1, true);
  holes.mesh_size = h_hole;
  holes.guiding = true;  // refine their interfaces
  holes.where = "six_hole_fibre";
  RegionSpec core;  // a silica disk inside the ring only to refine the core
  core.name = "core";
  core.material = "silica";
  core.shapes = {Shape{Disk{4.0}, {}}};
  core.mesh_size = h_core;
  core.where = "six_hole_fibre";
  s.regions = {core, holes};
  s.controls.order = 2;
  s.controls.default_size = h_clad;
  s.controls.interface_size = h_hole;
  s.controls.growth = 1.2;
  return s;
}

/// Weakly guiding step-index fibre (checks.md §2: n_co 1.4494, n_cl 1.4440, a = 4.1 µm).
inline CrossSection step_index_fibre(double radius, double r_phys, double t_pml, double h_core,
                                     double h_clad, SymmetryCut cut) {
  CrossSection s;
  s.background_material = "cladding";
  s.outer.kind = OuterBoundary::Kind::disk;
  s.outer.radius = r_phys;
  s.outer.pml_thickness = t_pml;
  s.symmetry = cut;
  RegionSpec core;
  core.name = "core";
  core.material = "core";
  core.shapes = {Shape{Disk{radius}, {}}};
  core.mesh_size = h_core;
  core.guiding = true;
  core.where = "step_index_fibre";
  s.regions = {core};
  s.controls.order = 2;
  s.controls.default_size = h_clad;
  s.controls.growth = 1.2;
  return s;
}

}  // namespace cladwise::testing
