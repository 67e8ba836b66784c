// Cross-sections drawn elsewhere: a Gmsh .geo script, a STEP or BREP file (meshed here with the
// same size controls as mesh_cross_section), or a ready .msh mesh (imported as it is).
//
// Meaning is carried by names:
//   * each 2-D physical group is a region; `materials` maps its name to a material name. A group
//     whose name begins with "pml" is an absorbing region (RegionRole::pml);
//   * 1-D physical groups named "outer", "cut_x0" (x = 0) and "cut_y0" (y = 0) are boundaries;
//     boundary edges in none of them are tagged "outer";
//   * STEP/BREP files carry no physical groups: every surface becomes a group named after its
//     entity name when the file has one (last component of the label path), else "surface_<n>"
//     (n = the Gmsh surface tag after import). Their surfaces are fragmented so that touching faces
//     share conforming interfaces.
// A surface group with no entry in `materials` is an InputError naming the group and the file.
// Mesh sizes of a .geo file's own points are ignored: the controls below decide.
#pragma once

#include <map>
#include <set>
#include <string>

#include "mesh/cross_section.hpp"
#include "mesh/mesh.hpp"
#include "mesh/mesh_quality.hpp"

namespace cladwise {

struct ExternalGeometry {
  std::string path;                              ///< .geo, .step/.stp, .brep/.brp
  std::map<std::string, std::string> materials;  ///< surface group name -> material
  std::map<std::string, double> sizes;           ///< surface group name -> element size, µm
  std::set<std::string> guiding;                 ///< groups whose interfaces use interface_size
  MeshControls controls;                         ///< default_size 0: bounding-box half-size / 10
};

/// Loads and meshes an external geometry. InputError: missing file, unknown extension, a group
/// without material. ComputationError: Gmsh failed.
Mesh mesh_external_geometry(const ExternalGeometry& geometry, MeshReport* report = nullptr,
                            const std::string& msh_path = "");

/// Imports a ready Gmsh .msh file (3-node or 6-node triangles; order detected) without remeshing.
Mesh import_msh(const std::string& path, const std::map<std::string, std::string>& materials,
                MeshReport* report = nullptr);

}  // namespace cladwise
