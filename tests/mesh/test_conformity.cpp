// Conformity, painting order and curved geometry of meshed cross-sections.
#include <gtest/gtest.h>

#include <cmath>
#include <numbers>

#include "mesh/gmsh_mesher.hpp"
#include "mesh_checks.hpp"

using namespace cladwise;
using namespace cladwise::test;
constexpr double pi = std::numbers::pi;

namespace {

// Overlapping shapes in a rectangular domain, painted in order: a cladding ring partly under a
// core, a polygon crossing both, stress rods, an ellipse crossing the domain edge.
CrossSection overlapping(int order) {
  CrossSection cs;
  cs.background_material = "silica";
  cs.outer.kind = OuterBoundary::Kind::rectangle;
  cs.outer.width = 16;
  cs.outer.height = 10;
  cs.outer.centre = {0.5, 0.0};
  cs.controls.order = order;
  cs.regions.push_back(RegionSpec{"ring", "f", {Shape{Annulus{1.5, 3.0}, {}}}, 0.3, false, "t:1"});
  cs.regions.push_back(RegionSpec{"rods", "b2o3", stress_rod_pair(5.0, 1.2), 0.3, false, "t:2"});
  cs.regions.push_back(RegionSpec{
      "wedge", "p", {Shape{Polygon{{{0, 0}, {5, -1}, {6, 2}, {2, 1.5}}}, {{0, 0}, 15}}}, 0.3, false,
      "t:3"});
  cs.regions.push_back(RegionSpec{"core", "ge", {Shape{Disk{2.0}, {{0.2, 0.1}, 0}}}, 0.25, true, "t:4"});
  cs.regions.push_back(RegionSpec{"edge", "x", {Shape{Ellipse{1.0, 3.0}, {{8.5, 2.0}, -25}}}, 0.3,
                                  false, "t:5"});
  return cs;
}

}  // namespace

TEST(Conformity, EdgesAndBoundaryTags) {
  for (int order : {1, 2}) {
    const Mesh mesh = mesh_cross_section(overlapping(order));
    EXPECT_EQ(mesh.order, order);
    expect_conforming(mesh);
    ASSERT_EQ(mesh.boundaries.size(), 1u);
    EXPECT_EQ(mesh.boundaries[0].name, "outer");
    EXPECT_EQ(mesh.boundaries[0].kind, BoundaryKind::outer);
    // every outer edge lies on the rectangle x = 0.5 ± 8, y = ±5
    for (int e : mesh.boundary_edges) {
      for (int v : mesh.edges[e]) {
        const auto& p = mesh.nodes[v];
        const double d = std::min(std::abs(std::abs(p[0] - 0.5) - 8.0), std::abs(std::abs(p[1]) - 5.0));
        EXPECT_LT(d, 1e-12);
      }
    }
  }
}

TEST(Painting, AreasSumToDomainAndCentroidsLieInTheirRegion) {
  const CrossSection cs = overlapping(2);
  const Mesh mesh = mesh_cross_section(cs);
  // rectangle W·H exactly: straight outer boundary, curved interfaces only move area between regions
  double total = 0;
  for (double a : region_areas(mesh)) total += a;
  EXPECT_NEAR(total, 16.0 * 10.0, 1e-10);
  // the curved centroid x(1/3, 1/3) of each triangle belongs to the last region containing it
  ASSERT_EQ(mesh.regions.front().name, cs.background_name);
  for (int t = 0; t < mesh.n_triangles(); ++t) {
    const Point2 c = map_point(mesh, t, 1.0 / 3, 1.0 / 3);
    int expected = 0;
    for (std::size_t r = 0; r < cs.regions.size(); ++r) {
      for (const auto& s : cs.regions[r].shapes) {
        if (inside(s, c)) expected = region_index(mesh, cs.regions[r].name);
      }
    }
    ASSERT_EQ(mesh.triangle_region[t], expected)
        << "triangle " << t << " at (" << c[0] << ", " << c[1] << ") tagged "
        << mesh.regions[mesh.triangle_region[t]].name;
  }
  // the core (painted after the ring) is a full disk: π r²; the ring keeps only what is outside it
  EXPECT_NEAR(region_area(mesh, "core") / (pi * 4.0), 1.0, 1e-5);
  EXPECT_EQ(mesh.regions[region_index(mesh, "core")].material, "ge");
}

namespace {
// Residual of the implicit boundary equation of a shape at a global point, relative (0 on it).
double boundary_residual(const Shape& s, const Point2& g) {
  const Point2 q = to_local(s.placement, g);
  if (const auto* d = std::get_if<Disk>(&s.geometry)) return std::abs(std::hypot(q[0], q[1]) / d->radius - 1);
  if (const auto* e = std::get_if<Ellipse>(&s.geometry)) {
    return std::abs(std::hypot(q[0] / e->semi_axis_x, q[1] / e->semi_axis_y) - 1);
  }
  if (const auto* a = std::get_if<Annulus>(&s.geometry)) {
    const double r = std::hypot(q[0], q[1]);
    return std::min(std::abs(r / a->inner_radius - 1), std::abs(r / a->outer_radius - 1));
  }
  return 1e300;
}
}  // namespace

