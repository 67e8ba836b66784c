#include "io/mesh_case.hpp"

#include "mesh/error.hpp"
#include "mesh/external_geometry.hpp"
#include "mesh/gmsh_mesher.hpp"

namespace cladwise::io {

Mesh mesh_case(const CaseSpec& c, MeshReport* report) {
  if (!c.import) return mesh_cross_section(c.geometry, report);
  const auto& imp = *c.import;
  const std::string ext = imp.path.extension().string();
  if (ext == ".msh") return import_msh(imp.path.string(), imp.group_materials, report);
  ExternalGeometry g;
  g.path = imp.path.string();
  g.materials = imp.group_materials;
  g.controls = c.geometry.controls;
  return mesh_external_geometry(g, report);
}

}  // namespace cladwise::io
