// `cladwise solve` with a [cutoff] section: the cutoff wavelength of the TE01 mode of a few-mode
// step-index fibre by the bracketing search, against the exact open-cladding value
// λ_c = 2π a NA / 2.404826 (first zero of J0, Abramowitz & Stegun Table 9.5). The electric wall
// at 8a shifts the walled structure's cutoff by about −0.5 % (docs/step-index.md, "Dispersion").
#include <gtest/gtest.h>

#include <boost/property_tree/json_parser.hpp>
#include <boost/property_tree/ptree.hpp>
#include <cmath>

#include "run_cli.hpp"

using cladwise::test::run_cli;
namespace fs = std::filesystem;
namespace pt = boost::property_tree;

TEST(SolveCutoff, Te01CutoffOfAFewModeFibre) {
  const fs::path dir = fs::temp_directory_path() / ("cladwise-cutoff-" + std::to_string(::getpid()));
  fs::create_directories(dir);
  std::ofstream(dir / "case.toml") << R"(wavelength_um = 1.55
[materials]
cladding = 1.4447
core = 1.4504
[domain]
radius_um = 48.0
material = "cladding"
[[region]]
name = "core"
material = "core"
shape = "disk"
radius_um = 6.0
guiding = true
mesh_size_um = 0.8
[mesh]
size_um = 4.0
[solve]
modes = 3
[cutoff]
mode = 3
to_um = 2.4
)";
  const auto r = run_cli("solve " + (dir / "case.toml").string() + " --quiet --out " + (dir / "out").string());
  ASSERT_EQ(r.status, 0) << r.err;
  pt::ptree j;
  pt::read_json((dir / "out" / "modes.json").string(), j);
  EXPECT_EQ(j.get<std::string>("cutoff.status"), "found");
  const double na = std::sqrt(1.4504 * 1.4504 - 1.4447 * 1.4447);
  const double exact = 2 * 3.141592653589793 * 6.0 * na / 2.404826;
  EXPECT_NEAR(j.get<double>("cutoff.wavelength_um") / exact, 1.0, 0.01);
  EXPECT_LE(j.get<int>("cutoff.solves"), 15);
  fs::remove_all(dir);
}
