// Round step-index fibre meshes for the verification tests, the table generator and the
// benchmark: a core disk of radius a in a cladding disk with an electric wall, graded from the
// core outward, either straight from the mesher (mesh_cross_section) or mirror-symmetric.
//
// Why a mirror-symmetric mesh: the HE11 pair (and every hybrid pair) is exactly degenerate for
// the round fibre; on an unstructured mesh the two polarisations see different discretisation
// errors and split by as much as the error itself. A mesh invariant under the symmetry group of
// the square (D4: mirrors x = 0, y = 0 and y = x) keeps every ν = 1 pair exactly degenerate in
// the discrete problem (both members belong to the same two-dimensional irreducible
// representation), so the pair agrees to rounding and the error is that of one member.
// The mesher has no such option, so the 45° sector 0 ≤ φ ≤ π/4 is drawn as a Gmsh .geo script,
// meshed through mesh_external_geometry with the same size controls, and reflected here.
#pragma once

#include <unistd.h>

#include <atomic>
#include <cmath>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <functional>
#include <map>
#include <string>
#include <utility>
#include <vector>

#include "mesh/cross_section.hpp"
#include "mesh/error.hpp"
#include "mesh/external_geometry.hpp"
#include "mesh/gmsh_mesher.hpp"
#include "mesh/mesh.hpp"
#include "solver/material.hpp"
#include "solver/mode_solver.hpp"
#include "solver/step_index.hpp"

