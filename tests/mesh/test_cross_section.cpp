// Cross-section description without meshing: placements, exact areas, generators, validation.
#include <gtest/gtest.h>

#include <cmath>
#include <numbers>

#include "mesh/cross_section.hpp"
#include "mesh/error.hpp"
#include "mesh/rib_waveguide.hpp"

using namespace cladwise;
constexpr double pi = std::numbers::pi;

TEST(Placement, ComposeEqualsApplyingInnerThenOuter) {
  const Placement inner{{1.0, 2.0}, 30.0}, outer{{-3.0, 0.5}, 45.0};
  const Point2 x{0.7, -1.1};
  const Point2 a = cladwise::apply(compose(outer, inner), x);
  const Point2 b = cladwise::apply(outer, cladwise::apply(inner, x));
  EXPECT_NEAR(a[0], b[0], 1e-14);
  EXPECT_NEAR(a[1], b[1], 1e-14);
  // a quarter turn maps (1, 0) to (0, 1) (counter-clockwise, exact)
  const Point2 q = cladwise::apply(Placement{{0, 0}, 90.0}, {1.0, 0.0});
  EXPECT_NEAR(q[0], 0.0, 1e-15);
  EXPECT_NEAR(q[1], 1.0, 1e-15);
}

TEST(ExactArea, ClosedFormsOfEachShape) {
  // exact: π r², π a b, w h − (4 − π) r², shoelace, π (R² − r²)
  EXPECT_DOUBLE_EQ(exact_area(Disk{2.0}), pi * 4.0);
  EXPECT_DOUBLE_EQ(exact_area(Ellipse{3.0, 0.5}), pi * 1.5);
  EXPECT_DOUBLE_EQ(exact_area(Rectangle{4.0, 2.0, 0.5}), 8.0 - (4.0 - pi) * 0.25);
  EXPECT_DOUBLE_EQ(exact_area(Polygon{{{0, 0}, {2, 0}, {2, 1}, {0, 1}}}), 2.0);
  EXPECT_DOUBLE_EQ(exact_area(Polygon{{{0, 0}, {0, 1}, {2, 1}, {2, 0}}}), 2.0);  // clockwise too
  EXPECT_DOUBLE_EQ(exact_area(Annulus{1.0, 3.0}), pi * 8.0);
}

TEST(Generators, HexagonalLatticeSiteCount) {
  // 1 + 3 R (R + 1) sites on R hexagonal rings (exact lattice count)
  for (int rings = 0; rings <= 5; ++rings) {
    EXPECT_EQ(static_cast<int>(hexagonal_lattice(2.0, 1.0, rings, false).size()),
              1 + 3 * rings * (rings + 1));
    EXPECT_EQ(static_cast<int>(hexagonal_lattice(2.0, 1.0, rings, true).size()),
              3 * rings * (rings + 1));
  }
}

TEST(Generators, HexagonalLatticeNearestNeighboursAtPitch) {
  const auto holes = hexagonal_lattice(2.5, 1.0, 3, false);
  for (std::size_t i = 0; i < holes.size(); ++i) {
    double nearest = 1e300;
    for (std::size_t j = 0; j < holes.size(); ++j) {
      if (i == j) continue;
      const auto& a = holes[i].placement.offset;
      const auto& b = holes[j].placement.offset;
      nearest = std::min(nearest, std::hypot(a[0] - b[0], a[1] - b[1]));
    }
    EXPECT_NEAR(nearest, 2.5, 1e-12);
    EXPECT_DOUBLE_EQ(std::get<Disk>(holes[i].geometry).radius, 0.5);
  }
}

TEST(Generators, CoreRingChordEqualsPitch) {
  const auto cores = core_ring(6, 40.0, 4.0, true);  // a 7-core layout
  ASSERT_EQ(cores.size(), 7u);
  EXPECT_NEAR(std::hypot(cores[0].placement.offset[0], cores[0].placement.offset[1]), 0.0, 1e-15);
  for (int k = 1; k <= 6; ++k) {
    const auto& a = cores[k].placement.offset;
    const auto& b = cores[k % 6 + 1].placement.offset;
    EXPECT_NEAR(std::hypot(a[0] - b[0], a[1] - b[1]), 40.0, 1e-12);
  }
  const auto four = core_ring(4, 30.0, 3.0, false);
  EXPECT_NEAR(std::hypot(four[0].placement.offset[0] - four[1].placement.offset[0],
                         four[0].placement.offset[1] - four[1].placement.offset[1]),
              30.0, 1e-12);
}

TEST(Generators, SquareArrayIsCentred) {
  const auto cores = core_square_array(3, 2, 10.0, 2.0);
  ASSERT_EQ(cores.size(), 6u);
  double sx = 0, sy = 0;
  for (const auto& c : cores) {
    sx += c.placement.offset[0];
    sy += c.placement.offset[1];
  }
  EXPECT_NEAR(sx, 0.0, 1e-12);
  EXPECT_NEAR(sy, 0.0, 1e-12);
  EXPECT_NEAR(cores[1].placement.offset[0] - cores[0].placement.offset[0], 10.0, 1e-12);
}

TEST(Generators, StressRodsSymmetric) {
  const auto rods = stress_rod_pair(12.0, 5.0);
  ASSERT_EQ(rods.size(), 2u);
  EXPECT_DOUBLE_EQ(rods[0].placement.offset[0], -12.0);
  EXPECT_DOUBLE_EQ(rods[1].placement.offset[0], 12.0);
  EXPECT_THROW(stress_rod_pair(4.0, 5.0), InputError);
}

