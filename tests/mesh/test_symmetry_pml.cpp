// Symmetry cuts and the PML shell: exact fractions of exact areas, tagged cut lines on the axes.
#include <gtest/gtest.h>

#include <cmath>
#include <numbers>

#include "mesh/gmsh_mesher.hpp"
#include "mesh/rib_waveguide.hpp"
#include "mesh_checks.hpp"

using namespace cladwise;
using namespace cladwise::test;
constexpr double pi = std::numbers::pi;

namespace {

// A polarisation-maintaining fibre: core, two stress rods on the x axis, elliptical inner clad;
// mirror-symmetric about both axes.
CrossSection panda(SymmetryCut cut, double pml = 0) {
  CrossSection cs;
  cs.background_material = "silica";
  cs.outer.radius = 12;
  cs.outer.pml_thickness = pml;
  cs.symmetry = cut;
  cs.controls.order = 2;
  cs.regions.push_back(RegionSpec{"inner", "sio2_f", {Shape{Ellipse{3.0, 2.0}, {}}}, 0.12, false, "t:1"});
  cs.regions.push_back(RegionSpec{"rods", "b2o3", stress_rod_pair(6.0, 2.0), 0.2, false, "t:2"});
  cs.regions.push_back(RegionSpec{"core", "ge", {Shape{Disk{1.0}, {}}}, 0.08, true, "t:3"});
  return cs;
}

void expect_cut_edges_on_axis(const Mesh& m, const std::string& name, int axis) {
  const int b = boundary_index(m, name);
  ASSERT_GE(b, 0) << "no boundary " << name;
  int n = 0;
  for (std::size_t i = 0; i < m.boundary_edges.size(); ++i) {
    if (m.boundary_edge_tag[i] != b) continue;
    const int e = m.boundary_edges[i];
    EXPECT_LT(std::abs(m.nodes[m.edges[e][0]][axis]), 1e-12);
    EXPECT_LT(std::abs(m.nodes[m.edges[e][1]][axis]), 1e-12);
    EXPECT_LT(std::abs(m.nodes[m.edge_midnode[e]][axis]), 1e-12);
    ++n;
  }
  EXPECT_GT(n, 10);
}

}  // namespace

TEST(SymmetryCut, QuarterAndHalvesMeshExactFractions) {
  // exact full areas: π a b, 2 π r², π r², π R² (disk domain)
  const double inner = pi * 3.0 * 2.0 - pi * 1.0, rods = 2 * pi * 4.0, core = pi * 1.0;
  const struct {
    SymmetryCut cut;
    double fraction;
  } cases[] = {{SymmetryCut::none, 1.0},
               {SymmetryCut::half_upper, 0.5},
               {SymmetryCut::half_right, 0.5},
               {SymmetryCut::quarter, 0.25}};
  for (const auto& c : cases) {
    const Mesh m = mesh_cross_section(panda(c.cut));
    expect_conforming(m);
    EXPECT_NEAR(region_area(m, "core") / (c.fraction * core), 1.0, 1e-6);
    EXPECT_NEAR(region_area(m, "inner") / (c.fraction * inner), 1.0, 1e-6);
    EXPECT_NEAR(region_area(m, "rods") / (c.fraction * rods), 1.0, 1e-6);
    double total = 0;
    for (double a : region_areas(m)) total += a;
    EXPECT_NEAR(total / (c.fraction * pi * 144.0), 1.0, 1e-6);
    const bool y0 = c.cut == SymmetryCut::half_upper || c.cut == SymmetryCut::quarter;
    const bool x0 = c.cut == SymmetryCut::half_right || c.cut == SymmetryCut::quarter;
    EXPECT_EQ(boundary_index(m, "cut_y0") >= 0, y0);
    EXPECT_EQ(boundary_index(m, "cut_x0") >= 0, x0);
    if (y0) {
      expect_cut_edges_on_axis(m, "cut_y0", 1);
      EXPECT_EQ(m.boundaries[boundary_index(m, "cut_y0")].kind, BoundaryKind::symmetry_x);
    }
    if (x0) {
      expect_cut_edges_on_axis(m, "cut_x0", 0);
      EXPECT_EQ(m.boundaries[boundary_index(m, "cut_x0")].kind, BoundaryKind::symmetry_y);
    }
    // nothing of the removed half survives
    for (const auto& p : m.nodes) {
      if (y0) {
        EXPECT_GE(p[1], -1e-12);
      }
      if (x0) {
        EXPECT_GE(p[0], -1e-12);
      }
    }
  }
}

