// Cross-section description: placements, exact shape areas, validation, automatic sizes and the
// generators for specialty fibres (hexagonal lattices of holes, multicore layouts, stress rods).
#include "mesh/cross_section.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numbers>
#include <set>
#include <sstream>
#include <string>

#include "mesh/error.hpp"

namespace cladwise {
namespace {

constexpr double pi = std::numbers::pi;

std::string fmt(double v) {
  std::ostringstream s;
  s.precision(12);
  s << v;
  return s.str();
}

// ---- segment intersection (orientation predicates; exact enough for user-sized polygons) ----
double orient(const Point2& a, const Point2& b, const Point2& c) {
  return (b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0]);
}

bool on_segment(const Point2& a, const Point2& b, const Point2& p, double tol) {
  return std::min(a[0], b[0]) - tol <= p[0] && p[0] <= std::max(a[0], b[0]) + tol &&
         std::min(a[1], b[1]) - tol <= p[1] && p[1] <= std::max(a[1], b[1]) + tol;
}

// True when closed segments [a,b] and [c,d] share a point. `tol` scales the collinearity test.
bool segments_intersect(const Point2& a, const Point2& b, const Point2& c, const Point2& d,
                        double tol) {
  const double d1 = orient(c, d, a), d2 = orient(c, d, b);
  const double d3 = orient(a, b, c), d4 = orient(a, b, d);
  const double eps = tol * tol;
  if (((d1 > eps && d2 < -eps) || (d1 < -eps && d2 > eps)) &&
      ((d3 > eps && d4 < -eps) || (d3 < -eps && d4 > eps))) {
    return true;
  }
  if (std::abs(d1) <= eps && on_segment(c, d, a, tol)) return true;
  if (std::abs(d2) <= eps && on_segment(c, d, b, tol)) return true;
  if (std::abs(d3) <= eps && on_segment(a, b, c, tol)) return true;
  if (std::abs(d4) <= eps && on_segment(a, b, d, tol)) return true;
  return false;
}

double polygon_signed_area(const std::vector<Point2>& v) {
  double s = 0;  // shoelace formula
  for (std::size_t i = 0; i < v.size(); ++i) {
    const auto& p = v[i];
    const auto& q = v[(i + 1) % v.size()];
    s += p[0] * q[1] - q[0] * p[1];
  }
  return 0.5 * s;
}

void validate_polygon(const Polygon& poly, const std::string& where, const std::string& what) {
  const auto& v = poly.vertices;
  const std::size_t n = v.size();
  if (n < 3) {
    throw InputError(where, what + ": a polygon needs at least 3 vertices (got " +
                                std::to_string(n) + ")");
  }
  double extent = 0;
  for (const auto& p : v) extent = std::max({extent, std::abs(p[0]), std::abs(p[1])});
  const double tol = 1e-10 * std::max(extent, 1.0);
  for (std::size_t i = 0; i < n; ++i) {
    const auto& a = v[i];
    const auto& b = v[(i + 1) % n];
    if (std::hypot(b[0] - a[0], b[1] - a[1]) <= tol) {
      throw InputError(where, what + ": polygon vertices " + std::to_string(i) + " and " +
                                  std::to_string((i + 1) % n) +
                                  " coincide; remove the repeated vertex");
    }
  }
  // Non-adjacent edges must not touch; adjacent edges may only share their common vertex
  // (a fold-back of collinear adjacent edges is caught by the overlap test below).
  for (std::size_t i = 0; i < n; ++i) {
    const auto& a = v[i];
    const auto& b = v[(i + 1) % n];
    for (std::size_t j = i + 1; j < n; ++j) {
      const auto& c = v[j];
      const auto& d = v[(j + 1) % n];
      const bool adjacent = (j == i + 1) || (i == 0 && j == n - 1);
      if (!adjacent) {
        if (segments_intersect(a, b, c, d, tol)) {
          throw InputError(where, what + ": polygon is self-intersecting (edge " +
                                      std::to_string(i) + " meets edge " + std::to_string(j) +
                                      "); give the vertices of a simple polygon in order");
        }
        continue;
      }
      // Adjacent edges: shared vertex s, other ends p (of edge i) and q (of edge j).
      const Point2& s = (j == i + 1) ? b : a;
      const Point2& p = (j == i + 1) ? a : b;
      const Point2& q = (j == i + 1) ? d : c;
      const double cross = orient(s, p, q);
      const double dot = (p[0] - s[0]) * (q[0] - s[0]) + (p[1] - s[1]) * (q[1] - s[1]);
      if (std::abs(cross) <= tol * tol && dot > 0) {
        throw InputError(where, what + ": polygon edges " + std::to_string(i) + " and " +
                                    std::to_string(j) +
                                    " fold back onto each other (self-intersecting)");
      }
    }
  }
  if (std::abs(polygon_signed_area(v)) <= tol * tol) {
    throw InputError(where, what + ": polygon has zero area");
  }
}

void require_positive(double value, const std::string& where, const std::string& key) {
  if (!(value > 0) || !std::isfinite(value)) {
    throw InputError(where, key + " must be a positive length in µm (got " + fmt(value) + ")");
  }
}

void validate_shape(const Shape& shape, const std::string& where, const std::string& what) {
  std::visit(
      [&](const auto& g) {
        using T = std::decay_t<decltype(g)>;
        if constexpr (std::is_same_v<T, Disk>) {
          require_positive(g.radius, where, what + ": disk radius");
        } else if constexpr (std::is_same_v<T, Ellipse>) {
          require_positive(g.semi_axis_x, where, what + ": ellipse semi_axis_x");
          require_positive(g.semi_axis_y, where, what + ": ellipse semi_axis_y");
        } else if constexpr (std::is_same_v<T, Rectangle>) {
          require_positive(g.width, where, what + ": rectangle width");
          require_positive(g.height, where, what + ": rectangle height");
          if (g.corner_radius < 0 || !std::isfinite(g.corner_radius)) {
            throw InputError(where, what + ": rectangle corner_radius must be >= 0 (got " +
                                        fmt(g.corner_radius) + ")");
          }
          const double limit = 0.5 * std::min(g.width, g.height);
          if (g.corner_radius > limit * (1 + 1e-12)) {
            throw InputError(where, what + ": rectangle corner_radius " + fmt(g.corner_radius) +
                                        " is too large; it must be <= min(width, height)/2 = " +
                                        fmt(limit));
          }
        } else if constexpr (std::is_same_v<T, Polygon>) {
          validate_polygon(g, where, what);
        } else if constexpr (std::is_same_v<T, Annulus>) {
          require_positive(g.inner_radius, where, what + ": annulus inner_radius");
          require_positive(g.outer_radius, where, what + ": annulus outer_radius");
          if (g.inner_radius >= g.outer_radius) {
            throw InputError(where, what + ": annulus inner_radius " + fmt(g.inner_radius) +
                                        " must be smaller than outer_radius " +
                                        fmt(g.outer_radius));
          }
        }
      },
      shape.geometry);
  if (!std::isfinite(shape.placement.offset[0]) || !std::isfinite(shape.placement.offset[1]) ||
      !std::isfinite(shape.placement.rotation_deg)) {
    throw InputError(where, what + ": placement must be finite");
  }
}

std::string region_where(const RegionSpec& r, std::size_t index) {
  if (!r.where.empty()) return r.where;
  return "region '" + (r.name.empty() ? "#" + std::to_string(index) : r.name) + "'";
}

Shape disk_at(double radius, double x, double y) {
  return Shape{Disk{radius}, Placement{{x, y}, 0.0}};
}

double domain_half_size(const OuterBoundary& o) {
  return o.kind == OuterBoundary::Kind::disk ? o.radius : 0.5 * std::min(o.width, o.height);
}

}  // namespace

