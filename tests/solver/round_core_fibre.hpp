// Test helper: the round step-index core (radius 4.1 µm, the weakly guiding fibre of
// docs/verification.md) in a disk with an electric outer wall, meshed at order 2, and its lossless
// mode problem. Shared by the FEM tests that compare against the exact step-index module.
#pragma once

#include <vector>

#include "mesh/gmsh_mesher.hpp"
#include "solver/material.hpp"
#include "solver/mode_solver.hpp"

namespace cladwise::testing {

/// Core "core" of radius `core_radius` (µm) in "cladding" out to `wall` (µm); element size 0.5 µm
/// in the core and on its interface, `clad_size` elsewhere.
inline CrossSection round_core_section(double wall, double core_radius = 4.1, double clad_size = 2.5) {
  CrossSection s;
  s.background_material = "cladding";
  s.outer.radius = wall;
  RegionSpec core;
  core.name = "core";
  core.material = "core";
  core.shapes = {Shape{Disk{core_radius}, {}}};
  core.mesh_size = 0.5;
  core.guiding = true;
  s.regions = {core};
  s.controls.order = 2;
  s.controls.default_size = clad_size;
  return s;
}

/// Lossless problem on a round_core_section mesh: region 0 cladding, region 1 core, every
/// boundary an electric wall.
inline ModeProblem round_core_problem(const Mesh& mesh, double wavelength_um, double n_clad, double n_core) {
  ModeProblem p;
  p.mesh = &mesh;
  p.region_materials = {isotropic_material(n_clad, "cladding"), isotropic_material(n_core, "core")};
  p.wavelength_um = wavelength_um;
  p.order = 2;
  p.boundary_walls.assign(mesh.boundaries.size(), WallType::electric);
  return p;
}

}  // namespace cladwise::testing