TEST(Pml, AnnularShellAroundDiskDomain) {
  const Mesh m = mesh_cross_section(panda(SymmetryCut::quarter, 3.0));
  expect_conforming(m);
  const int p = region_index(m, "pml");
  ASSERT_GE(p, 0);
  EXPECT_EQ(m.regions[p].role, RegionRole::pml);
  EXPECT_EQ(m.regions[p].material, "silica");
  EXPECT_EQ(m.regions[region_index(m, "background")].role, RegionRole::physical);
  // quarter of π ((R + t)² − R²), exact annulus
  EXPECT_NEAR(region_area(m, "pml") / (0.25 * pi * (15.0 * 15.0 - 144.0)), 1.0, 1e-6);
  // the outer wall is the PML's outer circle r = 15
  const int outer = boundary_index(m, "outer");
  ASSERT_GE(outer, 0);
  for (std::size_t i = 0; i < m.boundary_edges.size(); ++i) {
    if (m.boundary_edge_tag[i] != outer) continue;
    const auto& v = m.nodes[m.edge_midnode[m.boundary_edges[i]]];
    EXPECT_NEAR(std::hypot(v[0], v[1]), 15.0, 1e-11);
  }
}

TEST(Pml, RectangularFrameAndRegionsContinuingIntoIt) {
  RibWaveguide rib;
  rib.slab_width = 20;  // wider than the 8 µm domain: the slab continues into the absorber
  rib.slab_thickness = 0.15;
  rib.rib_width = 0.8;
  rib.rib_height = 0.25;
  rib.material = "si";
  rib.substrate_thickness = 10;
  rib.substrate_material = "sio2";
  rib.substrate_width = 20;
  rib.mesh_size = 0.05;
  CrossSection cs;
  cs.background_material = "air";
  cs.outer.kind = OuterBoundary::Kind::rectangle;
  cs.outer.width = 8;
  cs.outer.height = 4;
  cs.outer.pml_thickness = 1;
  cs.regions = rib_waveguide_regions(rib);
  cs.controls.order = 1;
  MeshReport report;
  const Mesh m = mesh_cross_section(cs, &report);
  expect_conforming(m);
  // frame: (W + 2t)(H + 2t) − W H (exact, straight sides), split among pml, pml_substrate, pml_rib
  double pml = 0;
  for (std::size_t r = 0; r < m.regions.size(); ++r) {
    if (m.regions[r].role == RegionRole::pml) pml += region_areas(m)[r];
  }
  EXPECT_NEAR(pml, 10.0 * 6.0 - 32.0, 1e-10);
  const int pr = region_index(m, "pml_rib");
  ASSERT_GE(pr, 0);
  EXPECT_EQ(m.regions[pr].material, "si");
  EXPECT_EQ(m.regions[region_index(m, "pml_substrate")].material, "sio2");
  // inside the domain: slab 8 × 0.15 + rib 0.8 × 0.25, substrate 8 × 2 (exact rectangles)
  EXPECT_NEAR(region_area(m, "rib"), 8 * 0.15 + 0.8 * 0.25, 1e-12);
  EXPECT_NEAR(region_area(m, "substrate"), 8 * 2.0, 1e-12);
  EXPECT_NEAR(region_area(m, "pml_rib"), 2 * 1 * 0.15, 1e-12);
  EXPECT_GT(report.min_quality, 0.2);
}
