// The geometric description of a waveguide cross-section, in plain standard types: primitive
// shapes placed in the plane, grouped into ordered regions that are painted over one another
// (a later region replaces whatever earlier regions covered), inside an outer boundary with an
// optional absorbing shell reserved for a perfectly matched layer. Lengths in micrometres.
//
// mesh/ knows materials only as names; the solver resolves them.
#pragma once

#include <optional>
#include <string>
#include <variant>
#include <vector>

#include "mesh/mesh.hpp"

namespace cladwise {

// ---- primitive shapes, each in its own local frame (centred on the local origin) -------------
struct Disk {
  double radius = 0;
};
struct Ellipse {
  double semi_axis_x = 0;  ///< semi-axis along local x
  double semi_axis_y = 0;  ///< semi-axis along local y
};
struct Rectangle {
  double width = 0;          ///< along local x
  double height = 0;         ///< along local y
  double corner_radius = 0;  ///< 0: sharp corners; must be <= min(width, height)/2
};
struct Polygon {
  std::vector<Point2> vertices;  ///< simple (non-self-intersecting), either orientation
};
struct Annulus {
  double inner_radius = 0;
  double outer_radius = 0;
};
using ShapeGeometry = std::variant<Disk, Ellipse, Rectangle, Polygon, Annulus>;

/// Rigid placement: x_global = R(rotation_deg) · x_local + offset (rotation counter-clockwise).
struct Placement {
  Point2 offset{0.0, 0.0};
  double rotation_deg = 0.0;
};
/// outer ∘ inner: first place by `inner`, then by `outer`.
Placement compose(const Placement& outer, const Placement& inner);
Point2 apply(const Placement& p, const Point2& local);

struct Shape {
  ShapeGeometry geometry;
  Placement placement;
};

/// Exact area of one shape (for checks and for `cladwise check`).
double exact_area(const ShapeGeometry& g);

// ---- generators for specialty fibres and integrated guides ----------------------------------
/// Holes of diameter `hole_diameter` on a hexagonal (triangular) lattice of pitch `pitch` with
/// `rings` rings around the centre: 1 + 3·rings·(rings+1) sites, minus the centre if `skip_centre`.
std::vector<Shape> hexagonal_lattice(double pitch, double hole_diameter, int rings, bool skip_centre);
/// `count` disk cores of radius `core_radius` equally spaced on a circle whose chord between
/// neighbours is `pitch`; `with_centre` adds one more core at the origin (e.g. the 7-core fibre).
std::vector<Shape> core_ring(int count, double pitch, double core_radius, bool with_centre);
/// An nx × ny square array of disk cores of radius `core_radius` at pitch `pitch`, centred.
std::vector<Shape> core_square_array(int nx, int ny, double pitch, double core_radius);
/// Two stress rods of radius `rod_radius` centred at (±offset, 0) in the local frame.
std::vector<Shape> stress_rod_pair(double offset, double rod_radius);

// ---- regions and the whole cross-section ---------------------------------------------------
struct RegionSpec {
  std::string name;              ///< unique; used for tags, reports and error messages
  std::string material;          ///< material name
  std::vector<Shape> shapes;     ///< union of these shapes (already placed)
  double mesh_size = 0;          ///< target element size inside, µm; 0: use the global default
  bool guiding = false;          ///< refine inside and on its interfaces (cores, rib)
  std::string where;             ///< where it was declared, e.g. "case.toml:14 (regions[2])"
};

struct OuterBoundary {
  enum class Kind { disk, rectangle } kind = Kind::disk;
  double radius = 0;             ///< disk: radius of the physical domain
  double width = 0, height = 0;  ///< rectangle: full sizes of the physical domain
  Point2 centre{0.0, 0.0};
  double pml_thickness = 0;      ///< > 0: an absorbing shell of this thickness outside the domain
  std::string where;
};

/// Mirror-symmetry cut: keep only part of the domain; the cut lines become tagged boundaries.
enum class SymmetryCut { none, half_upper /* y >= 0 */, half_right /* x >= 0 */, quarter /* x,y >= 0 */ };

struct MeshControls {
  int order = 2;                 ///< 1: straight 3-node; 2: curved 6-node triangles
  double default_size = 0;       ///< element size where no region sets one, µm; 0: automatic
  double max_size = 0;           ///< global cap, µm; 0: none beyond the default
  double interface_size = 0;     ///< size on interfaces of guiding regions; 0: that region's size
  double growth = 1.3;           ///< ratio by which neighbouring element sizes may grow outward
};

struct CrossSection {
  std::string background_material;   ///< fills the domain under all regions (e.g. the cladding)
  std::string background_name = "background";
  OuterBoundary outer;
  std::vector<RegionSpec> regions;   ///< painted in order; later regions win
  SymmetryCut symmetry = SymmetryCut::none;
  MeshControls controls;
};

}  // namespace cladwise

// ---- validation and size defaults (appended; implemented in mesh/cross_section.cpp) --------
namespace cladwise {

/// Checks every size, radius and polygon of `section` before any meshing: positive sizes,
/// 0 <= corner_radius <= min(width, height)/2, inner < outer radius, polygons simple (pairwise
/// segment intersection tests), unique non-empty region names and materials, order 1 or 2,
/// growth >= 1. Throws InputError naming the region's `where` (or the outer boundary's) and the key.
void validate(const CrossSection& section);

/// Characteristic half-size of one shape: disk radius, smaller ellipse semi-axis, half the smaller
/// rectangle side, half the annulus wall, half the smaller side of a polygon's bounding box.
/// The automatic element size of a region is derived from it (see docs in gmsh_mesher.hpp).
double feature_length(const ShapeGeometry& g);

/// Element size the mesher uses inside region `index` of `section` (after defaults are applied):
/// RegionSpec::mesh_size when > 0; otherwise the smallest feature_length of its shapes divided by
/// 6 for guiding regions and by 4 for the others, capped by MeshControls::default_size when that
/// is > 0. Either way capped by MeshControls::max_size when that is > 0.
double region_mesh_size(const CrossSection& section, std::size_t index);

/// Element size of the background (and of the PML shell): MeshControls::default_size when > 0,
/// else a tenth of the domain's half-size (disk radius / 10, min(width, height) / 20); capped by
/// max_size.
double background_mesh_size(const CrossSection& section);

/// Exact area of the physical domain after the symmetry cut (no PML): π R² or W·H, divided by 2
/// for a half cut and by 4 for a quarter cut (a cut assumes the domain is centred on the axes).
double domain_area(const CrossSection& section);

}  // namespace cladwise