Placement compose(const Placement& outer, const Placement& inner) {
  // x = R_o (R_i x + o_i) + o_o = R(θ_o + θ_i) x + (R_o o_i + o_o)
  const Point2 o = apply(outer, inner.offset);
  return Placement{o, outer.rotation_deg + inner.rotation_deg};
}

Point2 apply(const Placement& p, const Point2& local) {
  const double t = p.rotation_deg * pi / 180.0;
  const double c = std::cos(t), s = std::sin(t);
  return {c * local[0] - s * local[1] + p.offset[0], s * local[0] + c * local[1] + p.offset[1]};
}

double exact_area(const ShapeGeometry& g) {
  return std::visit(
      [](const auto& s) -> double {
        using T = std::decay_t<decltype(s)>;
        if constexpr (std::is_same_v<T, Disk>) {
          return pi * s.radius * s.radius;
        } else if constexpr (std::is_same_v<T, Ellipse>) {
          return pi * s.semi_axis_x * s.semi_axis_y;
        } else if constexpr (std::is_same_v<T, Rectangle>) {
          // four quarter-disk corners replace four r×r squares: w h − (4 − π) r²
          return s.width * s.height - (4.0 - pi) * s.corner_radius * s.corner_radius;
        } else if constexpr (std::is_same_v<T, Polygon>) {
          return std::abs(polygon_signed_area(s.vertices));
        } else {
          return pi * (s.outer_radius * s.outer_radius - s.inner_radius * s.inner_radius);
        }
      },
      g);
}

