// `cladwise solve` on cases/coupler_crossing.toml: two unequal cores whose isolated fundamental
// modes cross in the band, so their supermodes meet in an avoided crossing. Mode tracking by
// transverse-field overlap (io/sweep.cpp) must follow each supermode through it: continuous n_eff
// on every track, the upper pair always above the lower, and a field character (power in each
// core) that passes smoothly from one core to the other. The crossing of the isolated cores comes
// from the exact step-index modes of each core alone (Snyder & Love ch. 12, solver/step_index)
// with the Malitson 1965 / Fleming 1984 glasses (checks.md §1; mixing rule common practice).
#include <gtest/gtest.h>

#include <algorithm>
#include <boost/property_tree/json_parser.hpp>
#include <boost/property_tree/ptree.hpp>
#include <cmath>
#include <map>

#include "run_cli.hpp"
#include "solver/material_catalogue.hpp"
#include "solver/scalar_root.hpp"
#include "solver/step_index.hpp"

using cladwise::test::run_cli;
using cladwise::test::source_path;
namespace fs = std::filesystem;
namespace pt = boost::property_tree;

namespace {

struct TrackPoint {
  double lambda, n_eff, in_a, in_b, angle_deg;
};

// Wavelength where the isolated cores' HE11 indices cross (exact modes of each core alone).
double isolated_crossing_um() {
  using namespace cladwise;
  const DispersionModel clad = silica_malitson1965(), a = germania_silica(0.030), b = germania_silica(0.065);
  auto diff = [&](double lam) {
    const auto ma = solve_mode(StepIndexFibre{a.index(lam), clad.index(lam), 4.5, lam}, ModeFamily::HE, 1, 1);
    const auto mb = solve_mode(StepIndexFibre{b.index(lam), clad.index(lam), 2.0, lam}, ModeFamily::HE, 1, 1);
    return ma->n_eff - mb->n_eff;
  };
  return brent_root(diff, 1.25, 1.55, diff(1.25), diff(1.55), 1e-9);
}

}  // namespace

TEST(SolveSweepCrossing, TracksFollowTheSupermodesThroughTheAvoidedCrossing) {
  const fs::path out = fs::temp_directory_path() / ("cladwise-crossing-" + std::to_string(::getpid()));
  fs::remove_all(out);
  const auto r = run_cli("solve " + source_path("cases/coupler_crossing.toml") + " --quiet --out " + out.string());
  ASSERT_EQ(r.status, 0) << r.err;
  pt::ptree j;
  pt::read_json((out / "modes.json").string(), j);
  fs::remove_all(out);

  std::map<int, std::vector<TrackPoint>> tracks;
  for (const auto& p : j.get_child("points")) {
    ASSERT_EQ(p.second.get_child("modes").size(), 4u);
    for (const auto& m : p.second.get_child("modes")) {
      tracks[m.second.get<int>("track")].push_back(
          {p.second.get<double>("wavelength_um"), m.second.get<double>("n_eff"),
           m.second.get<double>("power_fraction_core_a"), m.second.get<double>("power_fraction_core_b"),
           m.second.get<double>("polarisation_angle_deg")});
    }
  }
  // Four tracks (two supermodes × two polarisations), each present at all 9 points.
  ASSERT_EQ(tracks.size(), 4u);
  for (const auto& [t, pts] : tracks) ASSERT_EQ(pts.size(), 9u) << "track " << t;

  // Upper pair: the two tracks highest at the first wavelength.
  std::vector<int> order;
  for (const auto& [t, pts] : tracks) order.push_back(t);
  std::sort(order.begin(), order.end(), [&](int x, int y) { return tracks[x][0].n_eff > tracks[y][0].n_eff; });
  const std::vector<int> upper{order[0], order[1]}, lower{order[2], order[3]};

  double min_gap = 1.0, lambda_min_gap = 0.0;
  for (std::size_t k = 0; k < 9; ++k) {
    const double lo_upper = std::min(tracks[upper[0]][k].n_eff, tracks[upper[1]][k].n_eff);
    const double hi_lower = std::max(tracks[lower[0]][k].n_eff, tracks[lower[1]][k].n_eff);
    // No swap: a diabatic jump onto the other branch would put an "upper" track below a lower one.
    EXPECT_GT(lo_upper, hi_lower) << tracks[upper[0]][k].lambda;
    if (lo_upper - hi_lower < min_gap) {
      min_gap = lo_upper - hi_lower;
      lambda_min_gap = tracks[upper[0]][k].lambda;
    }
  }
  // An avoided crossing: the gap closes to a minimum inside the band, near where the isolated
  // cores' indices cross (each core shifts the other's index a little, so within two steps).
  const double lx = isolated_crossing_um();
  EXPECT_GT(lambda_min_gap, 1.25 + 1e-9);
  EXPECT_LT(lambda_min_gap, 1.55 - 1e-9);
  EXPECT_NEAR(lambda_min_gap, lx, 0.075) << "isolated cores cross at " << lx;
  EXPECT_GT(min_gap, 5e-5);  // the coupling keeps the branches apart

  for (const auto& [t, pts] : tracks) {
    for (std::size_t k = 1; k + 1 < pts.size(); ++k) {
      // n_eff continuous: the change between steps varies slowly (second difference well below
      // the first); a jump across the gap (~1.5e-4 against steps of ~5.5e-4) would break this.
      const double d1 = pts[k + 1].n_eff - pts[k].n_eff, d0 = pts[k].n_eff - pts[k - 1].n_eff;
      EXPECT_LT(std::fabs(d1 - d0), 0.12 * std::fabs(d0)) << "track " << t << " at " << pts[k].lambda;
    }
    for (std::size_t k = 1; k < pts.size(); ++k) {
      // Field character continuous: power per core and polarisation angle change gradually.
      EXPECT_LT(std::fabs(pts[k].in_a - pts[k - 1].in_a), 0.3) << "track " << t << " at " << pts[k].lambda;
      EXPECT_LT(std::fabs(pts[k].in_b - pts[k - 1].in_b), 0.3) << "track " << t << " at " << pts[k].lambda;
      double dang = std::fabs(pts[k].angle_deg - pts[k - 1].angle_deg);
      dang = std::min(dang, 180.0 - dang);  // a polarisation angle is defined modulo 180°
      EXPECT_LT(dang, 30.0) << "track " << t << " at " << pts[k].lambda;
    }
  }
  // The character exchange: the upper supermode lives in the small core B at the short end and in
  // the large core A at the long end; the lower one the other way round.
  for (int t : upper) {
    EXPECT_GT(tracks[t].front().in_b, 2 * tracks[t].front().in_a);
    EXPECT_GT(tracks[t].back().in_a, 2 * tracks[t].back().in_b);
  }
  for (int t : lower) {
    EXPECT_GT(tracks[t].front().in_a, 2 * tracks[t].front().in_b);
    EXPECT_GT(tracks[t].back().in_b, 2 * tracks[t].back().in_a);
  }
}