namespace cladwise::bench {

struct FibreMeshSpec {
  StepIndexFibre fibre;
  double wall_radius_um = 0;   ///< electric wall
  int order = 2;
  double core_size = 0;        ///< element size inside the core, µm
  double interface_size = 0;   ///< on the core boundary (0: core_size), µm
  double growth = 1.3;         ///< outward size growth from the interface
  double clad_size = 0;        ///< element size far out in the cladding, µm
  bool symmetric = true;       ///< D4-symmetric mesh (mirrored sector) instead of a plain one
};

namespace detail {

/// Reflects every node not on the mirror line, adds the mirrored triangles (orientation restored
/// by swapping two corners), and returns the doubled mesh (nodes unordered; see renumber()).
struct RawMesh {
  std::vector<Point2> nodes;
  std::vector<char> is_vertex;
  std::vector<std::array<int, 6>> triangles;
  std::vector<int> region;
};

inline RawMesh mirror(const RawMesh& in, const std::function<Point2(const Point2&)>& reflect,
                      double tol) {
  RawMesh out = in;
  std::vector<int> image(in.nodes.size());
  for (std::size_t i = 0; i < in.nodes.size(); ++i) {
    const Point2 r = reflect(in.nodes[i]);
    if (std::hypot(r[0] - in.nodes[i][0], r[1] - in.nodes[i][1]) <= tol) {
      image[i] = static_cast<int>(i);  // on the mirror line: shared
    } else {
      image[i] = static_cast<int>(out.nodes.size());
      out.nodes.push_back(r);
      out.is_vertex.push_back(in.is_vertex[i]);
    }
  }
  for (std::size_t t = 0; t < in.triangles.size(); ++t) {
    const auto& a = in.triangles[t];
    // corners (v0, v2, v1): edges (v0,v2), (v2,v1), (v1,v0) = old edges 2, 1, 0
    std::array<int, 6> b{image[a[0]], image[a[2]], image[a[1]], -1, -1, -1};
    if (a[3] >= 0) b = {image[a[0]], image[a[2]], image[a[1]], image[a[5]], image[a[4]], image[a[3]]};
    out.triangles.push_back(b);
    out.region.push_back(in.region[t]);
  }
  return out;
}

/// Writes the 45° sector of the fibre as a Gmsh .geo script (OpenCASCADE kernel).
inline void write_sector_geo(const std::string& path, double a, double r_wall) {
  std::ofstream f(path);
  if (!f) throw ComputationError("cannot write the temporary geometry " + path);
  const double c = std::sqrt(0.5);
  char buf[1024];
  std::snprintf(buf, sizeof buf,
                "SetFactory(\"OpenCASCADE\");\n"
                "Point(1) = {0, 0, 0};\nPoint(2) = {%.17g, 0, 0};\nPoint(3) = {%.17g, 0, 0};\n"
                "Point(4) = {%.17g, %.17g, 0};\nPoint(5) = {%.17g, %.17g, 0};\n"
                "Line(1) = {1, 2};\nLine(2) = {2, 3};\nCircle(3) = {3, 1, 5};\n"
                "Line(4) = {5, 4};\nLine(5) = {4, 1};\nCircle(6) = {2, 1, 4};\n"
                "Curve Loop(1) = {1, 6, 5};\nPlane Surface(1) = {1};\n"
                "Curve Loop(2) = {2, 3, 4, -6};\nPlane Surface(2) = {2};\n"
                "Physical Surface(\"core\") = {1};\nPhysical Surface(\"cladding\") = {2};\n"
                "Physical Curve(\"outer\") = {3};\n",
                a, r_wall, a * c, a * c, r_wall * c, r_wall * c);
  f << buf;
}

}  // namespace detail

/// The D4-symmetric fibre mesh: sector meshed by Gmsh, reflected in y = x, x = 0 and y = 0.
/// Regions "cladding" and "core"; one boundary "outer" (the wall).
inline Mesh symmetric_fibre_mesh(const FibreMeshSpec& s) {
  static std::atomic<int> counter{0};
  const auto path = std::filesystem::temp_directory_path() /
                    ("cladwise_fibre_sector_" + std::to_string(::getpid()) + "_" +
                     std::to_string(counter++) + ".geo");
  detail::write_sector_geo(path.string(), s.fibre.radius_um, s.wall_radius_um);
  ExternalGeometry g;
  g.path = path.string();
  g.materials = {{"core", "core"}, {"cladding", "cladding"}};
  g.sizes = {{"core", s.core_size}, {"cladding", s.clad_size}};
  g.guiding = {"core"};
  g.controls.order = s.order;
  g.controls.default_size = s.clad_size;
  g.controls.interface_size = s.interface_size > 0 ? s.interface_size : s.core_size;
  g.controls.growth = s.growth;
  Mesh sector;
  try {
    sector = mesh_external_geometry(g);
  } catch (...) {
    std::filesystem::remove(path);
    throw;
  }
  std::filesystem::remove(path);

  detail::RawMesh raw;
  raw.nodes = sector.nodes;
  raw.is_vertex.assign(sector.nodes.size(), 0);
  for (int i = 0; i < sector.n_vertices; ++i) raw.is_vertex[i] = 1;
  raw.triangles = sector.triangles;
  raw.region = sector.triangle_region;
  const double tol = 1e-9 * s.wall_radius_um;
  raw = detail::mirror(raw, [](const Point2& p) { return Point2{p[1], p[0]}; }, tol);
  raw = detail::mirror(raw, [](const Point2& p) { return Point2{-p[0], p[1]}; }, tol);
  raw = detail::mirror(raw, [](const Point2& p) { return Point2{p[0], -p[1]}; }, tol);

  // Renumber: corner vertices first, then mid-edge nodes (mesh.hpp contract).
  Mesh m;
  m.order = sector.order;
  std::vector<int> number(raw.nodes.size(), -1);
  for (std::size_t i = 0; i < raw.nodes.size(); ++i) {
    if (raw.is_vertex[i]) number[i] = static_cast<int>(m.nodes.size()), m.nodes.push_back(raw.nodes[i]);
  }
  m.n_vertices = static_cast<int>(m.nodes.size());
  for (std::size_t i = 0; i < raw.nodes.size(); ++i) {
    if (!raw.is_vertex[i]) number[i] = static_cast<int>(m.nodes.size()), m.nodes.push_back(raw.nodes[i]);
  }
  for (const auto& t : raw.triangles) {
    std::array<int, 6> u{-1, -1, -1, -1, -1, -1};
    for (int k = 0; k < 6; ++k) u[k] = t[k] >= 0 ? number[t[k]] : -1;
    m.triangles.push_back(u);
  }
  m.triangle_region = raw.region;
  m.regions = sector.regions;
  // The wall: edges of exactly one triangle.
  std::map<std::pair<int, int>, int> uses;
  for (const auto& t : m.triangles) {
    for (int k = 0; k < 3; ++k) ++uses[std::minmax(t[k], t[(k + 1) % 3])];
  }
  std::vector<std::array<int, 2>> segments;
  for (const auto& [e, n] : uses) {
    if (n == 1) segments.push_back({e.first, e.second});
  }
  m.boundaries = {Boundary{"outer", BoundaryKind::outer}};
  build_topology(m, segments, std::vector<int>(segments.size(), 0));
  return m;
}

/// The plain (unsymmetric) fibre mesh straight from mesh_cross_section.
inline Mesh plain_fibre_mesh(const FibreMeshSpec& s) {
  CrossSection c;
  c.background_material = "cladding";
  c.background_name = "cladding";
  c.outer.kind = OuterBoundary::Kind::disk;
  c.outer.radius = s.wall_radius_um;
  RegionSpec core;
  core.name = "core";
  core.material = "core";
  core.shapes = {Shape{Disk{s.fibre.radius_um}, {}}};
  core.mesh_size = s.core_size;
  core.guiding = true;
  c.regions = {core};
  c.controls.order = s.order;
  c.controls.default_size = s.clad_size;
  c.controls.interface_size = s.interface_size;
  c.controls.growth = s.growth;
  return mesh_cross_section(c);
}

inline Mesh fibre_mesh(const FibreMeshSpec& s) {
  return s.symmetric ? symmetric_fibre_mesh(s) : plain_fibre_mesh(s);
}

/// The FEM problem on a fibre mesh: region "core" gets n_core, every other region n_clad;
/// every boundary an electric wall.
inline ModeProblem fibre_problem(const Mesh& mesh, const FibreMeshSpec& s) {
  ModeProblem p;
  p.mesh = &mesh;
  for (const auto& r : mesh.regions) {
    p.region_materials.push_back(r.name == "core" ? isotropic_material(s.fibre.n_core, "core")
                                                  : isotropic_material(s.fibre.n_clad, "cladding"));
  }
  p.wavelength_um = s.fibre.wavelength_um;
  p.order = s.order;
  p.boundary_walls.assign(mesh.boundaries.size(), WallType::electric);
  return p;
}

}  // namespace cladwise::bench
