// `cladwise check` on the example cases: regions and areas as a user reads them, the mesh files
// it writes, and bad input rejected with exit 2 and nothing written.
#include <gtest/gtest.h>

#include <vtkCellData.h>
#include <vtkNew.h>
#include <vtkUnstructuredGrid.h>
#include <vtkXMLUnstructuredGridReader.h>

#include <cmath>
#include <numbers>
#include <sstream>

#include "run_cli.hpp"

using cladwise::test::run_cli;
using cladwise::test::source_path;

namespace {

/// The area_um2 column of the row that starts with `region`.
double area_of(const std::string& out, const std::string& region) {
  std::istringstream in(out);
  std::string line;
  while (std::getline(in, line)) {
    std::istringstream row(line);
    std::string name, material, role;
    double index = 0, area = 0;
    if (row >> name >> material >> role >> index >> area && name == region) return area;
  }
  return std::nan("");
}

}  // namespace

TEST(CheckCommand, ExampleCasesMeshWithExactAreas) {
  const double pi = std::numbers::pi;
  struct Expect {
    const char* file;
    const char* region;
    double exact_um2;  // exact geometry of the case's shapes
  } cases[] = {
      {"cases/elliptical_core.toml", "core", pi * 2.0 * 1.0},              // π a b
      {"cases/step_index_smf.toml", "core", pi * 4.1 * 4.1},               // π a²
      {"cases/seven_core.toml", "cores", 7 * pi * 4.1 * 4.1},              // 7 disks
      {"cases/six_hole_pcf.toml", "holes", 6 * pi * 2.5 * 2.5 / 4},        // 6 holes, quarter domain
      {"cases/bent_fibre.toml", "core", pi * 4.1 * 4.1 / 2},               // half domain
      {"cases/rib_waveguide.toml", "rib", 6.0 * 0.09 + 0.5 * 0.13},        // slab + rib rectangles
      {"cases/stress_rod_pm_fibre.toml", "rods", 2 * pi * 8.0 * 8.0},      // two rods
  };
  for (const auto& c : cases) {
    const auto r = run_cli("check " + source_path(c.file));
    ASSERT_EQ(r.status, 0) << c.file << "\n" << r.err;
    const double area = area_of(r.out, c.region);
    // Order-2 curved triangles follow the circles to O(h^4) per element (the default sizes of
    // the demo cases leave a relative area error near 1e-6..1e-5).
    EXPECT_NEAR(area / c.exact_um2, 1.0, 2e-5) << c.file << " region " << c.region << "\n" << r.out;
  }
}

TEST(CheckCommand, WritesMeshFilesThatVtkReadsBack) {
  const auto dir = std::filesystem::temp_directory_path() / ("cladwise-check-" + std::to_string(::getpid()));
  std::filesystem::remove_all(dir);
  const auto r = run_cli("check " + source_path("cases/elliptical_core.toml") + " --quiet --write-mesh " + dir.string());
  ASSERT_EQ(r.status, 0) << r.err;
  EXPECT_TRUE(r.out.empty());
  ASSERT_TRUE(std::filesystem::exists(dir / "mesh.msh"));
  vtkNew<vtkXMLUnstructuredGridReader> reader;
  reader->SetFileName((dir / "mesh.vtu").string().c_str());
  reader->Update();
  vtkUnstructuredGrid* grid = reader->GetOutput();
  ASSERT_GT(grid->GetNumberOfCells(), 100);
  EXPECT_EQ(grid->GetCellType(0), VTK_QUADRATIC_TRIANGLE);
  ASSERT_NE(grid->GetCellData()->GetArray("region"), nullptr);
  ASSERT_NE(grid->GetCellData()->GetArray("index"), nullptr);
  double range[2];
  grid->GetCellData()->GetArray("index")->GetRange(range);
  EXPECT_DOUBLE_EQ(range[0], 1.444);  // the case's cladding and core indices
  EXPECT_DOUBLE_EQ(range[1], 1.47);
  std::filesystem::remove_all(dir);
}

