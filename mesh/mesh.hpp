// The plain in-memory mesh handed from mesh/ to solver/ (no Gmsh types cross this boundary).
//
// Conventions (docs/conventions.md):
//   * nodes are 0-based; the corner vertices of all triangles are nodes [0, n_vertices), the
//     mid-edge nodes of order-2 meshes follow them, so linear nodal DOFs are simply vertex indices;
//   * a triangle lists its corner vertices counter-clockwise (positive Jacobian), then, for order 2,
//     the nodes on local edges 0 = (v0,v1), 1 = (v1,v2), 2 = (v2,v0) (Gmsh's 6-node ordering);
//     order-2 mid-edge nodes lie on the true curved boundary (isoparametric elements);
//   * every undirected edge appears once in `edges`, oriented from the lower to the higher global
//     vertex index; `triangle_edges[t][k]` is the global edge of local edge k and
//     `triangle_edge_signs[t][k]` is +1 when the local direction (v_k -> v_{k+1}) agrees with it;
//   * each triangle carries a region index; a region names its material and its role;
//   * boundary edges carry the index of a named boundary (outer wall, symmetry cuts).
#pragma once

#include <array>
#include <cstdint>
#include <string>
#include <vector>

namespace cladwise {

using Point2 = std::array<double, 2>;

/// What a region is for. PML regions are the absorbing shell reserved by the mesher.
enum class RegionRole : std::uint8_t { physical, pml };

struct Region {
  std::string name;      ///< region name from the case (or physical-group name)
  std::string material;  ///< material name the solver resolves
  RegionRole role = RegionRole::physical;
};

/// What kind of line a boundary is. Symmetry cuts lie on the coordinate axes.
enum class BoundaryKind : std::uint8_t {
  outer,        ///< outer boundary of the computational domain
  symmetry_x,   ///< cut along the x axis (the line y = 0)
  symmetry_y,   ///< cut along the y axis (the line x = 0)
};

struct Boundary {
  std::string name;  ///< "outer", "cut_y0" (y = 0) or "cut_x0" (x = 0)
  BoundaryKind kind = BoundaryKind::outer;
};

struct Mesh {
  int order = 1;                                ///< geometric/element order: 1 (3-node) or 2 (6-node)
  int n_vertices = 0;                           ///< corner vertices: nodes [0, n_vertices)
  std::vector<Point2> nodes;                    ///< coordinates in micrometres
  std::vector<std::array<int, 6>> triangles;    ///< corners (CCW), then mid-edge nodes (order 2; else -1)
  std::vector<int> triangle_region;             ///< index into `regions`, one per triangle
  std::vector<Region> regions;

  std::vector<std::array<int, 2>> edges;        ///< unique edges, (low vertex, high vertex)
  std::vector<int> edge_midnode;                ///< order 2: mid-edge node of each edge; else -1
  std::vector<std::array<int, 3>> triangle_edges;
  std::vector<std::array<std::int8_t, 3>> triangle_edge_signs;

  std::vector<int> boundary_edges;              ///< indices into `edges` that lie on a boundary
  std::vector<int> boundary_edge_tag;           ///< index into `boundaries`, one per boundary edge
  std::vector<Boundary> boundaries;

  int n_nodes() const { return static_cast<int>(nodes.size()); }
  int n_triangles() const { return static_cast<int>(triangles.size()); }
  int n_edges() const { return static_cast<int>(edges.size()); }
  int nodes_per_triangle() const { return order == 2 ? 6 : 3; }
};

/// Fills edges, edge_midnode, triangle_edges and triangle_edge_signs from nodes/triangles, and
/// boundary_edges/boundary_edge_tag from a list of tagged boundary segments given as vertex pairs.
/// One hash pass over the triangles; no searches in later loops. Throws ComputationError if a
/// segment is not an edge of the mesh or an edge has more than two triangles.
void build_topology(Mesh& mesh, const std::vector<std::array<int, 2>>& boundary_segments = {},
                    const std::vector<int>& boundary_segment_tags = {});

}  // namespace cladwise
