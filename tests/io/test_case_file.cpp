// Case-file reader: valid cases map to the cross-section description; bad input is rejected with
// the file, line and key in the message (design.md: "Errors ... naming file, line and key").
#include <gtest/gtest.h>

#include <cmath>
#include <fstream>
#include <sstream>

#include "io/case_file.hpp"
#include "io/case_keys.hpp"
#include "mesh/error.hpp"
#include "run_cli.hpp"

using namespace cladwise;
using namespace cladwise::io;

namespace {

const char* kEllipticalCore = R"(
title = "elliptical core"
wavelength_um = 1.55

[materials]
silica = 1.444
core_glass = { index = 1.4504 }
crystal = { permittivity = [2.1, 2.1, 2.2] }

[domain]
shape = "disk"
radius_um = 30
material = "silica"
symmetry = "quarter"

[[region]]
name = "core"
material = "core_glass"
shape = "ellipse"
semi_axes_um = [3.0, 1.5]
rotation_deg = 30
guiding = true
mesh_size_um = 0.25

[mesh]
order = 2
size_um = 2.0

[solve]
modes = 4
)";

std::string error_of(const std::string& text) {
  try {
    read_case_text(text, "bad.toml");
  } catch (const InputError& e) {
    return e.what();
  }
  return "";
}

std::string replace(std::string s, const std::string& from, const std::string& to) {
  const auto pos = s.find(from);
  EXPECT_NE(pos, std::string::npos) << from;
  return s.replace(pos, from.size(), to);
}

}  // namespace

TEST(CaseFile, ReadsGeometryMaterialsAndControls) {
  const CaseSpec c = read_case_text(kEllipticalCore, "ok.toml");
  EXPECT_EQ(c.title, "elliptical core");
  EXPECT_DOUBLE_EQ(c.wavelength_um, 1.55);
  ASSERT_EQ(c.materials.size(), 3u);
  EXPECT_DOUBLE_EQ(c.find_material("silica")->max_index(1.55), 1.444);
  EXPECT_NEAR(c.find_material("crystal")->max_index(1.55), std::sqrt(2.2), 1e-15);
  EXPECT_EQ(c.find_material("crystal")->kind, MaterialSpec::Kind::diagonal);
  EXPECT_EQ(c.geometry.background_material, "silica");
  EXPECT_EQ(c.geometry.outer.kind, OuterBoundary::Kind::disk);
  EXPECT_DOUBLE_EQ(c.geometry.outer.radius, 30.0);
  EXPECT_EQ(c.geometry.symmetry, SymmetryCut::quarter);
  ASSERT_EQ(c.geometry.regions.size(), 1u);
  const RegionSpec& core = c.geometry.regions[0];
  EXPECT_EQ(core.name, "core");
  EXPECT_TRUE(core.guiding);
  ASSERT_EQ(core.shapes.size(), 1u);
  const auto* e = std::get_if<Ellipse>(&core.shapes[0].geometry);
  ASSERT_NE(e, nullptr);
  EXPECT_DOUBLE_EQ(e->semi_axis_x, 3.0);
  EXPECT_DOUBLE_EQ(core.shapes[0].placement.rotation_deg, 30.0);
  EXPECT_EQ(c.geometry.controls.order, 2);
  EXPECT_EQ(c.solve.n_modes, 4);
  EXPECT_EQ(c.walls.outer, WallKind::electric);
}