double feature_length(const ShapeGeometry& g) {
  return std::visit(
      [](const auto& s) -> double {
        using T = std::decay_t<decltype(s)>;
        if constexpr (std::is_same_v<T, Disk>) {
          return s.radius;
        } else if constexpr (std::is_same_v<T, Ellipse>) {
          return std::min(s.semi_axis_x, s.semi_axis_y);
        } else if constexpr (std::is_same_v<T, Rectangle>) {
          return 0.5 * std::min(s.width, s.height);
        } else if constexpr (std::is_same_v<T, Polygon>) {
          double x0 = std::numeric_limits<double>::max(), x1 = -x0, y0 = x0, y1 = -x0;
          for (const auto& p : s.vertices) {
            x0 = std::min(x0, p[0]);
            x1 = std::max(x1, p[0]);
            y0 = std::min(y0, p[1]);
            y1 = std::max(y1, p[1]);
          }
          return s.vertices.empty() ? 0.0 : 0.5 * std::min(x1 - x0, y1 - y0);
        } else {
          return 0.5 * (s.outer_radius - s.inner_radius);
        }
      },
      g);
}

void validate(const CrossSection& section) {
  const auto& o = section.outer;
  const std::string owhere = o.where.empty() ? "outer boundary" : o.where;
  if (o.kind == OuterBoundary::Kind::disk) {
    require_positive(o.radius, owhere, "outer radius");
  } else {
    require_positive(o.width, owhere, "outer width");
    require_positive(o.height, owhere, "outer height");
  }
  if (o.pml_thickness < 0 || !std::isfinite(o.pml_thickness)) {
    throw InputError(owhere, "pml_thickness must be >= 0 (got " + fmt(o.pml_thickness) + ")");
  }
  const bool cut_y = section.symmetry == SymmetryCut::half_upper ||
                     section.symmetry == SymmetryCut::quarter;
  const bool cut_x = section.symmetry == SymmetryCut::half_right ||
                     section.symmetry == SymmetryCut::quarter;
  const double scale = 1e-12 * domain_half_size(o);
  if ((cut_y && std::abs(o.centre[1]) > scale) || (cut_x && std::abs(o.centre[0]) > scale)) {
    throw InputError(owhere, "a symmetry cut needs the outer boundary centred on the cut axis "
                             "(centre x = 0 for a cut at x = 0, centre y = 0 for a cut at y = 0)");
  }
  if (section.background_material.empty()) {
    throw InputError(owhere, "background_material is empty; name the cladding material");
  }
  const auto& c = section.controls;
  if (c.order != 1 && c.order != 2) {
    throw InputError("mesh controls", "order must be 1 or 2 (got " + std::to_string(c.order) + ")");
  }
  const std::pair<double, const char*> sizes[] = {
      {c.default_size, "default_size"}, {c.max_size, "max_size"},
      {c.interface_size, "interface_size"}};
  for (const auto& [v, key] : sizes) {
    if (v < 0 || !std::isfinite(v)) {
      throw InputError("mesh controls", std::string(key) + " must be >= 0 (0 = automatic; got " +
                                            fmt(v) + ")");
    }
  }
  if (!(c.growth >= 1.0) || !std::isfinite(c.growth)) {
    throw InputError("mesh controls", "growth must be >= 1 (got " + fmt(c.growth) + ")");
  }

  std::set<std::string> names{section.background_name};
  for (std::size_t i = 0; i < section.regions.size(); ++i) {
    const auto& r = section.regions[i];
    const std::string where = region_where(r, i);
    if (r.name.empty()) throw InputError(where, "region name is empty; give each region a name");
    if (r.name.rfind("pml", 0) == 0) {
      throw InputError(where, "region name '" + r.name +
                                  "' begins with 'pml', which is reserved for the absorbing shell");
    }
    if (!names.insert(r.name).second) {
      throw InputError(where, "region name '" + r.name +
                                  "' is used twice (or equals the background name); names must be "
                                  "unique");
    }
    if (r.material.empty()) throw InputError(where, "region '" + r.name + "' has no material");
    if (r.shapes.empty()) throw InputError(where, "region '" + r.name + "' has no shapes");
    if (r.mesh_size < 0 || !std::isfinite(r.mesh_size)) {
      throw InputError(where, "mesh_size must be >= 0 (0 = automatic; got " + fmt(r.mesh_size) +
                                  ")");
    }
    for (std::size_t s = 0; s < r.shapes.size(); ++s) {
      validate_shape(r.shapes[s], where, "shape " + std::to_string(s));
    }
  }
}

