// MeshLocator: which triangle of a Mesh holds a physical point, and at which reference
// coordinates. Used to evaluate a mode at points that are not its own quadrature points: field
// cuts (1/e² widths), circles for mode labels, and overlaps between modes of two different meshes.
//
// Method: a uniform grid of square buckets over the mesh's bounding box, about one triangle per
// bucket on average; each triangle is listed in every bucket its (slightly enlarged) bounding box
// touches. A query visits the triangles of one bucket only and inverts the element map x(ξ) by
// Newton's method (one step for straight triangles; a few for curved 6-node ones). Building is
// O(n_triangles); a query is O(1) on meshes of bounded grading, with no linear searches.
#pragma once

#include <Eigen/Core>

#include <optional>
#include <vector>

#include "mesh/mesh.hpp"

namespace cladwise {

/// A located point: triangle index and reference coordinates (ξ, η) in it.
struct MeshPoint {
  int triangle = -1;
  Eigen::Vector2d xi = Eigen::Vector2d::Zero();
};

class MeshLocator {
public:
  /// The mesh must outlive the locator. `buckets_per_triangle` tunes the grid density.
  explicit MeshLocator(const Mesh& mesh, double buckets_per_triangle = 1.0);

  /// The triangle containing x (µm), or nothing outside the mesh. On a shared edge either
  /// neighbour may be returned (fields that are continuous there agree; E_n may jump).
  std::optional<MeshPoint> locate(const Point2& x) const;

  const Mesh& mesh() const { return *mesh_; }
  Point2 lower_corner() const { return {x0_, y0_}; }  ///< bounding box of the mesh (µm)
  Point2 upper_corner() const { return {x1_, y1_}; }

private:
  const Mesh* mesh_;
  double x0_ = 0, y0_ = 0, x1_ = 0, y1_ = 0, cell_ = 1;
  int nx_ = 1, ny_ = 1;
  std::vector<int> start_;      // CSR offsets, one per bucket + 1
  std::vector<int> triangles_;  // triangle indices by bucket
  bool inside(int t, const Eigen::Vector2d& x, Eigen::Vector2d& xi) const;
};

}  // namespace cladwise
