// `cladwise solve` end to end as a user runs it: the results contract of design.md (modes.json,
// modes.csv, one .vtu per mode, a .pvd), the physics a user reads off the elliptical-core case,
// atomic output, and bad input.
#include <gtest/gtest.h>

#include <vtkDataArray.h>
#include <vtkNew.h>
#include <vtkPointData.h>
#include <vtkUnstructuredGrid.h>
#include <vtkXMLUnstructuredGridReader.h>

#include <boost/property_tree/json_parser.hpp>
#include <boost/property_tree/ptree.hpp>
#include <cmath>
#include <sstream>

#include "run_cli.hpp"

using cladwise::test::run_cli;
using cladwise::test::slurp;
using cladwise::test::source_path;
namespace fs = std::filesystem;
namespace pt = boost::property_tree;

namespace {

fs::path fresh_dir(const std::string& name) {
  const auto d = fs::temp_directory_path() / ("cladwise-" + name + "-" + std::to_string(::getpid()));
  fs::remove_all(d);
  return d;
}

/// Sum over mesh nodes of |E_x|² and |E_y|² (E_re and E_im arrays of a mode file).
std::pair<double, double> polarisation_weights(const fs::path& vtu) {
  vtkNew<vtkXMLUnstructuredGridReader> reader;
  reader->SetFileName(vtu.string().c_str());
  reader->Update();
  vtkDataArray* re = reader->GetOutput()->GetPointData()->GetArray("E_re");
  vtkDataArray* im = reader->GetOutput()->GetPointData()->GetArray("E_im");
  double wx = 0, wy = 0;
  for (vtkIdType i = 0; i < re->GetNumberOfTuples(); ++i) {
    wx += re->GetComponent(i, 0) * re->GetComponent(i, 0) + im->GetComponent(i, 0) * im->GetComponent(i, 0);
    wy += re->GetComponent(i, 1) * re->GetComponent(i, 1) + im->GetComponent(i, 1) * im->GetComponent(i, 1);
  }
  return {wx, wy};
}

}  // namespace

TEST(SolveCommand, WritesTheResultsContractForTheEllipticalCoreCase) {
  const fs::path out = fresh_dir("solve");
  const auto r = run_cli("solve " + source_path("cases/elliptical_core.toml") + " --quiet --out " + out.string());
  ASSERT_EQ(r.status, 0) << r.err;
  EXPECT_TRUE(r.err.empty()) << "--quiet prints nothing: " << r.err;

  pt::ptree j;
  pt::read_json((out / "modes.json").string(), j);
  EXPECT_EQ(j.get<std::string>("program.name"), "cladwise");
  EXPECT_FALSE(j.get<std::string>("program.version").empty());
  EXPECT_NE(j.get<std::string>("case").find("elliptical_core.toml"), std::string::npos);
  EXPECT_GT(j.get<int>("mesh.triangles"), 100);
  EXPECT_EQ(j.get<int>("mesh.order"), 2);
  EXPECT_GT(j.get<int>("mesh.dofs"), 1000);
  for (const char* k : {"mesh", "assembly", "factorization", "eigensolve", "total"}) {
    EXPECT_GE(j.get<double>(std::string("timing_s.") + k), 0.0) << k;
  }
  const auto& points = j.get_child("points");
  ASSERT_EQ(points.size(), 1u);
  const auto& point = points.begin()->second;
  EXPECT_DOUBLE_EQ(point.get<double>("wavelength_um"), 1.55);
  std::vector<double> n_eff;
  for (const auto& m : point.get_child("modes")) {
    n_eff.push_back(m.second.get<double>("n_eff"));
    EXPECT_LT(m.second.get<double>("residual"), 1e-8);
    EXPECT_EQ(m.second.get<double>("n_eff_imag"), 0.0);
    EXPECT_EQ(m.second.get<double>("loss_db_per_m"), 0.0);
    EXPECT_FALSE(m.second.get<std::string>("label").empty());
  }
  ASSERT_EQ(n_eff.size(), 2u);
  // Guided: between the cladding (1.444) and core (1.470) indices of the case; sorted descending.
  for (double n : n_eff) {
    EXPECT_GT(n, 1.444);
    EXPECT_LT(n, 1.470);
  }
  EXPECT_GT(n_eff[0], n_eff[1]);
  // Form birefringence of an elliptical core: the mode polarised along the major (x) axis has the
  // higher effective index (common practice; e.g. Snyder & Love ch. 13 for elliptical cores).
  const auto [w1x, w1y] = polarisation_weights(out / "mode_01.vtu");
  const auto [w2x, w2y] = polarisation_weights(out / "mode_02.vtu");
  EXPECT_GT(w1x, 50 * w1y);
  EXPECT_GT(w2y, 50 * w2x);
  const double birefringence = n_eff[0] - n_eff[1];
  EXPECT_GT(birefringence, 1e-5);
  EXPECT_LT(birefringence, 1e-3);
  // Reported metrics: B = n_x − n_y and the beat length L_B = λ/B (definitions), the labels of
  // the two polarisations, and an effective area that lies between the core area (π·2·1 µm²)
  // and the domain.
  const auto& m1 = point.get_child("modes").begin()->second;
  EXPECT_EQ(m1.get<std::string>("label"), "x-pol fundamental");
  EXPECT_NEAR(m1.get<double>("birefringence"), birefringence, 1e-15);
  EXPECT_NEAR(m1.get<double>("beat_length_mm"), 1.55e-3 / birefringence, 1e-9);
  EXPECT_GT(m1.get<double>("effective_area_um2"), 2 * 3.14159);
  EXPECT_LT(m1.get<double>("effective_area_um2"), 100.0);
  EXPECT_NEAR(m1.get<double>("power_fraction_core") + m1.get<double>("power_fraction_background"), 1.0, 1e-9);

  // modes.csv: a header with units in the names and one row per mode.
  std::istringstream csv(slurp(out / "modes.csv"));
  std::string header, row1, row2, extra;
  std::getline(csv, header);
  std::getline(csv, row1);
  std::getline(csv, row2);
  EXPECT_EQ(header.rfind("wavelength_um,mode,label,n_eff,n_eff_imag,loss_db_per_m,residual", 0), 0u) << header;
  EXPECT_FALSE(row2.empty());
  EXPECT_FALSE(std::getline(csv, extra) && !extra.empty());
  EXPECT_TRUE(fs::exists(out / "modes.pvd"));

  // Solving again into the same folder replaces it whole.
  const auto again = run_cli("solve " + source_path("cases/elliptical_core.toml") + " --quiet --out " + out.string());
  ASSERT_EQ(again.status, 0) << again.err;
  int entries = 0;
  for ([[maybe_unused]] const auto& e : fs::directory_iterator(out)) ++entries;
  // modes.json, modes.csv, modes.pvd, report.html, mesh.vtu, mesh_index.png, and per mode a
  // .vtu with an intensity and a polarisation picture.
  EXPECT_EQ(entries, 12);
  for (const auto& e : fs::directory_iterator(out.parent_path())) {
    EXPECT_EQ(e.path().filename().string().find(out.filename().string() + ".partial"), std::string::npos);
  }
  fs::remove_all(out);
}