double region_mesh_size(const CrossSection& section, std::size_t index) {
  const auto& r = section.regions.at(index);
  const auto& c = section.controls;
  double h = r.mesh_size;
  if (!(h > 0)) {
    double feature = std::numeric_limits<double>::max();
    for (const auto& s : r.shapes) feature = std::min(feature, feature_length(s.geometry));
    // about 2π·6 ≈ 38 segments around a guiding disk, 25 around any other (order-2 geometry makes
    // the boundary exact to O(h^4) in area, so these suffice for effective indices ~1e-6)
    h = feature / (r.guiding ? 6.0 : 4.0);
    if (c.default_size > 0) h = std::min(h, c.default_size);
  }
  if (c.max_size > 0) h = std::min(h, c.max_size);
  return h;
}

double background_mesh_size(const CrossSection& section) {
  const auto& c = section.controls;
  double h = c.default_size > 0 ? c.default_size : domain_half_size(section.outer) / 10.0;
  if (c.max_size > 0) h = std::min(h, c.max_size);
  return h;
}

double domain_area(const CrossSection& section) {
  const auto& o = section.outer;
  double a = o.kind == OuterBoundary::Kind::disk ? pi * o.radius * o.radius : o.width * o.height;
  switch (section.symmetry) {
    case SymmetryCut::none: break;
    case SymmetryCut::half_upper:
    case SymmetryCut::half_right: a /= 2; break;
    case SymmetryCut::quarter: a /= 4; break;
  }
  return a;
}

