// Edge topology of a triangle mesh: unique globally oriented edges (low -> high vertex), built in
// one pass with a hash map so that the solver's hot loops never search.
#include "mesh/mesh.hpp"

#include <cassert>
#include <cstdint>
#include <string>
#include <unordered_map>

#include "mesh/error.hpp"

namespace cladwise {
namespace {

std::uint64_t edge_key(int a, int b) {
  const auto lo = static_cast<std::uint64_t>(a < b ? a : b);
  const auto hi = static_cast<std::uint64_t>(a < b ? b : a);
  return (lo << 32) | hi;
}

}  // namespace

void build_topology(Mesh& mesh, const std::vector<std::array<int, 2>>& boundary_segments,
                    const std::vector<int>& boundary_segment_tags) {
  assert(boundary_segments.size() == boundary_segment_tags.size());
  const int n_tri = mesh.n_triangles();
  mesh.edges.clear();
  mesh.edge_midnode.clear();
  mesh.triangle_edges.assign(n_tri, {-1, -1, -1});
  mesh.triangle_edge_signs.assign(n_tri, {0, 0, 0});
  std::unordered_map<std::uint64_t, int> index;
  index.reserve(static_cast<std::size_t>(n_tri) * 2);
  std::vector<int> edge_triangle_count;
  edge_triangle_count.reserve(static_cast<std::size_t>(n_tri) * 2);

  for (int t = 0; t < n_tri; ++t) {
    const auto& tri = mesh.triangles[t];
    for (int k = 0; k < 3; ++k) {
      const int a = tri[k];
      const int b = tri[(k + 1) % 3];
      auto [it, inserted] = index.try_emplace(edge_key(a, b), mesh.n_edges());
      if (inserted) {
        mesh.edges.push_back({a < b ? a : b, a < b ? b : a});
        mesh.edge_midnode.push_back(mesh.order == 2 ? tri[3 + k] : -1);
        edge_triangle_count.push_back(0);
      }
      const int e = it->second;
      if (++edge_triangle_count[e] > 2) {
        throw ComputationError("mesh is not conforming: edge (" + std::to_string(a) + ", " +
                               std::to_string(b) + ") is shared by more than two triangles");
      }
      mesh.triangle_edges[t][k] = e;
      mesh.triangle_edge_signs[t][k] = static_cast<std::int8_t>(a < b ? 1 : -1);
    }
  }

  mesh.boundary_edges.clear();
  mesh.boundary_edge_tag.clear();
  for (std::size_t s = 0; s < boundary_segments.size(); ++s) {
    const auto it = index.find(edge_key(boundary_segments[s][0], boundary_segments[s][1]));
    if (it == index.end()) {
      throw ComputationError("boundary segment (" + std::to_string(boundary_segments[s][0]) + ", " +
                             std::to_string(boundary_segments[s][1]) +
                             ") is not an edge of the mesh");
    }
    mesh.boundary_edges.push_back(it->second);
    mesh.boundary_edge_tag.push_back(boundary_segment_tags[s]);
  }
}

}  // namespace cladwise