TEST(SolveCommand, BadInputExitsTwoAndWritesNothing) {
  const fs::path dir = fresh_dir("solve-bad");
  fs::create_directories(dir);
  const std::string head = "wavelength_um = 1.55\n[materials]\nclad = 1.444\ncore = 1.45\n"
                           "[domain]\nradius_um = 15\nmaterial = \"clad\"\n"
                           "[[region]]\nname = \"core\"\nmaterial = \"core\"\nshape = \"disk\"\nradius_um = 4\n";
  std::ofstream(dir / "target.toml") << head << "[solve]\ntarget_index = 1.6\n";
  const fs::path out = dir / "out";
  auto r = run_cli("solve " + (dir / "target.toml").string() + " --quiet --out " + out.string());
  EXPECT_EQ(r.status, 2) << r.err;
  EXPECT_NE(r.err.find("target_index"), std::string::npos) << r.err;
  EXPECT_FALSE(fs::exists(out));

  r = run_cli("solve " + (dir / "missing.toml").string());
  EXPECT_EQ(r.status, 2);
  r = run_cli("solve");
  EXPECT_EQ(r.status, 2);
  EXPECT_NE(r.err.find("CASE.toml"), std::string::npos) << r.err;
  r = run_cli("solve " + (dir / "target.toml").string() + " --threads 0");
  EXPECT_EQ(r.status, 2);
  EXPECT_NE(r.err.find("--threads"), std::string::npos) << r.err;
  fs::remove_all(dir);
}

TEST(SolveCommand, RoundFibreModesCarryVectorLabels) {
  // The weakly guiding verification fibre guides only HE11 (V = 2.135 < 2.405; exact module),
  // both polarisations; no birefringence is claimed for a degenerate pair.
  const fs::path out = fresh_dir("smf");
  const auto r = run_cli("solve " + source_path("cases/step_index_smf.toml") + " --quiet --out " + out.string());
  ASSERT_EQ(r.status, 0) << r.err;
  pt::ptree j;
  pt::read_json((out / "modes.json").string(), j);
  for (const auto& m : j.get_child("points").begin()->second.get_child("modes")) {
    EXPECT_EQ(m.second.get<std::string>("label"), "HE11");
    EXPECT_FALSE(m.second.get_optional<double>("beat_length_mm"));
  }
  fs::remove_all(out);
}

TEST(SolveCommand, SevenCoreFibreCouplingAgainstCoupledModeTheory) {
  // Coupled-mode theory for two identical step-index cores, C = (2Δ)^½ U² K0(Wd/ρ)/(ρ V³ K1²(W))
  // (Snyder & Love, Optical Waveguide Theory, 1983, eq. 18-26; from memory): 29.419 1/m at
  // d = 20 µm for this core (checks.md §4, computed from the formula). At d/ρ ≈ 4.9 the
  // supermode splitting should agree to a few per cent.
  const fs::path out = fresh_dir("seven");
  const auto r = run_cli("solve " + source_path("cases/seven_core.toml") + " --quiet --out " + out.string());
  ASSERT_EQ(r.status, 0) << r.err;
  pt::ptree j;
  pt::read_json((out / "modes.json").string(), j);
  const auto& point = j.get_child("points").begin()->second;
  int pairs = 0;
  for (const auto& p : point.get_child("core_coupling")) {
    ++pairs;
    EXPECT_NEAR(p.second.get<double>("distance_um"), 20.0, 1e-9);
    EXPECT_NEAR(p.second.get<double>("kappa_per_m") / 29.419, 1.0, 0.03);
    EXPECT_NEAR(p.second.get<double>("coupling_length_m"),
                3.141592653589793 / (2 * p.second.get<double>("kappa_per_m")), 1e-9);
  }
  // A hexagon with its centre: 6 spokes + 6 rim neighbours, for each polarisation.
  EXPECT_EQ(pairs, 24);
  // Each of the 14 fundamental supermodes shares its power among the seven cores and the cladding.
  for (const auto& m : point.get_child("modes")) {
    double in_cores = 0;
    for (int k = 1; k <= 7; ++k) in_cores += m.second.get<double>("core_power_fraction_" + std::to_string(k));
    EXPECT_NEAR(in_cores, 1.0, 1e-9);
  }
  fs::remove_all(out);
}
