// Case-file reader: valid cases map to the cross-section description; bad input is rejected with
// the file, line and key in the message (design.md: "Errors ... naming file, line and key").
#include <gtest/gtest.h>

#include <cmath>
#include <fstream>
#include <sstream>

#include "io/case_file.hpp"
#include "io/case_keys.hpp"
#include "mesh/error.hpp"

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
  EXPECT_DOUBLE_EQ(*c.find_material("silica")->index, 1.444);
  EXPECT_NEAR(c.find_material("crystal")->max_index(), std::sqrt(2.2), 1e-15);
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
  std::ifstream in(std::string(CLADWISE_SOURCE_DIR) + "/docs/case-format.md");
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
