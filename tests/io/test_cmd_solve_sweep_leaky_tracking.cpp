// Mode tracking on the complex (lossy/PML) solver path of a sweep: two far-apart, practically
// uncoupled step-index cores whose fundamental modes cross in effective index inside the band,
// one core slightly absorbing. The effective indices of the isolated cores come from the exact
// step-index module (Snyder & Love ch. 12, solver/step_index): the small core's HE11 lies above
// the large core's at 1.25 µm and below it at 1.40 and 1.55 µm. Sorting by n_eff therefore swaps
// the two modes across the crossing; tracking by transverse-field overlap (io/sweep.cpp) must not:
// each track keeps its loss (the absorbing core's mode about Γ·κ·k0 in dB, first-order
// perturbation, Snyder & Love ch. 18; the other nearly lossless) at every wavelength.
#include <gtest/gtest.h>

#include <boost/property_tree/json_parser.hpp>
#include <boost/property_tree/ptree.hpp>
#include <fstream>
#include <map>
#include <vector>

#include "run_cli.hpp"
#include "solver/step_index.hpp"

using cladwise::test::run_cli;
namespace fs = std::filesystem;
namespace pt = boost::property_tree;

namespace {

// Our own scenario. Core A: radius 4.5 µm, n 1.4495; core B: radius 2.0 µm, n 1.4550 − j 1e-7;
// cladding 1.4440; centres 26 µm apart (the HE11 tails overlap by ~1e-3, so the two modes
// cross instead of repelling at this sweep spacing).
constexpr const char* kCase = R"(title = "Two uncoupled cores crossing in n_eff, one absorbing"
[sweep]
from_um = 1.25
to_um = 1.55
points = 7

[materials]
clad = 1.4440
glass_a = 1.4495
glass_b = { index = 1.4550, extinction = 1e-7 }

[domain]
shape = "disk"
radius_um = 24.0
material = "clad"

[[region]]
name = "core_a"
material = "glass_a"
shape = "disk"
radius_um = 4.5
centre_um = [-13.0, 0.0]
guiding = true
mesh_size_um = 0.8

[[region]]
name = "core_b"
material = "glass_b"
shape = "disk"
radius_um = 2.0
centre_um = [13.0, 0.0]
guiding = true
mesh_size_um = 0.5

[mesh]
order = 2
size_um = 3.0

[solve]
modes = 4
)";

double exact_he11(double n_core, double radius, double lambda) {
  return cladwise::solve_mode(cladwise::StepIndexFibre{n_core, 1.4440, radius, lambda},
                              cladwise::ModeFamily::HE, 1, 1)->n_eff;
}

}  // namespace

TEST(SolveSweepLeakyTracking, TracksKeepTheirCoreThroughAnIndexCrossing) {
  // The crossing of the isolated cores, from the exact module.
  ASSERT_GT(exact_he11(1.4550, 2.0, 1.25), exact_he11(1.4495, 4.5, 1.25));
  ASSERT_LT(exact_he11(1.4550, 2.0, 1.40), exact_he11(1.4495, 4.5, 1.40));
  ASSERT_LT(exact_he11(1.4550, 2.0, 1.55), exact_he11(1.4495, 4.5, 1.55));

  const fs::path dir = fs::temp_directory_path() / ("cladwise-leaky-track-" + std::to_string(::getpid()));
  fs::remove_all(dir);
  fs::create_directories(dir);
  std::ofstream(dir / "crossing.toml") << kCase;
  const auto r = run_cli("solve " + (dir / "crossing.toml").string() + " --quiet --out " + (dir / "out").string());
  ASSERT_EQ(r.status, 0) << r.err;
  pt::ptree j;
  pt::read_json((dir / "out" / "modes.json").string(), j);
  fs::remove_all(dir);

  // Per track: its loss and n_eff at each wavelength; per point: which track is on top.
  std::map<int, std::vector<double>> loss, n_eff;
  std::vector<double> top_loss;
  for (const auto& p : j.get_child("points")) {
    ASSERT_EQ(p.second.get_child("modes").size(), 4u);
    double top_n = 0, top_l = 0;
    for (const auto& m : p.second.get_child("modes")) {
      const int t = m.second.get<int>("track");
      loss[t].push_back(m.second.get<double>("loss_db_per_m"));
      n_eff[t].push_back(m.second.get<double>("n_eff"));
      if (m.second.get<double>("n_eff") > top_n) top_n = m.second.get<double>("n_eff"), top_l = loss[t].back();
    }
    top_loss.push_back(top_l);
  }
  ASSERT_EQ(loss.size(), 4u) << "four tracks over seven points: no track may start or end midway";
  // The absorbing core's pair is on top at 1.25 µm and below at 1.55 µm: sorting by n_eff swaps.
  EXPECT_GT(top_loss.front(), 0.5);
  EXPECT_LT(top_loss.back(), 0.05);
  int lossy_tracks = 0;
  for (const auto& [t, l] : loss) {
    ASSERT_EQ(l.size(), 7u) << "track " << t;
    const bool lossy = l.front() > 0.5;
    lossy_tracks += lossy;
    for (std::size_t i = 0; i < l.size(); ++i) {
      // Γ κ k0 · 20 log10(e) · 1e6 with Γ ≈ 0.6–0.8: about 2.5–3.5 dB/m for core B's modes;
      // core A's modes only see core B through a ~1e-3 tail overlap.
      if (lossy) EXPECT_GT(l[i], 0.5) << "track " << t << " point " << i;
      else EXPECT_LT(l[i], 0.05) << "track " << t << " point " << i;
    }
    // n_eff falls smoothly with wavelength on each track (no jump to the other core's branch).
    for (std::size_t i = 1; i < n_eff[t].size(); ++i) EXPECT_LT(n_eff[t][i], n_eff[t][i - 1]) << "track " << t;
  }
  EXPECT_EQ(lossy_tracks, 2);
}
