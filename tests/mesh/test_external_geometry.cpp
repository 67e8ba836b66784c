// External geometry: a Gmsh .geo script, a BREP file, .msh round trip through write_msh/import_msh.
#include <gtest/gtest.h>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <numbers>

#include "mesh/error.hpp"
#include "mesh/external_geometry.hpp"
#include "mesh/gmsh_mesher.hpp"
#include "mesh_checks.hpp"

using namespace cladwise;
using namespace cladwise::test;
constexpr double pi = std::numbers::pi;

namespace {

std::string temp_path(const std::string& name) {
  const auto dir = std::filesystem::path(testing::TempDir()) / "cladwise_mesh_external";
  std::filesystem::create_directories(dir);
  return (dir / name).string();
}

// A step-index fibre drawn with Gmsh's built-in kernel: disk r = 1.5 in a 10 × 10 square.
std::string write_fibre_geo() {
  const std::string path = temp_path("fibre.geo");
  std::ofstream f(path);
  f << "Point(1) = {0, 0, 0}; Point(2) = {1.5, 0, 0}; Point(3) = {0, 1.5, 0};\n"
       "Point(4) = {-1.5, 0, 0}; Point(5) = {0, -1.5, 0};\n"
       "Circle(1) = {2, 1, 3}; Circle(2) = {3, 1, 4}; Circle(3) = {4, 1, 5}; Circle(4) = {5, 1, 2};\n"
       "Point(6) = {-5, -5, 0}; Point(7) = {5, -5, 0}; Point(8) = {5, 5, 0}; Point(9) = {-5, 5, 0};\n"
       "Line(5) = {6, 7}; Line(6) = {7, 8}; Line(7) = {8, 9}; Line(8) = {9, 6};\n"
       "Curve Loop(1) = {1, 2, 3, 4}; Plane Surface(1) = {1};\n"
       "Curve Loop(2) = {5, 6, 7, 8}; Plane Surface(2) = {2, 1};\n"
       "Physical Surface(\"core\") = {1};\nPhysical Surface(\"clad\") = {2};\n"
       "Physical Curve(\"outer\") = {5, 6, 7, 8};\n";
  return path;
}

}  // namespace

TEST(ExternalGeometry, GeoScriptWithNamedGroups) {
  ExternalGeometry g;
  g.path = write_fibre_geo();
  g.materials = {{"core", "germania_silica"}, {"clad", "silica"}};
  g.sizes = {{"core", 0.12}};
  g.controls.order = 2;
  MeshReport report;
  const Mesh m = mesh_external_geometry(g, &report);
  expect_conforming(m);
  EXPECT_EQ(m.regions[region_index(m, "core")].material, "germania_silica");
  // exact: π r² and the square minus it
  EXPECT_NEAR(region_area(m, "core") / (pi * 2.25), 1.0, 1e-6);
  EXPECT_NEAR(region_area(m, "core") + region_area(m, "clad"), 100.0, 1e-10);
  ASSERT_EQ(m.boundaries.size(), 1u);
  EXPECT_EQ(m.boundaries[0].name, "outer");
  EXPECT_EQ(report.order, 2);
}

TEST(ExternalGeometry, GroupWithoutMaterialNamesGroupAndFile) {
  ExternalGeometry g;
  g.path = write_fibre_geo();
  g.materials = {{"core", "germania_silica"}};
  try {
    mesh_external_geometry(g);
    FAIL();
  } catch (const InputError& e) {
    const std::string msg = e.what();
    EXPECT_NE(msg.find("'clad'"), std::string::npos) << msg;
    EXPECT_NE(msg.find(g.path), std::string::npos) << msg;
  }
}

TEST(ExternalGeometry, MissingFileAndBrokenScript) {
  ExternalGeometry g;
  g.path = temp_path("nowhere.geo");
  EXPECT_THROW(mesh_external_geometry(g), InputError);
  g.path = temp_path("broken.geo");
  std::ofstream(g.path) << "Point(1) = {0, 0, 0;\nThis is not a geo script\n";
  EXPECT_THROW(mesh_external_geometry(g), ComputationError);
}

TEST(ExternalGeometry, BrepWrittenFromCrossSectionMeshesAgain) {
  CrossSection cs;
  cs.background_material = "silica";
  cs.outer.kind = OuterBoundary::Kind::rectangle;
  cs.outer.width = 6;
  cs.outer.height = 4;
  cs.controls.order = 1;
  cs.regions.push_back(RegionSpec{"core", "ge", {Shape{Disk{1.0}, {}}}, 0.2, true, "t"});
  const std::string brep = temp_path("section.brep");
  mesh_cross_section(cs, nullptr, brep);
  ASSERT_TRUE(std::filesystem::exists(brep));
  ExternalGeometry g;
  g.path = brep;
  for (int n = 1; n <= 10; ++n) g.materials["surface_" + std::to_string(n)] = "glass";
  g.controls.order = 2;
  g.controls.default_size = 0.15;
  const Mesh m = mesh_external_geometry(g);
  expect_conforming(m);
  double total = 0;
  for (double a : region_areas(m)) total += a;
  EXPECT_NEAR(total, 24.0, 1e-10);  // exact rectangle
  EXPECT_EQ(m.regions.size(), 2u);  // the disk and the rectangle around it
}

TEST(MshFiles, WriteAndImportRoundTrip) {
  CrossSection cs;
  cs.background_material = "silica";
  cs.outer.radius = 5;
  cs.symmetry = SymmetryCut::half_upper;
  cs.controls.order = 2;
  cs.regions.push_back(RegionSpec{"core", "ge", {Shape{Ellipse{1.5, 0.8}, {{0, 0}, 0}}}, 0, true, "t"});
  const Mesh original = mesh_cross_section(cs);
  const std::string path = temp_path("roundtrip.msh");
  write_msh(original, path);
  const Mesh back = import_msh(path, {{"background", "silica"}, {"core", "ge"}});
  EXPECT_EQ(back.order, 2);
  EXPECT_EQ(back.n_triangles(), original.n_triangles());
  EXPECT_EQ(back.n_nodes(), original.n_nodes());
  EXPECT_EQ(back.n_vertices, original.n_vertices);
  expect_conforming(back);
  EXPECT_NEAR(region_area(back, "core"), region_area(original, "core"), 1e-12);
  EXPECT_EQ(boundary_index(back, "cut_y0") >= 0, true);
  EXPECT_EQ(back.boundary_edges.size(), original.boundary_edges.size());
  // the mesher's own .msh output imports too
  const std::string direct = temp_path("direct.msh");
  mesh_cross_section(cs, nullptr, direct);
  const Mesh again = import_msh(direct, {{"background", "silica"}, {"core", "ge"}});
  EXPECT_EQ(again.n_triangles(), original.n_triangles());
  EXPECT_THROW(import_msh(direct, {{"core", "ge"}}), InputError);
}