TEST(CurvedGeometry, MidEdgeNodesLieOnCirclesAndEllipses) {
  CrossSection cs;
  cs.background_material = "silica";
  cs.outer.radius = 8;
  cs.outer.centre = {0.3, -0.2};
  cs.controls.order = 2;
  cs.regions.push_back(RegionSpec{"core", "ge", {Shape{Disk{1.3}, {{-3, 1}, 0}}}, 0, true, "t:1"});
  cs.regions.push_back(RegionSpec{"ell", "ge", {Shape{Ellipse{1.0, 2.2}, {{2, 0.5}, 37}}}, 0, true, "t:2"});
  cs.regions.push_back(RegionSpec{"trench", "f", {Shape{Annulus{0.8, 1.4}, {{-1, -4}, 0}}}, 0, false, "t:3"});
  std::vector<Shape> curves;
  for (const auto& r : cs.regions) curves.push_back(r.shapes[0]);
  curves.push_back(Shape{Disk{8}, {{0.3, -0.2}, 0}});  // the outer circle

  const Mesh mesh = mesh_cross_section(cs);
  // edges between two regions, and boundary edges, must carry their mid-node on the true curve
  std::vector<std::vector<int>> edge_regions(mesh.n_edges());
  for (int t = 0; t < mesh.n_triangles(); ++t) {
    for (int e : mesh.triangle_edges[t]) edge_regions[e].push_back(mesh.triangle_region[t]);
  }
  int checked = 0;
  double worst = 0, worst_chord = 0;
  for (int e = 0; e < mesh.n_edges(); ++e) {
    const auto& rs = edge_regions[e];
    if (rs.size() == 2 && rs[0] == rs[1]) continue;
    const Point2& a = mesh.nodes[mesh.edges[e][0]];
    const Point2& b = mesh.nodes[mesh.edges[e][1]];
    const Point2& m = mesh.nodes[mesh.edge_midnode[e]];
    const Point2 chord_mid{0.5 * (a[0] + b[0]), 0.5 * (a[1] + b[1])};
    bool found = false;
    for (const auto& s : curves) {
      if (boundary_residual(s, a) < 1e-9 && boundary_residual(s, b) < 1e-9) {
        worst = std::max(worst, boundary_residual(s, m));
        worst_chord = std::max(worst_chord, boundary_residual(s, chord_mid));
        found = true;
        break;
      }
    }
    ASSERT_TRUE(found) << "interface edge " << e << " is on none of the curves";
    ++checked;
  }
  EXPECT_GT(checked, 100);
  EXPECT_LT(worst, 1e-12);        // curved: on the circle/ellipse to machine precision
  EXPECT_GT(worst_chord, 1e-4);   // whereas the straight chord midpoints are visibly off it
}

namespace {
// Edges between the "core" region and any other region, and the longest edge of the mesh.
std::pair<int, double> core_interface_edges(const Mesh& m) {
  const int core = region_index(m, "core");
  std::vector<std::vector<int>> by_edge(m.n_edges());
  for (int t = 0; t < m.n_triangles(); ++t) {
    for (int e : m.triangle_edges[t]) by_edge[e].push_back(m.triangle_region[t]);
  }
  int n = 0;
  double longest = 0;
  for (int e = 0; e < m.n_edges(); ++e) {
    const auto& a = m.nodes[m.edges[e][0]];
    const auto& b = m.nodes[m.edges[e][1]];
    longest = std::max(longest, std::hypot(a[0] - b[0], a[1] - b[1]));
    if (by_edge[e].size() == 2 && (by_edge[e][0] == core) != (by_edge[e][1] == core)) ++n;
  }
  return {n, longest};
}

CrossSection single_core() {
  CrossSection cs;
  cs.background_material = "silica";
  cs.outer.radius = 6;
  cs.controls.order = 1;
  cs.regions.push_back(RegionSpec{"core", "ge", {Shape{Disk{1.0}, {}}}, 0, true, "t"});
  return cs;
}
}  // namespace

TEST(SizeControl, AutomaticInterfaceAndCap) {
  // automatic: guiding disk at radius / 6 -> 2π · 6 ≈ 37.7 segments on its circle
  auto [n_auto, longest_auto] = core_interface_edges(mesh_cross_section(single_core()));
  EXPECT_GE(n_auto, 32);
  EXPECT_LE(n_auto, 44);
  // interface_size 0.05 -> 2π / 0.05 ≈ 126 segments
  auto cs = single_core();
  cs.controls.interface_size = 0.05;
  auto [n_fine, longest_fine] = core_interface_edges(mesh_cross_section(cs));
  EXPECT_GE(n_fine, 110);
  EXPECT_LE(n_fine, 145);
  // the cap: background would be 6/10 = 0.6 µm; max_size 0.25 bounds every edge (Gmsh may
  // overshoot a target by a few tens of percent)
  cs = single_core();
  cs.controls.max_size = 0.25;
  auto [n_cap, longest_cap] = core_interface_edges(mesh_cross_section(cs));
  EXPECT_LT(longest_cap, 0.25 * 1.5);
  EXPECT_GT(longest_auto, 0.5);
  (void)n_cap;
  (void)longest_fine;
}

TEST(SizeControl, SlowerGrowthGivesMoreTriangles) {
  auto cs = single_core();
  cs.controls.interface_size = 0.03;
  cs.controls.growth = 1.1;
  const int slow = mesh_cross_section(cs).n_triangles();
  cs.controls.growth = 1.5;
  const int fast = mesh_cross_section(cs).n_triangles();
  EXPECT_GT(slow, fast * 1.3);
}
