#include "io/mesh_case.hpp"

#include "mesh/error.hpp"
#include "mesh/gmsh_mesher.hpp"

namespace cladwise::io {

Mesh mesh_case(const CaseSpec& c, MeshReport* report) {
  if (c.import) {
    throw InputError(c.import->where, "[import] is not supported by this build yet");
  }
  return mesh_cross_section(c.geometry, report);
}

}  // namespace cladwise::io
