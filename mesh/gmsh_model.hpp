// Internal to mesh/: the steps shared by mesh_cross_section and the external-geometry path, on
// the current Gmsh model of an open GmshSession. Plain types only (entity tags as ints), so this
// header does not include gmsh.h either.
#pragma once

#include <functional>
#include <string>
#include <vector>

#include "mesh/mesh.hpp"

namespace cladwise::detail {

/// One zone of constant target size: its surfaces, and the curves bounding it from where the size
/// grows linearly outward, h(d) = boundary_size + (growth − 1)·d (d = distance to the curves).
/// That is the size of a mesh whose neighbouring elements grow by the ratio `growth`.
struct SizeZone {
  std::vector<int> surfaces;
  double size = 0;
  std::vector<int> boundary_curves;
  double boundary_size = 0;
};

/// Meshing options common to all paths: Frontal-Delaunay (Mesh.Algorithm = 6), one thread,
/// sizes from the background field only (no extension from points, boundary or curvature).
void set_mesh_options(int order);

/// Builds the size fields: per zone Restrict(MathEval(size), surfaces) and MathEval(boundary_size
/// + (growth − 1)·Distance(curves)), all combined by a Min field set as background mesh; the cap
/// max_size (> 0) goes to Mesh.MeshSizeMax.
void apply_size_zones(const std::vector<SizeZone>& zones, double growth, double max_size);

/// generate(2), then setOrder(order); checks that every surface got triangles.
void generate_mesh(int order);

/// What a 2-D physical group means: the Region it becomes. Throws InputError for a group that
/// cannot be mapped (external geometry with no material for it).
using RegionOfGroup = std::function<Region(const std::string& group_name)>;

/// Reads the current model's mesh into the plain Mesh contract: 2-D physical groups become regions
/// (in ascending group tag order), 1-D groups named "outer", "cut_x0", "cut_y0" become boundaries.
/// Boundary edges in none of those groups are tagged "outer". Corner vertices first, then mid-edge
/// nodes, compactly renumbered; triangles made counter-clockwise. `source` names the model (file
/// or "cross-section") in error messages.
Mesh extract_mesh(int order, const RegionOfGroup& region_of, const std::string& source);

/// Boundary kind of a boundary name ("outer", "cut_y0", "cut_x0").
BoundaryKind boundary_kind(const std::string& name);

}  // namespace cladwise::detail
