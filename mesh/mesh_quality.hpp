// Mesh quality and measured areas of a plain Mesh (no Gmsh types): what MeshReport prints and
// what the tests compare with exact areas.
//
// Quality measure: the radius ratio q = 2 r_in / R_circ = 16 A² / (a b c (a + b + c)) of the
// straight triangle through the three corner vertices (q = 1 for an equilateral triangle, -> 0 for
// a degenerate one). For order-2 meshes the report also gives the smallest ratio of the curved
// map's Jacobian determinant (at the corners and edge midpoints) to the straight one: it must stay
// > 0 (no inverted curved triangle) and is close to 1 away from strongly curved interfaces.
#pragma once

#include <string>
#include <vector>

#include "mesh/mesh.hpp"

namespace cladwise {

struct RegionReport {
  std::string name;
  std::string material;
  RegionRole role = RegionRole::physical;
  double area = 0;             ///< µm², integrated over the (curved, for order 2) triangles
  int n_triangles = 0;
  double min_quality = 0;      ///< smallest radius ratio (0 if the region has no triangle)
  double mean_quality = 0;
};

struct MeshReport {
  std::vector<RegionReport> regions;  ///< one per Mesh::regions entry, same order
  int n_triangles = 0;
  int n_nodes = 0;
  int n_vertices = 0;
  int order = 1;
  double min_quality = 0;             ///< radius ratio, over all triangles
  double mean_quality = 0;
  double min_jacobian_ratio = 1;      ///< order 2: min det J(curved) / det J(straight); 1 for order 1
  double seconds = 0;                 ///< wall time of geometry + meshing + extraction
  std::string quality_measure = "radius ratio 2 r_in / R_circ";
};

/// Area of triangle t. Order 1: |corner cross product| / 2. Order 2: ∫ det J over the reference
/// triangle of the 6-node isoparametric map; det J is a quadratic polynomial, so the 3-point
/// edge-midpoint rule (exact for degree 2) integrates it exactly.
double triangle_area(const Mesh& mesh, int t);

/// Radius ratio of the straight triangle through the corners of t.
double radius_ratio(const Mesh& mesh, int t);

/// Smallest det J(curved) / det J(straight) of triangle t at its corners and edge midpoints
/// (1 for order 1 and for straight-sided order-2 triangles).
double jacobian_ratio(const Mesh& mesh, int t);

/// Sum of triangle_area per region, indexed like mesh.regions.
std::vector<double> region_areas(const Mesh& mesh);

/// Fills everything in MeshReport except `seconds`.
MeshReport summarize(const Mesh& mesh);

}  // namespace cladwise
