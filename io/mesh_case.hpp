// The mesh of a case: the cross-section from [domain]/[[region]] through the Gmsh mesher, or the
// geometry file of [import]. Shared by `check` and `solve`.
#pragma once

#include "io/case_file.hpp"
#include "mesh/mesh.hpp"
#include "mesh/mesh_quality.hpp"

namespace cladwise::io {

Mesh mesh_case(const CaseSpec& c, MeshReport* report = nullptr);

}  // namespace cladwise::io
