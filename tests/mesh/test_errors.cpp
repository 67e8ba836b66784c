// Bad geometry reaches the user as InputError naming the region's `where`.
#include <gtest/gtest.h>

#include <string>

#include "mesh/error.hpp"
#include "mesh/gmsh_mesher.hpp"

using namespace cladwise;

namespace {

CrossSection base() {
  CrossSection cs;
  cs.background_material = "silica";
  cs.outer.radius = 10;
  cs.controls.order = 1;
  cs.regions.push_back(RegionSpec{"core", "ge", {Shape{Disk{1.0}, {}}}, 0, true, "fibre.toml:12 (regions[0])"});
  return cs;
}

void expect_input_error(const CrossSection& cs, const std::string& where, const std::string& hint) {
  try {
    mesh_cross_section(cs);
    FAIL() << "expected InputError at " << where;
  } catch (const InputError& e) {
    const std::string msg = e.what();
    EXPECT_EQ(e.where(), where) << msg;
    EXPECT_NE(msg.find(where), std::string::npos) << msg;
    EXPECT_NE(msg.find(hint), std::string::npos) << msg;
  }
}

}  // namespace

TEST(BadGeometry, ZeroAndNegativeSizes) {
  auto cs = base();
  std::get<Disk>(cs.regions[0].shapes[0].geometry).radius = 0;
  expect_input_error(cs, "fibre.toml:12 (regions[0])", "radius");
  std::get<Disk>(cs.regions[0].shapes[0].geometry).radius = -2;
  expect_input_error(cs, "fibre.toml:12 (regions[0])", "radius");
  cs = base();
  cs.regions[0].shapes[0].geometry = Rectangle{-1.0, 1.0, 0.0};
  expect_input_error(cs, "fibre.toml:12 (regions[0])", "width");
}

TEST(BadGeometry, RegionEntirelyOutsideTheDomain) {
  auto cs = base();
  cs.regions.push_back(RegionSpec{"stray", "ge", {Shape{Disk{1.0}, {{30, 0}, 0}}}, 0, false, "fibre.toml:20 (regions[1])"});
  expect_input_error(cs, "fibre.toml:20 (regions[1])", "outside");
}

TEST(BadGeometry, RegionEntirelyCoveredByLaterRegions) {
  auto cs = base();
  cs.regions.push_back(RegionSpec{"big", "f", {Shape{Disk{2.0}, {{0.5, 0}, 0}}}, 0, false, "fibre.toml:20 (regions[1])"});
  expect_input_error(cs, "fibre.toml:12 (regions[0])", "covered");
}

TEST(BadGeometry, SelfIntersectingPolygon) {
  auto cs = base();
  cs.regions[0].shapes[0].geometry = Polygon{{{0, 0}, {2, 2}, {2, 0}, {0, 2}}};
  expect_input_error(cs, "fibre.toml:12 (regions[0])", "self-intersecting");
}

TEST(BadGeometry, CornerRadiusTooLarge) {
  auto cs = base();
  cs.regions[0].shapes[0].geometry = Rectangle{2.0, 1.0, 0.75};
  expect_input_error(cs, "fibre.toml:12 (regions[0])", "corner_radius");
}

TEST(BadGeometry, StadiumAtTheLimitMeshes) {
  // corner_radius = height / 2 exactly: the straight vertical sides vanish; still a valid shape
  auto cs = base();
  cs.regions[0].shapes[0].geometry = Rectangle{4.0, 1.0, 0.5};
  EXPECT_NO_THROW(mesh_cross_section(cs));
}