TEST(CheckCommand, BadInputExitsTwoNamingThePlaceAndWritesNothing) {
  const auto dir = std::filesystem::temp_directory_path() / ("cladwise-bad-" + std::to_string(::getpid()));
  std::filesystem::create_directories(dir);
  const auto write = [&](const std::string& name, const std::string& text) {
    std::ofstream(dir / name) << text;
    return (dir / name).string();
  };
  const std::string head = "wavelength_um = 1.55\n[materials]\nsilica = 1.444\ncore = 1.45\n"
                           "[domain]\nradius_um = 10\nmaterial = \"silica\"\n";
  struct Bad {
    std::string text;
    std::string expect;  // part of the message
  } bad[] = {
      {head + "[[region]]\nname = \"c\"\nmaterial = \"core\"\nshape = \"disk\"\nradius_um = 0\n", ":12"},
      {head + "[[region]]\nname = \"far\"\nmaterial = \"core\"\nshape = \"disk\"\nradius_um = 1\n"
              "centre_um = [50, 0]\n", "far"},
      {head + "[[region]]\nname = \"c\"\nmaterial = \"cor\"\nshape = \"disk\"\nradius_um = 1\n", "unknown material 'cor'"},
      {head + "[[region]]\nname = \"bow\"\nmaterial = \"core\"\nshape = \"polygon\"\n"
              "vertices_um = [[0,0],[1,1],[1,0],[0,1]]\n", "bow"},
  };
  for (const auto& b : bad) {
    const std::string path = write("bad.toml", b.text);
    const auto out_dir = dir / "mesh-out";
    const auto r = run_cli("check " + path + " --write-mesh " + out_dir.string());
    EXPECT_EQ(r.status, 2) << b.text << "\n" << r.err;
    EXPECT_NE(r.err.find(b.expect), std::string::npos) << r.err;
    EXPECT_NE(r.err.find("bad.toml"), std::string::npos) << r.err;
    EXPECT_FALSE(std::filesystem::exists(out_dir)) << "nothing may be written on bad input";
  }
  const auto missing = run_cli("check " + (dir / "does-not-exist.toml").string());
  EXPECT_EQ(missing.status, 2);
  EXPECT_NE(missing.err.find("does-not-exist.toml"), std::string::npos);
  std::filesystem::remove_all(dir);
}

TEST(CheckCommand, ImportedGmshGeometryMapsGroupsToMaterials) {
  // A .geo drawn elsewhere: a 4 µm core in a 20 µm disk; areas exact (π r²) to the order-2 error.
  const auto dir = std::filesystem::temp_directory_path() / ("cladwise-import-" + std::to_string(::getpid()));
  std::filesystem::create_directories(dir);
  std::ofstream(dir / "fibre.geo") << "SetFactory(\"OpenCASCADE\");\nDisk(1) = {0, 0, 0, 20};\n"
                                      "Disk(2) = {0, 0, 0, 4};\n"
                                      "BooleanFragments{ Surface{1}; Delete; }{ Surface{2}; Delete; }\n"
                                      "Physical Surface(\"core\") = {2};\nPhysical Surface(\"jacket\") = {3};\n";
  const std::string head = "wavelength_um = 1.55\n[materials]\nsilica = 1.444\ndoped = 1.4504\n"
                           "[import]\npath = \"fibre.geo\"\n";
  std::ofstream(dir / "ok.toml") << head << "materials = { jacket = \"silica\", core = \"doped\" }\n"
                                 << "[mesh]\norder = 2\nsize_um = 1.0\n";
  const auto r = run_cli("check " + (dir / "ok.toml").string());
  ASSERT_EQ(r.status, 0) << r.err;
  EXPECT_NEAR(area_of(r.out, "core") / (std::numbers::pi * 16.0), 1.0, 1e-5) << r.out;
  EXPECT_NEAR(area_of(r.out, "jacket") / (std::numbers::pi * (400.0 - 16.0)), 1.0, 1e-5) << r.out;
  // A physical group without a material: exit 2 naming the group.
  std::ofstream(dir / "bad.toml") << head << "materials = { core = \"doped\" }\n";
  const auto bad = run_cli("check " + (dir / "bad.toml").string());
  EXPECT_EQ(bad.status, 2);
  EXPECT_NE(bad.err.find("jacket"), std::string::npos) << bad.err;
  std::filesystem::remove_all(dir);
}
