// Material catalogue: the built-in dispersive media, each a published fit (or table) with its
// validity range, as DispersionModel objects (solver/dispersion_model.hpp). Sources, coefficients
// and status are listed in docs/materials.md; the check values each model reproduces are tested in
// tests/solver/test_material_catalogue.cpp against ../shared/docs/checks.md §1.
//
// Convention: every model takes the VACUUM wavelength in µm and returns the index used as absolute,
// with the published coefficients unaltered (no air correction; see dispersion_model.hpp).
//
// Names (lookup keys):
//   silica              fused SiO₂, Malitson 1965 (form A)                       0.21–3.71 µm
//   silica_fleming1978  fused SiO₂, Fleming 1978 (secondary copy)                 0.6–1.8 µm *
//   germania            GeO₂ glass, Fleming 1984 (form A)                         0.36–4.3 µm
//   germania_silica     GeO₂–SiO₂ by GeO₂ mole fraction X, linear mixing of the
//                       Malitson and Fleming-1984 coefficients (common practice)  0.6–1.8 µm
//   fluorine_silica     SiO₂ + 1.0 mol% F, Fleming 1978 (secondary copy)          0.6–1.8 µm *
//   silicon             crystalline Si, Tatian 1984 fit to Salzberg & Villa 1957  1.357–11.04 µm
//   silicon_li1980      crystalline Si at 293 K, Li 1980 table (spline)           1.2–14 µm
//   silicon_nitride     stoichiometric LPCVD Si₃N₄, Luke et al. 2015              0.31–5.504 µm
//   lithium_niobate_o   congruent LiNbO₃ ordinary, Zelmon et al. 1997 (form B)    0.4–5.0 µm
//   lithium_niobate_e   congruent LiNbO₃ extraordinary, Zelmon et al. 1997        0.4–5.0 µm
//   air                 standard dry air, Ciddor 1996                             0.23–1.69 µm
//   vacuum              n = 1 exactly                                             unbounded
// (*) no published range in our sources: the near-IR fibre band, marked "assumed" in the docs.
// Boron-doped silica is not included: no published dispersion model is in our sources.
#pragma once

#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "solver/dispersion_model.hpp"

namespace cladwise {

/// One catalogue entry, for listings (--help, docs) and error messages.
struct CatalogueEntry {
  std::string name;         ///< lookup key, e.g. "silica"
  std::string description;  ///< "fused silica (SiO2)"
  std::string reference;    ///< full citation
  std::string status;       ///< provenance of the coefficients: "confirmed", "secondary", ...
  bool takes_mole_fraction = false;
};

/// Every built-in, in catalogue order.
const std::vector<CatalogueEntry>& catalogue_entries();

/// "silica, silica_fleming1978, germania, ..." (for messages).
std::string catalogue_names();

/// Parameters of a catalogue lookup.
struct CatalogueOptions {
  std::optional<double> mole_fraction;  ///< dopant mole fraction 0–1, only for germania_silica
  bool allow_extrapolation = false;     ///< evaluate outside the validity range without error
};

/// The built-in model called `name`. Throws InputError (where() = "material 'name'") for an
/// unknown name, listing the known names; for germania_silica without a mole fraction; and for a
/// mole fraction given to a material that takes none.
DispersionModel catalogue_material(std::string_view name, const CatalogueOptions& options = {});

// ---- the built-ins, one function each --------------------------------------------------------

/// Published Sellmeier coefficients of the two end members of the GeO₂–SiO₂ mixing model.
const SellmeierCoefficients& silica_malitson1965_coefficients();
const SellmeierCoefficients& germania_fleming1984_coefficients();

DispersionModel silica_malitson1965();
DispersionModel silica_fleming1978();
DispersionModel germania_fleming1984();
/// GeO₂–SiO₂ glass of GeO₂ mole fraction x (0 <= x <= 1; x = 0.05 is 5 mol%).
DispersionModel germania_silica(double mole_fraction);
DispersionModel fluorine_silica_fleming1978();
DispersionModel silicon_tatian1984();
DispersionModel silicon_li1980();
DispersionModel silicon_nitride_luke2015();
DispersionModel lithium_niobate_ordinary_zelmon1997();
DispersionModel lithium_niobate_extraordinary_zelmon1997();
DispersionModel air_ciddor1996();
DispersionModel vacuum();

}  // namespace cladwise
