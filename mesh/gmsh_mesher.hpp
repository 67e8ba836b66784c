// Cross-section -> conforming triangle mesh (Gmsh C++ SDK, OpenCASCADE kernel).
//
// Steps (mesh_cross_section):
//   1. validate(section): sizes, radii, polygons (InputError naming the region's `where`);
//   2. every shape becomes an OCC surface (disk; ellipse as an OCC disk rotated when its x
//      semi-axis is the shorter one; rectangle of lines and quarter-circle arcs; polygon; annulus =
//      disk − disk), placed by its Placement;
//   3. one boolean fragment of [domain, PML shell, symmetry half/quarter plane, all shapes] makes
//      every shared interface conforming; each fragment belongs to the LAST region covering it
//      (painting order), to the background if none does, and is dropped outside the domain + PML
//      or outside the kept half/quarter plane;
//   4. a region with no fragment inside the domain (entirely outside) or owning none (entirely
//      covered by later regions) is an InputError naming its `where`;
//   5. sizes: per region the constant region_mesh_size (cross_section.hpp) inside, growing linearly
//      away from its boundary by the ratio MeshControls::growth, starting from interface_size on
//      the boundary of guiding regions (when set); background and PML use background_mesh_size;
//      everything capped by max_size. Frontal-Delaunay (Mesh.Algorithm 6), one thread;
//   6. order 2: Gmsh setOrder(2) puts mid-edge nodes on the true circles and ellipses;
//   7. the mesh is read back into the Mesh contract (mesh.hpp) with build_topology.
//
// Regions in the Mesh, in this order: the background (CrossSection::background_name, material
// background_material), the section's regions in painting order, then the PML shell: "pml"
// (background material) and, where a region's shapes extend into the shell, "pml_<region name>"
// with that region's material (so a substrate or slab continues into the absorber), all with
// RegionRole::pml. A region left with no triangle (removed by a symmetry cut, or a fully covered
// background) is not listed. Boundaries: "outer" (outer edge of the domain, or of the PML when
// there is one), "cut_y0" (y = 0, BoundaryKind::symmetry_x), "cut_x0" (x = 0, symmetry_y).
//
// Thread safety: Gmsh is global state; each call opens a GmshSession, which serialises concurrent
// calls from different threads. Do not call from inside another open GmshSession.
#pragma once

#include <string>

#include "mesh/cross_section.hpp"
#include "mesh/mesh.hpp"
#include "mesh/mesh_quality.hpp"

namespace cladwise {

/// Meshes `section`. When `report` is given it is filled (areas, counts, quality, seconds). When
/// `msh_path` is not empty the Gmsh model and mesh are also written there (.msh, format 4.1).
/// Throws InputError for bad geometry, ComputationError when Gmsh fails.
Mesh mesh_cross_section(const CrossSection& section, MeshReport* report = nullptr,
                        const std::string& msh_path = "");

/// Writes a plain Mesh as a Gmsh .msh file: one physical surface per region (its name), one
/// physical curve per boundary. Throws ComputationError when the file cannot be written.
void write_msh(const Mesh& mesh, const std::string& path);

}  // namespace cladwise
