// Writing meshes and fields as VTK XML unstructured grids (.vtu) and collections (.pvd) through
// VTK's own XML writers, for ParaView-compatible viewers. Order-2 meshes are written as quadratic
// triangles (VTK_QUADRATIC_TRIANGLE: corners then mid-edge nodes 01, 12, 20 — Gmsh's order, which
// is also VTK's).
#pragma once

#include <filesystem>
#include <string>
#include <vector>

#include "mesh/mesh.hpp"

namespace cladwise::io {

/// One data array: `components` values per mesh node (point data) or per triangle (cell data).
struct VtkArray {
  std::string name;
  int components = 1;
  std::vector<double> values;
  bool per_cell = false;
};

/// Writes mesh + arrays to `path` (.vtu, binary appended, zlib-compressed). Cell data "region"
/// (the region index) is always written. Throws ComputationError if the file cannot be written.
void write_vtu(const Mesh& mesh, const std::vector<VtkArray>& arrays,
               const std::filesystem::path& path);

/// A ParaView collection file listing datasets with a time/series value each.
struct PvdEntry {
  double value = 0;
  std::filesystem::path file;  ///< relative to the .pvd file
};
void write_pvd(const std::vector<PvdEntry>& entries, const std::filesystem::path& path);

}  // namespace cladwise::io
