// `cladwise solve` on a wavelength sweep: modes tracked across the band, group index with the
// glass dispersion, chromatic dispersion, its slope and the zero-dispersion wavelength of a
// standard-like single-mode fibre against the ITU-T G.652 limits (checks.md §2), and the sweep
// outputs (sweep.csv, one .pvd per tracked mode).
#include <gtest/gtest.h>

#include <boost/property_tree/json_parser.hpp>
#include <boost/property_tree/ptree.hpp>
#include <map>

#include "run_cli.hpp"
#include "solver/material_catalogue.hpp"
#include "solver/scalar_root.hpp"
#include "solver/step_index.hpp"

using cladwise::test::run_cli;
using cladwise::test::slurp;
using cladwise::test::source_path;
namespace fs = std::filesystem;
namespace pt = boost::property_tree;

TEST(SolveSweep, StandardLikeFibreMeetsG652DispersionLimits) {
  const fs::path out = fs::temp_directory_path() / ("cladwise-sweep-" + std::to_string(::getpid()));
  fs::remove_all(out);
  const auto r = run_cli("solve " + source_path("cases/dispersion_smf.toml") + " --quiet --out " + out.string());
  ASSERT_EQ(r.status, 0) << r.err;
  pt::ptree j;
  pt::read_json((out / "modes.json").string(), j);
  ASSERT_EQ(j.get_child("points").size(), 10u);

  // Tracks keep one label each across the band; D is filled at interior points.
  std::map<int, std::string> label_of_track;
  double d_155 = 0;
  for (const auto& p : j.get_child("points")) {
    for (const auto& m : p.second.get_child("modes")) {
      const int t = m.second.get<int>("track");
      const std::string label = m.second.get<std::string>("label");
      if (!label_of_track.count(t)) label_of_track[t] = label;
      EXPECT_EQ(label_of_track[t], label);
      // Group index above the phase index and near silica's 1.4626 at 1.55 µm (checks.md §1).
      EXPECT_GT(m.second.get<double>("n_group"), m.second.get<double>("n_eff"));
      if (std::abs(p.second.get<double>("wavelength_um") - 1.55) < 1e-9) d_155 = m.second.get<double>("dispersion_ps_per_nm_km");
    }
  }
  EXPECT_EQ(label_of_track.size(), 2u) << "the HE11 pair is two tracks over the whole sweep";
  // G.652.D (checks.md §2; data sheets): D(1550) <= 18 ps/(nm km), typically about 17.
  EXPECT_GT(d_155, 15.0);
  EXPECT_LT(d_155, 18.0);
  // ITU-T G.652: zero-dispersion wavelength 1300–1324 nm, slope there at most 0.092 ps/(nm² km).
  ASSERT_FALSE(j.get_child("zero_dispersion").empty());
  for (const auto& z : j.get_child("zero_dispersion")) {
    EXPECT_GT(z.second.get<double>("wavelength_um"), 1.300);
    EXPECT_LT(z.second.get<double>("wavelength_um"), 1.324);
    EXPECT_GT(z.second.get<double>("slope_ps_per_nm2_km"), 0.073);  // G.657/G.652 S0 band 0.073–0.092
    EXPECT_LT(z.second.get<double>("slope_ps_per_nm2_km"), 0.092);
  }
  // Against the exact fibre (solver/step_index: Richardson differences of the exact HE11 β(k0) with
  // the same glasses; Snyder & Love ch. 12): the 50 nm grid's 3-point D and its linear
  // interpolation between points leave about 1 nm in the zero and 0.05 ps/(nm km) in D.
  using namespace cladwise;
  const DispersiveStepIndexFibre exact{index_model(germania_silica(0.035)), index_model(silica_malitson1965()), 4.1};
  auto d_exact = [&](double lam) {
    return step_index_dispersion(exact, lam, ModeFamily::HE, 1, 1)->dispersion_ps_per_nm_km;
  };
  const double zdw_exact = brent_root(d_exact, 1.25, 1.40, d_exact(1.25), d_exact(1.40), 1e-9);  // 1.307984
  const double s0_exact = (d_exact(zdw_exact + 1e-3) - d_exact(zdw_exact - 1e-3)) / 2.0;        // per nm
  EXPECT_NEAR(d_155, d_exact(1.55), 0.1);
  for (const auto& z : j.get_child("zero_dispersion")) {
    EXPECT_NEAR(z.second.get<double>("wavelength_um"), zdw_exact, 2e-3);
    EXPECT_NEAR(z.second.get<double>("slope_ps_per_nm2_km"), s0_exact, 0.01);
  }
  const std::string csv = slurp(out / "sweep.csv");
  EXPECT_EQ(csv.rfind("wavelength_um,track,label,n_eff,n_eff_imag,loss_db_per_m,n_group,dispersion_ps_per_nm_km", 0), 0u);
  EXPECT_TRUE(fs::exists(out / "track_01.pvd"));
  EXPECT_TRUE(fs::exists(out / "p010_mode_02.vtu"));
  fs::remove_all(out);
}