namespace {
CrossSection one_region(Shape s) {
  CrossSection cs;
  cs.background_material = "silica";
  cs.outer.radius = 20;
  cs.regions.push_back(RegionSpec{"core", "germania", {s}, 0, true, "case.toml:7 (regions[0])"});
  return cs;
}

void expect_input_error_at(const CrossSection& cs, const std::string& where) {
  try {
    validate(cs);
    FAIL() << "no InputError";
  } catch (const InputError& e) {
    EXPECT_EQ(e.where(), where);
    EXPECT_NE(std::string(e.what()).find(where), std::string::npos) << e.what();
  }
}
}  // namespace

TEST(Validate, BadShapesNameTheRegion) {
  const std::string w = "case.toml:7 (regions[0])";
  EXPECT_NO_THROW(validate(one_region(Shape{Disk{1.0}, {}})));
  expect_input_error_at(one_region(Shape{Disk{0.0}, {}}), w);
  expect_input_error_at(one_region(Shape{Disk{-1.0}, {}}), w);
  expect_input_error_at(one_region(Shape{Ellipse{1.0, -0.5}, {}}), w);
  expect_input_error_at(one_region(Shape{Rectangle{2.0, 0.0, 0.0}, {}}), w);
  expect_input_error_at(one_region(Shape{Rectangle{2.0, 1.0, 0.6}, {}}), w);  // r > min/2
  EXPECT_NO_THROW(validate(one_region(Shape{Rectangle{2.0, 1.0, 0.5}, {}})));   // r = min/2
  expect_input_error_at(one_region(Shape{Annulus{2.0, 1.0}, {}}), w);
  // bow-tie: edges 0 and 2 cross
  expect_input_error_at(one_region(Shape{Polygon{{{0, 0}, {1, 1}, {1, 0}, {0, 1}}}, {}}), w);
  // an edge running back along its neighbour
  expect_input_error_at(one_region(Shape{Polygon{{{0, 0}, {2, 0}, {1, 0}, {1, 1}}}, {}}), w);
  // a vertex touching a non-adjacent edge
  expect_input_error_at(
      one_region(Shape{Polygon{{{0, 0}, {4, 0}, {4, 2}, {2, 0}, {0, 2}}}, {}}), w);
  EXPECT_NO_THROW(validate(one_region(Shape{Polygon{{{0, 0}, {4, 0}, {4, 2}, {2, 1}, {0, 2}}}, {}})));
  auto neg = one_region(Shape{Disk{1.0}, {}});
  neg.regions[0].mesh_size = -0.1;
  expect_input_error_at(neg, w);
}

TEST(Validate, OuterAndControls) {
  auto cs = one_region(Shape{Disk{1.0}, {}});
  cs.outer.where = "case.toml:3 (outer)";
  cs.outer.radius = 0;
  expect_input_error_at(cs, "case.toml:3 (outer)");
  cs.outer.radius = 20;
  cs.outer.centre = {1.0, 0.0};
  cs.symmetry = SymmetryCut::half_right;  // cut at x = 0 needs centre x = 0
  expect_input_error_at(cs, "case.toml:3 (outer)");
  cs.outer.centre = {0.0, 0.0};
  cs.controls.order = 3;
  EXPECT_THROW(validate(cs), InputError);
}

TEST(Validate, DuplicateNamesAndReservedPrefix) {
  auto cs = one_region(Shape{Disk{1.0}, {}});
  cs.regions.push_back(cs.regions[0]);
  cs.regions[1].where = "case.toml:9 (regions[1])";
  expect_input_error_at(cs, "case.toml:9 (regions[1])");
  cs.regions[1].name = "pml_core";
  expect_input_error_at(cs, "case.toml:9 (regions[1])");
}

TEST(Sizes, AutomaticDefaults) {
  auto cs = one_region(Shape{Disk{3.0}, {}});
  EXPECT_DOUBLE_EQ(region_mesh_size(cs, 0), 0.5);     // guiding: radius / 6
  cs.regions[0].guiding = false;
  EXPECT_DOUBLE_EQ(region_mesh_size(cs, 0), 0.75);    // other: radius / 4
  EXPECT_DOUBLE_EQ(background_mesh_size(cs), 2.0);    // domain radius / 10
  cs.controls.max_size = 0.3;
  EXPECT_DOUBLE_EQ(region_mesh_size(cs, 0), 0.3);
  EXPECT_DOUBLE_EQ(background_mesh_size(cs), 0.3);
}

TEST(RibWaveguide, RegionsAndChecks) {
  RibWaveguide rib;
  rib.slab_width = 6;
  rib.slab_thickness = 0.1;
  rib.rib_width = 0.5;
  rib.rib_height = 0.12;
  rib.material = "si";
  rib.substrate_thickness = 2;
  rib.substrate_material = "sio2";
  rib.where = "rib.toml:2";
  const auto regions = rib_waveguide_regions(rib);
  ASSERT_EQ(regions.size(), 2u);
  EXPECT_EQ(regions[0].name, "substrate");
  EXPECT_TRUE(regions[1].guiding);
  double film = 0;
  for (const auto& s : regions[1].shapes) film += exact_area(s.geometry);
  EXPECT_NEAR(film, 6 * 0.1 + 0.5 * 0.12, 1e-15);  // slab + rib (exact)
  rib.sidewall_angle_deg = 45;                      // trapezoid: foot = w + 2 h
  const auto slanted = rib_waveguide_regions(rib);
  EXPECT_NEAR(exact_area(slanted[1].shapes[1].geometry), 0.5 * (0.5 + 0.74) * 0.12, 1e-14);
  rib.slab_width = 0.6;  // foot 0.74 wider than the slab
  try {
    rib_waveguide_regions(rib);
    FAIL();
  } catch (const InputError& e) {
    EXPECT_EQ(e.where(), "rib.toml:2");
  }
}
