// The ParaView collection of `cladwise solve` read back with VTK's own XML reader: every file the
// .pvd lists loads, carries the documented arrays (docs/outputs.md) with the right sizes, and the
// values are those of the solver: E_abs2 and S_z agree with E and H at every node, the fields carry
// 1 W (the normalisation of docs/conventions.md), and the intensity peaks at the power centroid
// modes.json reports.
#include <gtest/gtest.h>
#include <unistd.h>

#include <vtkCellData.h>
#include <vtkCellTypes.h>
#include <vtkDataArray.h>
#include <vtkIdList.h>
#include <vtkNew.h>
#include <vtkPointData.h>
#include <vtkUnstructuredGrid.h>
#include <vtkXMLUnstructuredGridReader.h>

#include <boost/property_tree/json_parser.hpp>
#include <boost/property_tree/ptree.hpp>
#include <cmath>
#include <regex>

#include "run_cli.hpp"

using cladwise::test::run_cli;
using cladwise::test::slurp;
using cladwise::test::source_path;
namespace fs = std::filesystem;
namespace pt = boost::property_tree;

TEST(ParaViewCollection, ReadsBackWithTheSolverValues) {
  const fs::path out = fs::temp_directory_path() / ("cladwise-report-vtk-" + std::to_string(::getpid()));
  fs::remove_all(out);
  const auto r = run_cli("solve " + source_path("cases/elliptical_core.toml") + " --quiet --out " + out.string());
  ASSERT_EQ(r.status, 0) << r.err;

  pt::ptree j;
  pt::read_json((out / "modes.json").string(), j);
  const int n_triangles = j.get<int>("mesh.triangles");
  const auto& modes = j.get_child("points").begin()->second.get_child("modes");

  // The collection lists one dataset per mode, the mode number as the series value.
  const std::string pvd = slurp(out / "modes.pvd");
  const std::regex dataset(R"re(<DataSet[^>]*timestep="([^"]+)"[^>]*file="([^"]+)")re");
  std::vector<std::pair<double, std::string>> files;
  for (auto it = std::sregex_iterator(pvd.begin(), pvd.end(), dataset); it != std::sregex_iterator(); ++it) {
    files.push_back({std::stod((*it)[1]), (*it)[2]});
  }
  ASSERT_EQ(files.size(), modes.size()) << pvd;

  auto mode_it = modes.begin();
  for (std::size_t m = 0; m < files.size(); ++m, ++mode_it) {
    EXPECT_EQ(files[m].first, static_cast<double>(m + 1));
    const fs::path vtu = out / files[m].second;
    vtkNew<vtkXMLUnstructuredGridReader> reader;
    ASSERT_TRUE(reader->CanReadFile(vtu.string().c_str())) << vtu;
    reader->SetFileName(vtu.string().c_str());
    reader->Update();
    vtkUnstructuredGrid* g = reader->GetOutput();
    ASSERT_EQ(g->GetNumberOfCells(), n_triangles);
    // Order-2 mesh: quadratic triangles only (docs/outputs.md).
    vtkNew<vtkCellTypes> types;
    g->GetCellTypes(types);
    ASSERT_EQ(types->GetNumberOfTypes(), 1);
    EXPECT_EQ(types->GetCellType(0), VTK_QUADRATIC_TRIANGLE);
    const vtkIdType n = g->GetNumberOfPoints();

    auto array = [&](const char* name, int components, bool per_cell) -> vtkDataArray* {
      vtkDataArray* a = per_cell ? g->GetCellData()->GetArray(name) : g->GetPointData()->GetArray(name);
      EXPECT_NE(a, nullptr) << name;
      if (!a) return nullptr;
      EXPECT_EQ(a->GetNumberOfComponents(), components) << name;
      EXPECT_EQ(a->GetNumberOfTuples(), per_cell ? g->GetNumberOfCells() : n) << name;
      return a;
    };
    vtkDataArray* e_re = array("E_re", 3, false);
    vtkDataArray* e_im = array("E_im", 3, false);
    vtkDataArray* h_re = array("H_re", 3, false);
    vtkDataArray* h_im = array("H_im", 3, false);
    vtkDataArray* e2 = array("E_abs2", 1, false);
    vtkDataArray* sz = array("S_z", 1, false);
    vtkDataArray* region = array("region", 1, true);
    vtkDataArray* index = array("index", 1, true);
    ASSERT_TRUE(e_re && e_im && h_re && h_im && e2 && sz && region && index);

    // Internal consistency at every node: |E|² = |E_re|² + |E_im|² and
    // S_z = ½ Re(E × H*)·ẑ = ½ (Re(E_x H_y*) − Re(E_y H_x*)) (docs/outputs.md).
    double sz_max = 0, e2_max = 0;
    for (vtkIdType i = 0; i < n; ++i) sz_max = std::max(sz_max, std::abs(sz->GetComponent(i, 0)));
    for (vtkIdType i = 0; i < n; ++i) e2_max = std::max(e2_max, e2->GetComponent(i, 0));
    ASSERT_GT(sz_max, 0);
    vtkIdType peak = 0;
    for (vtkIdType i = 0; i < n; ++i) {
      double e_abs2 = 0;
      for (int k = 0; k < 3; ++k) e_abs2 += std::pow(e_re->GetComponent(i, k), 2) + std::pow(e_im->GetComponent(i, k), 2);
      ASSERT_NEAR(e2->GetComponent(i, 0), e_abs2, 1e-12 * e2_max) << "node " << i;
      const double s = 0.5 * ((e_re->GetComponent(i, 0) * h_re->GetComponent(i, 1) + e_im->GetComponent(i, 0) * h_im->GetComponent(i, 1)) -
                              (e_re->GetComponent(i, 1) * h_re->GetComponent(i, 0) + e_im->GetComponent(i, 1) * h_im->GetComponent(i, 0)));
      ASSERT_NEAR(sz->GetComponent(i, 0), s, 1e-12 * sz_max) << "node " << i;
      if (e2->GetComponent(i, 0) > e2->GetComponent(peak, 0)) peak = i;
    }

    // 1 W: ∫ S_z dA over the quadratic interpolant of the nodal values. On a 6-node triangle the
    // corner weights of the exact rule vanish and each mid-edge node carries A/3 (straight sides;
    // Zienkiewicz & Taylor, The Finite Element Method, vol. 1, from memory). µm² → m²: 1e-12.
    double power_w = 0;
    for (vtkIdType c = 0; c < g->GetNumberOfCells(); ++c) {
      vtkNew<vtkIdList> ids;
      g->GetCellPoints(c, ids);
      double p[3][3];
      for (int k = 0; k < 3; ++k) g->GetPoint(ids->GetId(k), p[k]);
      const double area = 0.5 * std::abs((p[1][0] - p[0][0]) * (p[2][1] - p[0][1]) - (p[2][0] - p[0][0]) * (p[1][1] - p[0][1]));
      for (int k = 3; k < 6; ++k) power_w += area / 3.0 * sz->GetComponent(ids->GetId(k), 0) * 1e-12;
    }
    EXPECT_NEAR(power_w, 1.0, 1e-3) << "mode " << m + 1;

    // The peak of |E|² lies at the power centroid modes.json gives (the core centre; fundamental
    // modes of a symmetric core), within the core's fine mesh size of 0.2 µm.
    double xyz[3];
    g->GetPoint(peak, xyz);
    EXPECT_NEAR(xyz[0], mode_it->second.get<double>("centroid_x_um"), 0.2);
    EXPECT_NEAR(xyz[1], mode_it->second.get<double>("centroid_y_um"), 0.2);
    EXPECT_EQ(xyz[2], 0.0);

    // Cell data: the core (region of the higher index 1.470) and the silica cladding (1.444), the
    // indices of the case file.
    int n_core = 0;
    for (vtkIdType c = 0; c < g->GetNumberOfCells(); ++c) {
      const double nc = index->GetComponent(c, 0);
      EXPECT_TRUE(std::abs(nc - 1.444) < 1e-12 || std::abs(nc - 1.470) < 1e-12) << nc;
      if (std::abs(nc - 1.470) < 1e-12) {
        ++n_core;
        EXPECT_NE(region->GetComponent(c, 0), 0.0) << "the core is not the background region";
      }
    }
    // The 4 x 2 µm core (area 2π µm²) meshed at 0.2 µm: hundreds of triangles.
    EXPECT_GT(n_core, 100);
  }
  fs::remove_all(out);
}