TEST(CaseFile, ErrorsNameFileLineAndKey) {
  // A misspelt key: the line of the key and a suggestion.
  std::string msg = error_of(replace(kEllipticalCore, "semi_axes_um", "semi_axis_um"));
  EXPECT_NE(msg.find("bad.toml:20"), std::string::npos) << msg;
  EXPECT_NE(msg.find("semi_axis_um"), std::string::npos) << msg;
  EXPECT_NE(msg.find("did you mean 'semi_axes_um'"), std::string::npos) << msg;

  // Unknown material, negative size, wrong type, bad order, a key of another shape.
  msg = error_of(replace(kEllipticalCore, "material = \"core_glass\"", "material = \"core_glas\""));
  EXPECT_NE(msg.find("unknown material 'core_glas'"), std::string::npos) << msg;
  EXPECT_NE(msg.find(":18"), std::string::npos) << msg;
  msg = error_of(replace(kEllipticalCore, "mesh_size_um = 0.25", "mesh_size_um = -0.25"));
  EXPECT_NE(msg.find("mesh_size_um"), std::string::npos) << msg;
  EXPECT_NE(msg.find("greater than zero"), std::string::npos) << msg;
  msg = error_of(replace(kEllipticalCore, "radius_um = 30", "radius_um = \"thirty\""));
  EXPECT_NE(msg.find("must be a number"), std::string::npos) << msg;
  msg = error_of(replace(kEllipticalCore, "order = 2", "order = 3"));
  EXPECT_NE(msg.find("must be 1 or 2"), std::string::npos) << msg;
  msg = error_of(replace(kEllipticalCore, "guiding = true", "guiding = true\nradius_um = 2"));
  EXPECT_NE(msg.find("does not apply to shape \"ellipse\""), std::string::npos) << msg;
  msg = error_of(replace(kEllipticalCore, "wavelength_um = 1.55", ""));
  EXPECT_NE(msg.find("wavelength_um"), std::string::npos) << msg;
  msg = error_of(replace(kEllipticalCore, "[mesh]", "[mesh"));
  EXPECT_NE(msg.find("not valid TOML"), std::string::npos) << msg;
  msg = error_of(replace(kEllipticalCore, "shape = \"ellipse\"", "shape = \"circle\""));
  EXPECT_NE(msg.find("unknown shape \"circle\""), std::string::npos) << msg;
  msg = error_of(replace(kEllipticalCore, "silica = 1.444", "silica = nan"));
  EXPECT_NE(msg.find("positive number"), std::string::npos) << msg;
}

TEST(CaseFile, GeneratorsExpandToShapes) {
  // Hexagonal lattice: 1 + 3R(R+1) sites minus the centre (exact lattice count).
  const std::string text = R"(
wavelength_um = 1.45
[materials]
silica = 1.45
air = 1.0
[domain]
radius_um = 30
material = "silica"
[[region]]
name = "holes"
material = "air"
shape = "hole-lattice"
pitch_um = 6.75
hole_diameter_um = 5.0
rings = 2
)";
  const CaseSpec c = read_case_text(text, "lattice.toml");
  EXPECT_EQ(c.geometry.regions.at(0).shapes.size(), 1u + 3u * 2u * 3u - 1u);
}

TEST(CaseFile, KeyReferenceInDocsMatchesTheKeyTable) {
  // docs/case-format.md carries the generated reference between markers; it must not drift.
  std::ifstream in(cladwise::test::source_path("docs/case-format.md"));
  ASSERT_TRUE(in) << "docs/case-format.md missing";
  std::stringstream buf;
  buf << in.rdbuf();
  const std::string doc = buf.str();
  const std::string begin = "<!-- BEGIN KEY REFERENCE (generated by `cladwise check --list-keys`) -->\n";
  const std::string end = "<!-- END KEY REFERENCE -->";
  const auto b = doc.find(begin);
  const auto e = doc.find(end);
  ASSERT_NE(b, std::string::npos);
  ASSERT_NE(e, std::string::npos);
  EXPECT_EQ(doc.substr(b + begin.size(), e - b - begin.size()), case_key_reference_markdown());
}

