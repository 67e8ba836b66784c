// Cross-section geometry -> OpenCASCADE surfaces -> painted, conforming fragments -> Gmsh mesh ->
// plain Mesh. See gmsh_mesher.hpp for the steps and the naming of regions and boundaries.
#include "mesh/gmsh_mesher.hpp"

#include <gmsh.h>

#include <algorithm>
#include <chrono>
#include <cmath>
#include <limits>
#include <map>
#include <numbers>
#include <set>

#include "mesh/error.hpp"
#include "mesh/gmsh_model.hpp"
#include "mesh/gmsh_session.hpp"

namespace cladwise {
namespace {

namespace occ = gmsh::model::occ;
constexpr double pi = std::numbers::pi;

// ---- shapes -> OCC surfaces -----------------------------------------------------------------
int add_polygon(const std::vector<Point2>& global) {
  std::vector<int> points, lines;
  for (const auto& p : global) points.push_back(occ::addPoint(p[0], p[1], 0));
  for (std::size_t i = 0; i < points.size(); ++i) {
    lines.push_back(occ::addLine(points[i], points[(i + 1) % points.size()]));
  }
  return occ::addPlaneSurface({occ::addCurveLoop(lines)});
}

// Rectangle of straight sides and quarter-circle corner arcs, built from its boundary so that a
// corner radius equal to half a side (a stadium) simply drops the zero-length side.
int add_rectangle(const Rectangle& r, const Placement& pl) {
  const double hw = 0.5 * r.width, hh = 0.5 * r.height, c = r.corner_radius;
  if (c <= 0) {
    return add_polygon({apply(pl, {-hw, -hh}), apply(pl, {hw, -hh}), apply(pl, {hw, hh}),
                        apply(pl, {-hw, hh})});
  }
  const double ex = hw - c, ey = hh - c;  // corner-arc centres at (±ex, ±ey)
  // Counter-clockwise: side points then corner arc, four times.
  const Point2 side_start[4] = {{-ex, -hh}, {hw, -ey}, {ex, hh}, {-hw, ey}};
  const Point2 side_end[4] = {{ex, -hh}, {hw, ey}, {-ex, hh}, {-hw, -ey}};
  const Point2 centre[4] = {{ex, -ey}, {ex, ey}, {-ex, ey}, {-ex, -ey}};
  const double tol = 1e-12 * std::max(hw, hh);
  std::vector<int> curves;
  const int first = [&] {
    const Point2 g = apply(pl, side_start[0]);
    return occ::addPoint(g[0], g[1], 0);
  }();
  int current = first;
  for (int k = 0; k < 4; ++k) {
    const bool degenerate = std::hypot(side_end[k][0] - side_start[k][0],
                                       side_end[k][1] - side_start[k][1]) <= tol;
    if (!degenerate) {
      const Point2 g = apply(pl, side_end[k]);
      const int p = occ::addPoint(g[0], g[1], 0);
      curves.push_back(occ::addLine(current, p));
      current = p;
    }
    const Point2 gc = apply(pl, centre[k]);
    const int pc = occ::addPoint(gc[0], gc[1], 0);
    int next = first;
    if (k < 3) {
      const Point2 g = apply(pl, side_start[k + 1]);
      next = occ::addPoint(g[0], g[1], 0);
    }
    curves.push_back(occ::addCircleArc(current, pc, next));
    current = next;
  }
  return occ::addPlaneSurface({occ::addCurveLoop(curves)});
}

std::vector<int> add_shape(const Shape& shape) {
  const Placement& pl = shape.placement;
  const Point2 c = apply(pl, {0, 0});
  return std::visit(
      [&](const auto& g) -> std::vector<int> {
        using T = std::decay_t<decltype(g)>;
        if constexpr (std::is_same_v<T, Disk>) {
          return {occ::addDisk(c[0], c[1], 0, g.radius, g.radius)};
        } else if constexpr (std::is_same_v<T, Ellipse>) {
          // OCC needs the major radius along x: swap the axes and turn by a further 90°.
          double a = g.semi_axis_x, b = g.semi_axis_y, angle = pl.rotation_deg;
          if (a < b) {
            std::swap(a, b);
            angle += 90.0;
          }
          const int s = occ::addDisk(0, 0, 0, a, b);
          occ::rotate({{2, s}}, 0, 0, 0, 0, 0, 1, angle * pi / 180.0);
          occ::translate({{2, s}}, c[0], c[1], 0);
          return {s};
        } else if constexpr (std::is_same_v<T, Rectangle>) {
          return {add_rectangle(g, pl)};
        } else if constexpr (std::is_same_v<T, Polygon>) {
          std::vector<Point2> global;
          for (const auto& p : g.vertices) global.push_back(apply(pl, p));
          return {add_polygon(global)};
        } else {
          const int outer = occ::addDisk(c[0], c[1], 0, g.outer_radius, g.outer_radius);
          const int inner = occ::addDisk(c[0], c[1], 0, g.inner_radius, g.inner_radius);
          gmsh::vectorpair out;
          std::vector<gmsh::vectorpair> map;
          occ::cut({{2, outer}}, {{2, inner}}, out, map);
          std::vector<int> tags;
          for (const auto& [d, t] : out) tags.push_back(t);
          return tags;
        }
      },
      shape.geometry);
}

int add_domain(const OuterBoundary& o, double grow) {
  if (o.kind == OuterBoundary::Kind::disk) {
    const double r = o.radius + grow;
    return occ::addDisk(o.centre[0], o.centre[1], 0, r, r);
  }
  const double w = o.width + 2 * grow, h = o.height + 2 * grow;
  return occ::addRectangle(o.centre[0] - 0.5 * w, o.centre[1] - 0.5 * h, 0, w, h);
}

// ---- classification of fragments ------------------------------------------------------------
struct FragmentCover {
  bool domain = false;
  bool pml = false;
  bool kept_half = true;  // inside the half/quarter plane kept by the symmetry cut
  int last_region = -1;   // index into CrossSection::regions of the last region covering it
};

struct ModelRegion {
  Region region;
  std::vector<int> surfaces;
  double size = 0;
  double boundary_size = 0;
};

std::array<Point2, 3> curve_samples(int curve) {
  std::vector<double> lo, hi;
  gmsh::model::getParametrizationBounds(1, curve, lo, hi);
  std::array<Point2, 3> pts;
  for (int k = 0; k < 3; ++k) {
    const double u = lo[0] + (hi[0] - lo[0]) * (0.1 + 0.4 * k);
    std::vector<double> xyz;
    gmsh::model::getValue(1, curve, {u}, xyz);
    pts[k] = {xyz[0], xyz[1]};
  }
  return pts;
}

double half_size(const OuterBoundary& o) {
  return o.kind == OuterBoundary::Kind::disk ? o.radius : 0.5 * std::max(o.width, o.height);
}

std::string region_where(const CrossSection& cs, std::size_t i) {
  const auto& r = cs.regions[i];
  return r.where.empty() ? "region '" + r.name + "'" : r.where;
}

// Builds, paints and tags the geometry; fills `regions` (Mesh order) and the boundary groups.
std::vector<ModelRegion> build_geometry(const CrossSection& cs) {
  const auto& o = cs.outer;
  const bool has_pml = o.pml_thickness > 0;
  const bool cut_y = cs.symmetry == SymmetryCut::half_upper || cs.symmetry == SymmetryCut::quarter;
  const bool cut_x = cs.symmetry == SymmetryCut::half_right || cs.symmetry == SymmetryCut::quarter;

  // ---- inputs of the one boolean fragment ----
  constexpr int kind_pml = -1, kind_half = -2;
  const int domain = add_domain(o, 0.0);
  gmsh::vectorpair tools;
  std::vector<int> tool_kind;
  if (has_pml) {
    const int big = add_domain(o, o.pml_thickness);
    const int hole = add_domain(o, 0.0);
    gmsh::vectorpair out;
    std::vector<gmsh::vectorpair> map;
    occ::cut({{2, big}}, {{2, hole}}, out, map);
    for (const auto& dt : out) {
      tools.push_back(dt);
      tool_kind.push_back(kind_pml);
    }
  }
  if (cut_x || cut_y) {
    const double b = 4.0 * (std::abs(o.centre[0]) + std::abs(o.centre[1]) + half_size(o) +
                            o.pml_thickness) + 1.0;
    const double x0 = cut_x ? 0.0 : -b, y0 = cut_y ? 0.0 : -b;
    const int half = occ::addRectangle(x0, y0, 0, b - x0, b - y0);
    tools.push_back({2, half});
    tool_kind.push_back(kind_half);
  }
  for (std::size_t r = 0; r < cs.regions.size(); ++r) {
    for (const auto& shape : cs.regions[r].shapes) {
      for (int s : add_shape(shape)) {
        tools.push_back({2, s});
        tool_kind.push_back(static_cast<int>(r));
      }
    }
  }
  gmsh::vectorpair fragments;
  std::vector<gmsh::vectorpair> parents;
  occ::fragment({{2, domain}}, tools, fragments, parents);

  // ---- painting: the last region covering a fragment owns it ----
  std::map<int, FragmentCover> cover;
  for (const auto& [d, t] : fragments) {
    if (d == 2) cover[t].kept_half = !(cut_x || cut_y);
  }
  for (std::size_t i = 0; i < parents.size(); ++i) {
    const int kind = i == 0 ? 0 : tool_kind[i - 1];
    for (const auto& [d, t] : parents[i]) {
      if (d != 2) continue;
      auto& c = cover[t];
      if (i == 0) {
        c.domain = true;
      } else if (kind == kind_pml) {
        c.pml = true;
      } else if (kind == kind_half) {
        c.kept_half = true;
      } else {
        c.last_region = std::max(c.last_region, kind);
      }
    }
  }
  std::vector<char> inside(cs.regions.size(), 0), owns(cs.regions.size(), 0);
  for (std::size_t i = 1; i < parents.size(); ++i) {
    const int kind = tool_kind[i - 1];
    if (kind < 0) continue;
    for (const auto& [d, t] : parents[i]) {
      const auto& c = cover[t];
      if (d != 2 || !(c.domain || c.pml)) continue;
      inside[kind] = 1;
      if (c.last_region == kind) owns[kind] = 1;
    }
  }
  for (std::size_t r = 0; r < cs.regions.size(); ++r) {
    if (!inside[r]) {
      throw InputError(region_where(cs, r), "region '" + cs.regions[r].name +
                                                "' lies entirely outside the computational domain; "
                                                "move it inside or enlarge the outer boundary");
    }
    if (!owns[r]) {
      throw InputError(region_where(cs, r), "region '" + cs.regions[r].name +
                                                "' is entirely covered by regions painted after "
                                                "it; reorder the regions or remove it");
    }
  }

  // ---- Mesh regions: background, regions, PML variants ----
  const double h_background = background_mesh_size(cs);
  std::vector<ModelRegion> regions(1 + cs.regions.size());
  regions[0].region = Region{cs.background_name, cs.background_material, RegionRole::physical};
  regions[0].size = regions[0].boundary_size = h_background;
  for (std::size_t r = 0; r < cs.regions.size(); ++r) {
    const auto& spec = cs.regions[r];
    auto& m = regions[r + 1];
    m.region = Region{spec.name, spec.material, RegionRole::physical};
    m.size = region_mesh_size(cs, r);
    m.boundary_size = m.size;
    if (spec.guiding && cs.controls.interface_size > 0) {
      m.boundary_size = cs.controls.interface_size;
      if (cs.controls.max_size > 0) m.boundary_size = std::min(m.boundary_size, cs.controls.max_size);
    }
  }
  std::map<int, int> pml_index;  // owner (-1 background, else region) -> Mesh region index
  gmsh::vectorpair dropped;
  for (const auto& [t, c] : cover) {
    if (!(c.domain || c.pml) || !c.kept_half) {
      dropped.push_back({2, t});
      continue;
    }
    if (c.domain) {
      regions[c.last_region + 1].surfaces.push_back(t);
      continue;
    }
    auto it = pml_index.find(c.last_region);
    if (it == pml_index.end()) {
      ModelRegion m;
      const ModelRegion& like = regions[c.last_region + 1];
      m.region = Region{c.last_region < 0 ? "pml" : "pml_" + like.region.name,
                        like.region.material, RegionRole::pml};
      m.size = m.boundary_size = c.last_region < 0 ? h_background : like.size;
      it = pml_index.emplace(c.last_region, static_cast<int>(regions.size())).first;
      regions.push_back(m);
    }
    regions[it->second].surfaces.push_back(t);
  }
  if (!dropped.empty()) occ::remove(dropped, true);
  occ::synchronize();

  // ---- adjacency of curves, boundary tags ----
  std::map<int, std::set<int>> curve_regions;  // curve -> Mesh regions touching it
  std::map<int, int> curve_surface_count;
  std::vector<std::vector<int>> region_curves(regions.size());
  for (std::size_t i = 0; i < regions.size(); ++i) {
    for (int s : regions[i].surfaces) {
      gmsh::vectorpair bnd;
      gmsh::model::getBoundary({{2, s}}, bnd, false, false, false);
      for (const auto& [d, c] : bnd) {
        curve_regions[std::abs(c)].insert(static_cast<int>(i));
        ++curve_surface_count[std::abs(c)];
        region_curves[i].push_back(std::abs(c));
      }
    }
  }
  const double tol = 1e-9 * (half_size(o) + o.pml_thickness + std::abs(o.centre[0]) +
                             std::abs(o.centre[1]));
  std::vector<int> outer_curves, cut_y0_curves, cut_x0_curves;
  for (const auto& [curve, n] : curve_surface_count) {
    if (n != 1) continue;
    const auto pts = curve_samples(curve);
    bool on_y0 = cut_y, on_x0 = cut_x;
    for (const auto& p : pts) {
      on_y0 = on_y0 && std::abs(p[1]) <= tol;
      on_x0 = on_x0 && std::abs(p[0]) <= tol;
    }
    (on_y0 ? cut_y0_curves : on_x0 ? cut_x0_curves : outer_curves).push_back(curve);
  }
  const std::pair<const char*, std::vector<int>*> groups[] = {
      {"outer", &outer_curves}, {"cut_y0", &cut_y0_curves}, {"cut_x0", &cut_x0_curves}};
  int group_tag = 1;
  for (const auto& [name, curves] : groups) {
    if (curves->empty()) continue;
    gmsh::model::addPhysicalGroup(1, *curves, group_tag);
    gmsh::model::setPhysicalName(1, group_tag, name);
    ++group_tag;
  }

  // ---- surface groups and size zones ----
  std::vector<detail::SizeZone> zones;
  for (std::size_t i = 0; i < regions.size(); ++i) {
    if (regions[i].surfaces.empty()) continue;
    const int tag = static_cast<int>(i) + 1;
    gmsh::model::addPhysicalGroup(2, regions[i].surfaces, tag);
    gmsh::model::setPhysicalName(2, tag, regions[i].region.name);
    detail::SizeZone z;
    z.surfaces = regions[i].surfaces;
    z.size = regions[i].size;
    z.boundary_size = regions[i].boundary_size;
    std::set<int> seen;
    for (int c : region_curves[i]) {
      // curves between two fragments of this same region are not interfaces
      const bool interface = curve_regions[c].size() > 1 || curve_surface_count[c] == 1;
      if (interface && seen.insert(c).second) z.boundary_curves.push_back(c);
    }
    zones.push_back(z);
  }
  detail::set_mesh_options(cs.controls.order);
  double largest = 0;
  for (const auto& z : zones) largest = std::max(largest, z.size);
  detail::apply_size_zones(zones, cs.controls.growth,
                           cs.controls.max_size > 0 ? cs.controls.max_size : largest);
  return regions;
}

}  // namespace

Mesh mesh_cross_section(const CrossSection& section, MeshReport* report,
                        const std::string& msh_path) {
  validate(section);
  const auto start = std::chrono::steady_clock::now();
  GmshSession session;
  gmsh::model::add("cladwise_cross_section");
  std::vector<ModelRegion> regions;
  gmsh_call("building the cross-section geometry", [&] { regions = build_geometry(section); });
  gmsh_call("meshing the cross-section", [&] { detail::generate_mesh(section.controls.order); });
  if (!msh_path.empty()) {
    gmsh_call("writing " + msh_path, [&] { gmsh::write(msh_path); });
  }
  Mesh mesh;
  gmsh_call("reading the mesh", [&] {
    mesh = detail::extract_mesh(
        section.controls.order,
        [&](const std::string& name) {
          for (const auto& r : regions) {
            if (r.region.name == name) return r.region;
          }
          throw ComputationError("internal: unknown physical group '" + name + "'");
        },
        "cross-section");
  });
  for (int t = 0; t < mesh.n_triangles(); ++t) {
    if (jacobian_ratio(mesh, t) <= 0) {
      throw ComputationError("curved triangle " + std::to_string(t) + " of region '" +
                             mesh.regions[mesh.triangle_region[t]].name +
                             "' is inverted; set a smaller interface_size or mesh_size there");
    }
  }
  if (report) {
    *report = summarize(mesh);
    report->seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
  }
  return mesh;
}

void write_msh(const Mesh& mesh, const std::string& path) {
  GmshSession session;
  gmsh_call("writing " + path, [&] {
    gmsh::model::add("cladwise_mesh");
    // One discrete surface per region; all nodes live on the first one (Gmsh only needs each node
    // classified somewhere to write it).
    const int n_regions = static_cast<int>(mesh.regions.size());
    for (int r = 0; r < n_regions; ++r) gmsh::model::addDiscreteEntity(2, r + 1);
    std::vector<std::size_t> tags(mesh.nodes.size());
    std::vector<double> xyz(3 * mesh.nodes.size(), 0.0);
    for (std::size_t i = 0; i < mesh.nodes.size(); ++i) {
      tags[i] = i + 1;
      xyz[3 * i] = mesh.nodes[i][0];
      xyz[3 * i + 1] = mesh.nodes[i][1];
    }
    gmsh::model::mesh::addNodes(2, 1, tags, xyz);
    const int npe = mesh.nodes_per_triangle();
    std::vector<std::vector<std::size_t>> conn(n_regions);
    for (int t = 0; t < mesh.n_triangles(); ++t) {
      for (int k = 0; k < npe; ++k) {
        conn[mesh.triangle_region[t]].push_back(static_cast<std::size_t>(mesh.triangles[t][k]) + 1);
      }
    }
    for (int r = 0; r < n_regions; ++r) {
      if (conn[r].empty()) continue;
      gmsh::model::mesh::addElementsByType(r + 1, mesh.order == 2 ? 9 : 2, {}, conn[r]);
      gmsh::model::addPhysicalGroup(2, {r + 1}, r + 1);
      gmsh::model::setPhysicalName(2, r + 1, mesh.regions[r].name);
    }
    const int n_boundaries = static_cast<int>(mesh.boundaries.size());
    std::vector<std::vector<std::size_t>> lines(n_boundaries);
    for (std::size_t i = 0; i < mesh.boundary_edges.size(); ++i) {
      const int e = mesh.boundary_edges[i];
      auto& l = lines[mesh.boundary_edge_tag[i]];
      l.push_back(static_cast<std::size_t>(mesh.edges[e][0]) + 1);
      l.push_back(static_cast<std::size_t>(mesh.edges[e][1]) + 1);
      if (mesh.order == 2) l.push_back(static_cast<std::size_t>(mesh.edge_midnode[e]) + 1);
    }
    for (int b = 0; b < n_boundaries; ++b) {
      if (lines[b].empty()) continue;
      const int curve = gmsh::model::addDiscreteEntity(1, b + 1);
      gmsh::model::mesh::addElementsByType(curve, mesh.order == 2 ? 8 : 1, {}, lines[b]);
      gmsh::model::addPhysicalGroup(1, {curve}, b + 1);
      gmsh::model::setPhysicalName(1, b + 1, mesh.boundaries[b].name);
    }
    gmsh::write(path);
  });
}

}  // namespace cladwise