// ---- generators -----------------------------------------------------------------------------
std::vector<Shape> hexagonal_lattice(double pitch, double hole_diameter, int rings,
                                     bool skip_centre) {
  require_positive(pitch, "hexagonal_lattice", "pitch");
  require_positive(hole_diameter, "hexagonal_lattice", "hole_diameter");
  if (rings < 0) throw InputError("hexagonal_lattice", "rings must be >= 0");
  if (hole_diameter >= pitch) {
    throw InputError("hexagonal_lattice", "hole_diameter " + fmt(hole_diameter) +
                                              " must be smaller than pitch " + fmt(pitch) +
                                              " (neighbouring holes would touch)");
  }
  std::vector<Shape> holes;
  // Axial coordinates (q, r) of a triangular lattice; ring k holds the sites at hexagonal distance
  // k = max(|q|, |r|, |q + r|), 6k of them, so 1 + 3 R (R + 1) sites in all.
  for (int k = 0; k <= rings; ++k) {
    for (int q = -k; q <= k; ++q) {
      for (int r = -k; r <= k; ++r) {
        if (std::max({std::abs(q), std::abs(r), std::abs(q + r)}) != k) continue;
        if (k == 0 && skip_centre) continue;
        const double x = pitch * (q + 0.5 * r);
        const double y = pitch * (std::sqrt(3.0) / 2.0) * r;
        holes.push_back(disk_at(0.5 * hole_diameter, x, y));
      }
    }
  }
  return holes;
}

std::vector<Shape> core_ring(int count, double pitch, double core_radius, bool with_centre) {
  if (count < 2) throw InputError("core_ring", "count must be >= 2 (got " + std::to_string(count) + ")");
  require_positive(pitch, "core_ring", "pitch");
  require_positive(core_radius, "core_ring", "core_radius");
  // chord between neighbours = 2 R sin(π / count)
  const double ring_radius = pitch / (2.0 * std::sin(pi / count));
  if (2 * core_radius >= pitch || (with_centre && 2 * core_radius >= ring_radius)) {
    throw InputError("core_ring", "cores of radius " + fmt(core_radius) +
                                      " overlap; increase pitch or reduce core_radius");
  }
  std::vector<Shape> cores;
  if (with_centre) cores.push_back(disk_at(core_radius, 0, 0));
  for (int k = 0; k < count; ++k) {
    const double t = 2.0 * pi * k / count;
    cores.push_back(disk_at(core_radius, ring_radius * std::cos(t), ring_radius * std::sin(t)));
  }
  return cores;
}

std::vector<Shape> core_square_array(int nx, int ny, double pitch, double core_radius) {
  if (nx < 1 || ny < 1) throw InputError("core_square_array", "nx and ny must be >= 1");
  require_positive(pitch, "core_square_array", "pitch");
  require_positive(core_radius, "core_square_array", "core_radius");
  if (2 * core_radius >= pitch && nx * ny > 1) {
    throw InputError("core_square_array", "cores of radius " + fmt(core_radius) +
                                              " overlap at pitch " + fmt(pitch));
  }
  std::vector<Shape> cores;
  for (int j = 0; j < ny; ++j) {
    for (int i = 0; i < nx; ++i) {
      cores.push_back(disk_at(core_radius, (i - 0.5 * (nx - 1)) * pitch,
                              (j - 0.5 * (ny - 1)) * pitch));
    }
  }
  return cores;
}

std::vector<Shape> stress_rod_pair(double offset, double rod_radius) {
  require_positive(offset, "stress_rod_pair", "offset");
  require_positive(rod_radius, "stress_rod_pair", "rod_radius");
  if (rod_radius >= offset) {
    throw InputError("stress_rod_pair", "rod_radius " + fmt(rod_radius) +
                                            " must be smaller than offset " + fmt(offset) +
                                            " (the two rods would overlap)");
  }
  return {disk_at(rod_radius, -offset, 0), disk_at(rod_radius, offset, 0)};
}

}  // namespace cladwise
