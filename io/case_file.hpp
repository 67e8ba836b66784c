// Reading a case file (TOML, keys declared in io/case_keys.hpp, reference in docs/case-format.md)
// into a CaseSpec: the cross-section geometry for mesh/, the materials and what to solve for.
// Every error names the file, the line and the key, and says what to do.
#pragma once

#include <array>
#include <filesystem>
#include <map>
#include <optional>
#include <string>
#include <vector>

#include "io/material_spec.hpp"
#include "mesh/cross_section.hpp"

namespace cladwise::io {

enum class WallKind { electric, magnetic };

struct BoundarySpec {
  WallKind outer = WallKind::electric;
  WallKind x_axis = WallKind::electric;   ///< on a cut along y = 0
  WallKind y_axis = WallKind::magnetic;   ///< on a cut along x = 0
};

struct SolveSpec {
  int n_modes = 2;
  bool all_guided = false;
  std::optional<double> target_index;
  bool check_pml = false;
  double nonlinear_index_m2_per_w = 2.6e-20;  ///< n2 of the glass that carries the mode
  std::optional<std::string> core_region;     ///< leaky solves: keep modes guided by this region
  std::string core_region_where;
};

/// Absorption profile of the PML shell (its thickness is CrossSection::outer.pml_thickness).
struct PmlSpec {
  double strength = 8.0;
  int power = 2;
};

/// [cutoff]: the cutoff wavelength of one mode (where its n_eff meets the background index).
struct CutoffSpec {
  int mode = 0;                   ///< 1-based position at from_um
  std::optional<double> from_um;
  double to_um = 0;
  std::string where;
};

struct BendSpec {
  double radius_um = 0;
  double direction_deg = 0;
  bool conformal = false;  ///< scalar n(1 + u/R) instead of the exact transformation
  std::string where;
};

/// Geometry from a file instead of [domain] and [[region]].
struct ImportSpec {
  std::filesystem::path path;                          ///< resolved against the case's folder
  std::map<std::string, std::string> group_materials;  ///< physical-group name -> material
  std::string where;
};

struct CaseSpec {
  std::filesystem::path path;
  std::string title;
  double wavelength_um = 0;            ///< the (first) wavelength
  std::vector<double> wavelengths_um;  ///< every wavelength of a sweep, ascending (one for a single solve)
  std::vector<MaterialSpec> materials;
  CrossSection geometry;                 ///< from [domain], [[region]] and [mesh]
  std::optional<ImportSpec> import;      ///< set when the geometry comes from a file
  BoundarySpec walls;
  PmlSpec pml;
  std::optional<BendSpec> bend;
  std::optional<CutoffSpec> cutoff;
  SolveSpec solve;

  const MaterialSpec* find_material(const std::string& name) const;
};

/// Reads and validates a case file. Throws InputError("file:line key", "what to do").
CaseSpec read_case_file(const std::filesystem::path& path);
/// Same, from text (the `origin` names it in messages); for tests.
CaseSpec read_case_text(const std::string& text, const std::filesystem::path& origin);

}  // namespace cladwise::io
