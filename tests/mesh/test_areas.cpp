// Region areas of meshed cross-sections against exact closed forms, and the observed convergence
// rate of the area error under refinement (order 1: O(h²) chord error; order 2: O(h⁴)).
#include <gtest/gtest.h>

#include <cmath>
#include <numbers>

#include "mesh/gmsh_mesher.hpp"
#include "mesh_checks.hpp"

using namespace cladwise;
using cladwise::test::region_area;
constexpr double pi = std::numbers::pi;

namespace {

// Four interfaces of different kinds in one disk domain; sizes scale with 1/refine.
CrossSection four_shapes(int order, double refine) {
  CrossSection cs;
  cs.background_material = "silica";
  cs.outer.radius = 10;
  cs.controls.order = order;
  cs.regions.push_back(RegionSpec{"ellipse", "doped", {Shape{Ellipse{2.0, 1.0}, {{-4, 0}, 30}}},
                                  1.0 / refine, true, "t:1"});
  cs.regions.push_back(RegionSpec{"rounded", "glass",
                                  {Shape{Rectangle{3.0, 2.0, 0.5}, {{4, 0}, 10}}}, 0.5 / refine,
                                  false, "t:2"});
  cs.regions.push_back(RegionSpec{"ring", "fluorine", {Shape{Annulus{1.0, 1.5}, {{0, 5}, 0}}},
                                  1.0 / refine, false, "t:3"});
  RegionSpec holes{"holes", "air", hexagonal_lattice(1.0, 0.5, 2, true), 0.25 / refine, false, "t:4"};
  for (auto& s : holes.shapes) s.placement.offset[1] -= 5;
  cs.regions.push_back(holes);
  return cs;
}

double observed_rate(double e_coarse, double e_fine, double refinement) {
  return std::log(std::abs(e_coarse / e_fine)) / std::log(refinement);
}

}  // namespace

TEST(RegionAreas, Order2MatchesExactAreas) {
  MeshReport report;
  const Mesh mesh = mesh_cross_section(four_shapes(2, 8.0), &report);
  // exact: π a b (ellipse at 30°), w h − (4 − π) r² (rounded rectangle), π (R² − r²) (annulus),
  // (1 + 3 R (R + 1) − 1) π (d/2)² for R = 2 rings without the centre (18 holes)
  EXPECT_NEAR(region_area(mesh, "ellipse") / (pi * 2.0 * 1.0), 1.0, 1e-6);
  EXPECT_NEAR(region_area(mesh, "rounded") / (6.0 - (4.0 - pi) * 0.25), 1.0, 1e-6);
  EXPECT_NEAR(region_area(mesh, "ring") / (pi * (1.5 * 1.5 - 1.0)), 1.0, 1e-6);
  EXPECT_NEAR(region_area(mesh, "holes") / ((1 + 3 * 2 * 3 - 1) * pi * 0.25 * 0.25), 1.0, 1e-6);
  // the report carries the same areas, per region, with counts and qualities
  ASSERT_EQ(report.regions.size(), mesh.regions.size());
  double total = 0;
  int n = 0;
  for (const auto& r : report.regions) {
    total += r.area;
    n += r.n_triangles;
    EXPECT_GT(r.min_quality, 0.3) << r.name;
    EXPECT_GT(r.mean_quality, 0.85) << r.name;
  }
  EXPECT_EQ(n, mesh.n_triangles());
  EXPECT_EQ(report.order, 2);
  EXPECT_EQ(report.n_nodes, mesh.n_nodes());
  EXPECT_GT(report.min_jacobian_ratio, 0.5);
  EXPECT_GT(report.seconds, 0.0);
  // painting keeps the whole disk: π R² (outer circle meshed at size R/10, curved: ~2e-7)
  EXPECT_NEAR(total / (pi * 100.0), 1.0, 1e-6);
}

TEST(RegionAreas, Order1ConvergesAtRateTwo) {
  double e_disk[3], e_ellipse[3];
  for (int k = 0; k < 3; ++k) {
    CrossSection cs;
    cs.background_material = "silica";
    cs.outer.radius = 4;
    cs.controls.order = 1;
    const double h = 0.2 / std::pow(2.0, k);
    cs.regions.push_back(RegionSpec{"core", "g", {Shape{Disk{1.0}, {{-1.5, 0}, 0}}}, h, true, "t"});
    cs.regions.push_back(
        RegionSpec{"ell", "g", {Shape{Ellipse{0.6, 1.2}, {{1.5, 0}, 20}}}, h, true, "t"});
    const Mesh mesh = mesh_cross_section(cs);
    e_disk[k] = region_area(mesh, "core") - pi;
    e_ellipse[k] = region_area(mesh, "ell") - pi * 0.72;
  }
  for (int k = 0; k < 2; ++k) {
    // inscribed polygons: area error ∝ h² (sagitta h²/8r per chord)
    EXPECT_NEAR(observed_rate(e_disk[k], e_disk[k + 1], 2.0), 2.0, 0.25);
    EXPECT_NEAR(observed_rate(e_ellipse[k], e_ellipse[k + 1], 2.0), 2.0, 0.25);
    EXPECT_LT(e_disk[k], 0.0);  // inscribed: always smaller
  }
}

TEST(RegionAreas, Order2ConvergesFasterThanH3) {
  double e[3];
  for (int k = 0; k < 3; ++k) {
    CrossSection cs;
    cs.background_material = "silica";
    cs.outer.radius = 4;
    cs.controls.order = 2;
    cs.regions.push_back(RegionSpec{"core", "g", {Shape{Disk{1.0}, {}}}, 0.4 / std::pow(2.0, k),
                                    true, "t"});
    e[k] = region_area(mesh_cross_section(cs), "core") - pi;
  }
  // quadratic interpolation of the arc: the O(h³) deviation integrates to zero over each chord,
  // leaving an O(h⁴) area error
  EXPECT_GT(observed_rate(e[0], e[1], 2.0), 3.5);
  EXPECT_GT(observed_rate(e[1], e[2], 2.0), 3.5);
}