TEST(CaseFile, MaterialsFromModelsFitsTablesAndCrystals) {
  const auto dir = std::filesystem::temp_directory_path() / ("cladwise-mat-" + std::to_string(::getpid()));
  std::filesystem::create_directories(dir);
  // A table sampled from Malitson's fused-silica Sellmeier fit (JOSA 55, 1205 (1965);
  // coefficients in ../shared/docs/checks.md §1), written with a header row and a comment.
  {
    std::ofstream csv(dir / "silica.csv");
    csv.precision(12);
    csv << "wavelength_um,n\n# sampled from the Malitson fit\n";
    for (double lam = 1.2; lam <= 1.9001; lam += 0.02) {
      const double l2 = lam * lam;
      const double n2 = 1 + 0.6961663 * l2 / (l2 - 0.0684043 * 0.0684043) +
                        0.4079426 * l2 / (l2 - 0.1162414 * 0.1162414) + 0.8974794 * l2 / (l2 - 9.896161 * 9.896161);
      csv << lam << ", " << std::sqrt(n2) << "\n";
    }
  }
  std::ofstream(dir / "case.toml") << R"(
wavelength_um = 1.55
[materials]
glass = { model = "silica" }
doped = { model = "germania_silica", mole_fraction = 0.05 }
fit = { sellmeier_b = [0.6961663, 0.4079426, 0.8974794], sellmeier_c_um = [0.0684043, 0.1162414, 9.896161], valid_from_um = 0.21, valid_to_um = 3.71 }
tab = { table = "silica.csv" }
poly = { cauchy = [1.5, 0.004], valid_from_um = 0.4, valid_to_um = 2.0 }
lossy = { index = 1.45, extinction = 1e-4 }
gold = { permittivity = -95.9, permittivity_loss = 11.0 }
n_o = 2.21
n_e = 2.14
crystal = { ordinary = "n_o", extraordinary = "n_e", optic_axis_deg = 90 }
[domain]
radius_um = 10
material = "glass"
)";
  const CaseSpec c = read_case_file(dir / "case.toml");
  // Malitson silica n(1.55) = 1.444024 (checks.md §1, computed from the formula).
  EXPECT_NEAR(c.find_material("glass")->max_index(1.55), 1.444024, 5e-7);
  EXPECT_NEAR(c.find_material("fit")->max_index(1.55), 1.444024, 5e-7);
  EXPECT_NEAR(c.find_material("tab")->max_index(1.55), 1.444024, 5e-7);
  // GeO2-SiO2 mixing model, X = 0.05: n(1.55) = 1.451527 (checks.md §1, computed from the formula).
  EXPECT_NEAR(c.find_material("doped")->max_index(1.55), 1.451527, 5e-7);
  // Cauchy n = A + B/λ².
  EXPECT_NEAR(c.find_material("poly")->max_index(1.55), 1.5 + 0.004 / (1.55 * 1.55), 1e-14);
  // n − jκ squared; ε' − jε'' recovered from its root (conventions.md sign).
  const auto lossy = c.find_material("lossy")->permittivity(1.55);
  EXPECT_NEAR(lossy.xx.real(), 1.45 * 1.45 - 1e-8, 1e-12);
  EXPECT_NEAR(lossy.xx.imag(), -2 * 1.45 * 1e-4, 1e-12);
  const auto gold = c.find_material("gold")->permittivity(1.55);
  EXPECT_NEAR(gold.xx.real(), -95.9, 1e-10);
  EXPECT_NEAR(gold.xx.imag(), -11.0, 1e-10);
  // Optic axis along y: ε_yy = n_e², ε_xx = ε_zz = n_o², no coupling term.
  const auto x = c.find_material("crystal")->permittivity(1.55);
  EXPECT_NEAR(x.xx.real(), 2.21 * 2.21, 1e-12);
  EXPECT_NEAR(x.yy.real(), 2.14 * 2.14, 1e-12);
  EXPECT_NEAR(std::abs(x.xy), 0.0, 1e-12);
  EXPECT_NEAR(x.zz.real(), 2.21 * 2.21, 1e-12);

  // Outside a fit's validity range the model refuses (unless extrapolation is allowed).
  EXPECT_THROW(c.find_material("poly")->max_index(2.5), InputError);
  std::filesystem::remove_all(dir);
}

TEST(CaseFile, MaterialErrorsNameTheMaterial) {
  const std::string tail = "\n[domain]\nradius_um = 10\nmaterial = \"m\"\n";
  auto msg = error_of("wavelength_um = 1.55\n[materials]\nm = { model = \"unobtainium\" }" + tail);
  EXPECT_NE(msg.find("'m'"), std::string::npos) << msg;
  EXPECT_NE(msg.find("silica"), std::string::npos) << "lists the known models: " << msg;
  msg = error_of("wavelength_um = 1.55\n[materials]\nm = { sellmeier_b = [0.7], sellmeier_c_um = [0.07] }" + tail);
  EXPECT_NE(msg.find("valid_from_um"), std::string::npos) << msg;
  msg = error_of("wavelength_um = 1.55\n[materials]\nm = { index = 1.4, model = \"silica\" }" + tail);
  EXPECT_NE(msg.find("only one of"), std::string::npos) << msg;
  msg = error_of("wavelength_um = 1.55\n[materials]\nm = { table = \"nowhere.csv\" }" + tail);
  EXPECT_NE(msg.find("nowhere.csv"), std::string::npos) << msg;
  msg = error_of("wavelength_um = 1.55\n[materials]\nm = { ordinary = \"a\", extraordinary = \"b\" }" + tail);
  EXPECT_NE(msg.find("'a' must name an isotropic material"), std::string::npos) << msg;
}
