// Cross-sections of the leaky/lossy-mode tests and benchmarks (tests/solver/test_pml_*,
// test_complex_*, test_bend_*, tests/benchmark/bench_leaky.cpp), built with the Gmsh mesher.
#pragma once

#include <cmath>
#include <map>
#include <numbers>
#include <string>
#include <vector>

#include "mesh/cross_section.hpp"
#include "mesh/gmsh_mesher.hpp"
#include "solver/complex_mode_solver.hpp"
#include "solver/step_index.hpp"

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

/// Curvature loss of LP01 in the step-profile form of Snyder & Love ("Optical Waveguide Theory",
/// ch. 23; from memory, checks.md §5), equivalent under weak guidance to Marcuse's formula
/// (D. Marcuse, JOSA 66, 216 (1976)) and the form the checks.md §5 table is computed from:
///   γ_b = (√π/2) (1/ρ) (ρ/R)^{1/2} U² / (V² W^{3/2} K₁²(W)) exp[−(4/3)(R/ρ) Δ W³/V²]
/// (power attenuation coefficient, 1/µm). Returns dB/m; R in µm.
inline double marcuse_loss_db_per_m(const StepIndexFibre& f, double radius_um) {
  const auto lp = solve_lp_modes(f);
  const double rho = f.radius_um, u = lp.at(0).u, w = lp.at(0).w, v = f.v_number();
  const double delta = f.relative_index_difference();
  const double k1 = std::cyl_bessel_k(1.0, w);
  const double gamma_b = std::sqrt(std::numbers::pi) / 2.0 / rho * std::sqrt(rho / radius_um) * u * u /
                         (v * v * std::pow(w, 1.5) * k1 * k1) *
                         std::exp(-4.0 / 3.0 * (radius_um / rho) * delta * w * w * w / (v * v));
  return 10.0 / std::log(10.0) * gamma_b * 1e6;  // power coefficient 1/µm -> dB/m
}

/// Bend loss of the weakly guiding fibre (checks.md §5) by the exact bend transformation on a
/// half domain (y >= 0, magnetic wall on y = 0: the x-polarised mode) with a cylindrical PML.
inline LeakyMode bent_fibre_mode(double bend_radius_um, double r_phys, double t_pml, double strength,
                                 double h_core, double h_clad, BendModel model, int* n_dofs = nullptr) {
  const Mesh mesh = mesh_cross_section(step_index_fibre(4.1, r_phys, t_pml, h_core, h_clad, SymmetryCut::half_upper));
  LeakyModeProblem p;
  p.mesh = &mesh;
  p.region_materials = materials_by_name(
      mesh, {{"core", complex_index_material(1.4494, 0.0)}, {"cladding", complex_index_material(1.4440, 0.0)}});
  p.wavelength_um = 1.55;
  p.order = 2;
  p.boundary_walls = walls(mesh, WallType::electric, WallType::magnetic, WallType::electric);
  Pml pml;
  pml.inner_radius = r_phys;
  pml.thickness = t_pml;
  pml.strength = strength;
  p.pml = pml;
  Bend bend;
  bend.radius_um = bend_radius_um;
  bend.model = model;
  p.bend = bend;
  ComplexModeSolver s(p);
  LeakySolveRequest q;
  q.n_modes = 1;
  q.n_target = 1.4464;  // near the straight fibre's LP01 (1.44638): the outer side of a tight bend
                        // also holds whispering-gallery modes of higher Re n_eff
  const LeakySolveResult r = s.solve(q);
  if (n_dofs) *n_dofs = r.n_dofs;
  return r.modes.empty() ? LeakyMode{} : r.modes[0];
}

}  // namespace cladwise::testing
