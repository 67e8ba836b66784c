// Shared Gmsh steps: size fields, generation and reading the mesh into the plain Mesh contract.
#include "mesh/gmsh_model.hpp"

#include <gmsh.h>

#include <algorithm>
#include <cmath>
#include <map>
#include <set>
#include <sstream>

#include "mesh/error.hpp"

namespace cladwise::detail {
namespace {

std::string num(double v) {
  std::ostringstream s;
  s.precision(17);
  s << v;
  return s.str();
}

constexpr int tri3 = 2, tri6 = 9, line2 = 1, line3 = 8;  // Gmsh element type codes

// Length of a model curve as a 64-chord polyline (works for OCC and built-in geometry alike; only
// used to choose how densely the Distance field samples the curve).
double curve_length(int curve) {
  std::vector<double> lo, hi;
  gmsh::model::getParametrizationBounds(1, curve, lo, hi);
  constexpr int n = 64;
  std::vector<double> u(n + 1);
  for (int k = 0; k <= n; ++k) u[k] = lo[0] + (hi[0] - lo[0]) * k / n;
  std::vector<double> xyz;
  gmsh::model::getValue(1, curve, u, xyz);
  double length = 0;
  for (int k = 0; k < n; ++k) {
    length += std::hypot(xyz[3 * k + 3] - xyz[3 * k], xyz[3 * k + 4] - xyz[3 * k + 1],
                         xyz[3 * k + 5] - xyz[3 * k + 2]);
  }
  return length;
}

}  // namespace

BoundaryKind boundary_kind(const std::string& name) {
  if (name == "cut_y0") return BoundaryKind::symmetry_x;
  if (name == "cut_x0") return BoundaryKind::symmetry_y;
  return BoundaryKind::outer;
}

void set_mesh_options(int order) {
  namespace opt = gmsh::option;
  opt::setNumber("Mesh.Algorithm", 6);  // Frontal-Delaunay: well-shaped triangles
  opt::setNumber("General.NumThreads", 1);
  opt::setNumber("Geometry.OCCParallel", 0);
  opt::setNumber("Mesh.MeshSizeExtendFromBoundary", 0);
  opt::setNumber("Mesh.MeshSizeFromPoints", 0);
  opt::setNumber("Mesh.MeshSizeFromCurvature", 0);
  opt::setNumber("Mesh.ElementOrder", 1);
  // Order 2: mid-edge nodes on the CAD curves (not on the straight chords), no high-order
  // untangling pass (it moves interior nodes only and is not needed for our quadratic geometry).
  opt::setNumber("Mesh.SecondOrderLinear", 0);
  opt::setNumber("Mesh.HighOrderOptimize", 0);
  opt::setNumber("Mesh.SaveAll", 0);
  (void)order;
}

void apply_size_zones(const std::vector<SizeZone>& zones, double growth, double max_size) {
  namespace field = gmsh::model::mesh::field;
  std::vector<double> members;
  double largest = 0;
  for (const auto& z : zones) largest = std::max(largest, z.size);
  for (const auto& z : zones) {
    if (z.surfaces.empty()) continue;
    const int c = field::add("MathEval");
    field::setString(c, "F", num(z.size));
    const int r = field::add("Restrict");
    field::setNumber(r, "InField", c);
    field::setNumbers(r, "SurfacesList", std::vector<double>(z.surfaces.begin(), z.surfaces.end()));
    // the zone's own size also holds on its bounding curves (else they would see no size at all
    // where no growth field reaches, e.g. an outer circle bounding only the coarsest zone)
    field::setNumbers(r, "CurvesList",
                      std::vector<double>(z.boundary_curves.begin(), z.boundary_curves.end()));
    members.push_back(r);
    // A growth field matters only where this zone's boundary is finer than something nearby.
    if (z.boundary_curves.empty() || z.boundary_size >= largest) continue;
    double longest = 0;
    for (int curve : z.boundary_curves) longest = std::max(longest, curve_length(curve));
    // Distance samples each curve at NumPointsPerCurve points: keep the samples at most half an
    // element apart on the longest curve so the distance is exact to ~h/4 at the interface.
    const double n = std::clamp(std::ceil(2.0 * longest / z.boundary_size), 20.0, 20000.0);
    const int d = field::add("Distance");
    field::setNumbers(d, "CurvesList",
                      std::vector<double>(z.boundary_curves.begin(), z.boundary_curves.end()));
    field::setNumber(d, "NumPointsPerCurve", n);
    const int g = field::add("MathEval");
    field::setString(g, "F", num(z.boundary_size) + " + " + num(growth - 1.0) + " * F" +
                                 std::to_string(d));
    members.push_back(g);
  }
  const int m = field::add("Min");
  field::setNumbers(m, "FieldsList", members);
  field::setAsBackgroundMesh(m);
  if (max_size > 0) gmsh::option::setNumber("Mesh.MeshSizeMax", max_size);
}

void generate_mesh(int order) {
  gmsh::model::mesh::generate(2);
  if (order == 2) gmsh::model::mesh::setOrder(2);
  gmsh::vectorpair surfaces;
  gmsh::model::getEntities(surfaces, 2);
  for (const auto& [dim, tag] : surfaces) {
    std::vector<int> types;
    std::vector<std::vector<std::size_t>> elems, nodes;
    gmsh::model::mesh::getElements(types, elems, nodes, dim, tag);
    std::size_t n = 0;
    for (const auto& e : elems) n += e.size();
    if (n == 0) {
      throw ComputationError("Gmsh produced no triangles on surface " + std::to_string(tag) +
                             "; refine the mesh sizes near small features");
    }
  }
}

Mesh extract_mesh(int order, const RegionOfGroup& region_of, const std::string& source) {
  // ---- node coordinates by Gmsh tag ----
  std::vector<std::size_t> node_tags;
  std::vector<double> coords, param;
  gmsh::model::mesh::getNodes(node_tags, coords, param, -1, -1, false, false);
  std::size_t max_tag = 0;
  for (auto t : node_tags) max_tag = std::max(max_tag, t);
  std::vector<Point2> xy(max_tag + 1, Point2{0, 0});
  for (std::size_t i = 0; i < node_tags.size(); ++i) xy[node_tags[i]] = {coords[3 * i], coords[3 * i + 1]};

  // ---- detect the order of an imported mesh ----
  if (order == 0) {
    std::vector<int> types;
    gmsh::model::mesh::getElementTypes(types, 2);
    const bool has6 = std::count(types.begin(), types.end(), tri6) > 0;
    const bool has3 = std::count(types.begin(), types.end(), tri3) > 0;
    if (has6 == has3) {
      throw InputError(source, has6 ? "mixes 3-node and 6-node triangles; use one order"
                                    : "contains no 3-node or 6-node triangles");
    }
    order = has6 ? 2 : 1;
  }
  const int tri_type = order == 2 ? tri6 : tri3;
  const int npe = order == 2 ? 6 : 3;

  Mesh mesh;
  mesh.order = order;

  // ---- 2-D physical groups -> regions ----
  gmsh::vectorpair groups;
  gmsh::model::getPhysicalGroups(groups, 2);
  std::sort(groups.begin(), groups.end());
  std::map<int, int> region_of_surface;  // surface entity -> region index
  for (const auto& [dim, gtag] : groups) {
    std::string name;
    gmsh::model::getPhysicalName(dim, gtag, name);
    if (name.empty()) name = "surface_group_" + std::to_string(gtag);
    const int index = static_cast<int>(mesh.regions.size());
    mesh.regions.push_back(region_of(name));
    std::vector<int> entities;
    gmsh::model::getEntitiesForPhysicalGroup(dim, gtag, entities);
    for (int e : entities) {
      auto [it, inserted] = region_of_surface.emplace(e, index);
      if (!inserted) {
        throw InputError(source, "surface " + std::to_string(e) + " belongs to two physical groups ('" +
                                     mesh.regions[it->second].name + "' and '" + name +
                                     "'); each surface needs exactly one material");
      }
    }
  }
  gmsh::vectorpair surfaces;
  gmsh::model::getEntities(surfaces, 2);
  if (surfaces.empty()) throw InputError(source, "has no surfaces to mesh");
  for (const auto& [dim, tag] : surfaces) {
    if (!region_of_surface.count(tag)) {
      throw InputError(source, "surface " + std::to_string(tag) +
                                   " is in no 2-D physical group; put every surface in a named "
                                   "group mapped to a material");
    }
  }

  // ---- triangles, in Gmsh's node order (corners, then edges (0,1), (1,2), (2,0)) ----
  std::vector<std::array<std::size_t, 6>> raw;
  for (const auto& [dim, tag] : surfaces) {
    std::vector<int> types;
    gmsh::model::mesh::getElementTypes(types, 2, tag);
    for (int ty : types) {
      if (ty != tri_type) {
        throw InputError(source, "surface " + std::to_string(tag) + " holds elements of Gmsh type " +
                                     std::to_string(ty) + "; only " + std::to_string(npe) +
                                     "-node triangles are supported");
      }
    }
    std::vector<std::size_t> etags, enodes;
    gmsh::model::mesh::getElementsByType(tri_type, etags, enodes, tag);
    const int region = region_of_surface.at(tag);
    for (std::size_t e = 0; e < etags.size(); ++e) {
      std::array<std::size_t, 6> t{0, 0, 0, 0, 0, 0};
      for (int k = 0; k < npe; ++k) t[k] = enodes[e * npe + k];
      raw.push_back(t);
      mesh.triangle_region.push_back(region);
    }
  }

  // ---- compact renumbering: corner vertices first, then mid-edge nodes ----
  std::vector<int> index(max_tag + 1, -1);
  for (const auto& t : raw) {
    for (int k = 0; k < 3; ++k) {
      if (index[t[k]] < 0) {
        index[t[k]] = static_cast<int>(mesh.nodes.size());
        mesh.nodes.push_back(xy[t[k]]);
      }
    }
  }
  mesh.n_vertices = static_cast<int>(mesh.nodes.size());
  if (order == 2) {
    for (const auto& t : raw) {
      for (int k = 3; k < 6; ++k) {
        if (index[t[k]] < 0) {
          index[t[k]] = static_cast<int>(mesh.nodes.size());
          mesh.nodes.push_back(xy[t[k]]);
        } else if (index[t[k]] < mesh.n_vertices) {
          throw ComputationError(source + ": node " + std::to_string(t[k]) +
                                 " is both a corner and a mid-edge node");
        }
      }
    }
  }
  mesh.triangles.reserve(raw.size());
  for (const auto& t : raw) {
    std::array<int, 6> v{-1, -1, -1, -1, -1, -1};
    for (int k = 0; k < npe; ++k) v[k] = index[t[k]];
    const auto& a = mesh.nodes[v[0]];
    const auto& b = mesh.nodes[v[1]];
    const auto& c = mesh.nodes[v[2]];
    const double det = (b[0] - a[0]) * (c[1] - a[1]) - (c[0] - a[0]) * (b[1] - a[1]);
    if (det == 0) throw ComputationError(source + ": degenerate triangle (zero area) in the mesh");
    if (det < 0) {
      // reverse to (v0, v2, v1); edges become (v0,v2), (v2,v1), (v1,v0): mid nodes m2, m1, m0
      std::swap(v[1], v[2]);
      if (order == 2) std::swap(v[3], v[5]);
    }
    mesh.triangles.push_back(v);
  }

  // ---- 1-D physical groups "outer", "cut_x0", "cut_y0" -> boundaries ----
  std::vector<std::array<int, 2>> segments;
  std::vector<int> segment_tags;
  gmsh::vectorpair curve_groups;
  gmsh::model::getPhysicalGroups(curve_groups, 1);
  std::sort(curve_groups.begin(), curve_groups.end());
  const int line_type = order == 2 ? line3 : line2;
  for (const auto& [dim, gtag] : curve_groups) {
    std::string name;
    gmsh::model::getPhysicalName(dim, gtag, name);
    if (name != "outer" && name != "cut_x0" && name != "cut_y0") continue;
    int b = -1;
    for (std::size_t i = 0; i < mesh.boundaries.size(); ++i) {
      if (mesh.boundaries[i].name == name) b = static_cast<int>(i);
    }
    if (b < 0) {
      b = static_cast<int>(mesh.boundaries.size());
      mesh.boundaries.push_back(Boundary{name, boundary_kind(name)});
    }
    std::vector<int> entities;
    gmsh::model::getEntitiesForPhysicalGroup(dim, gtag, entities);
    for (int e : entities) {
      std::vector<std::size_t> etags, enodes;
      gmsh::model::mesh::getElementsByType(line_type, etags, enodes, e);
      const int n = order == 2 ? 3 : 2;
      for (std::size_t k = 0; k < etags.size(); ++k) {
        const int p = index[enodes[k * n]], q = index[enodes[k * n + 1]];
        if (p < 0 || q < 0) {
          throw ComputationError(source + ": boundary '" + name + "' has a segment off the mesh");
        }
        segments.push_back({p, q});
        segment_tags.push_back(b);
      }
    }
  }
  build_topology(mesh, segments, segment_tags);

  // Boundary edges of the mesh that no named group covers are the outer wall.
  std::vector<int> count(mesh.n_edges(), 0);
  for (const auto& te : mesh.triangle_edges) {
    for (int e : te) ++count[e];
  }
  std::vector<char> tagged(mesh.n_edges(), 0);
  for (int e : mesh.boundary_edges) tagged[e] = 1;
  int outer = -1;
  for (int e = 0; e < mesh.n_edges(); ++e) {
    if (count[e] != 1 || tagged[e]) continue;
    if (outer < 0) {
      for (std::size_t i = 0; i < mesh.boundaries.size(); ++i) {
        if (mesh.boundaries[i].name == "outer") outer = static_cast<int>(i);
      }
      if (outer < 0) {
        outer = static_cast<int>(mesh.boundaries.size());
        mesh.boundaries.push_back(Boundary{"outer", BoundaryKind::outer});
      }
    }
    mesh.boundary_edges.push_back(e);
    mesh.boundary_edge_tag.push_back(outer);
  }
  return mesh;
}

}  // namespace cladwise::detail
