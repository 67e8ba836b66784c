// The built-in material catalogue. Every coefficient below is copied from the source named beside
// it, in the units that source uses; the provenance of each (confirmed / secondary) follows
// ../shared/docs/checks.md §1 and is repeated in docs/materials.md.
#include "solver/material_catalogue.hpp"

#include <functional>

#include "mesh/error.hpp"

namespace cladwise {
namespace {

constexpr auto form_a = SellmeierForm::resonance_wavelength;
constexpr auto form_b = SellmeierForm::resonance_wavelength_squared;

// Near-IR fibre band used where a source gives no range (checks.md §1: "~0.6–1.8 for fibre work",
// common practice).
constexpr WavelengthRange fibre_band{0.6, 1.8};

// Fleming 1978 fused-silica fit as reproduced in S. O. Kasap, "Optoelectronics and Photonics",
// Table 1.2 (secondary; checks.md §1). B1 is 0.696749 in that copy and 0.696750 in another; the
// difference moves n(1.55) by 4e-7.
const SellmeierCoefficients& silica_fleming1978_coefficients() {
  static const SellmeierCoefficients c{
      form_a, {{0.696749, 0.0690660}, {0.408218, 0.115662}, {0.890815, 9.900559}}};
  return c;
}

struct Builtin {
  CatalogueEntry entry;
  std::function<DispersionModel(const CatalogueOptions&)> make;
};

const std::vector<Builtin>& builtins() {
  static const std::vector<Builtin> list = {
      {{"silica", "fused silica (SiO2), 20 °C",
        "I. H. Malitson, \"Interspecimen comparison of the refractive index of fused silica\", "
        "J. Opt. Soc. Am. 55, 1205-1208 (1965)",
        "confirmed", false},
       [](const CatalogueOptions&) { return silica_malitson1965(); }},
      {{"silica_fleming1978", "fused silica (SiO2), Fleming's own 1978 fit",
        "J. W. Fleming, \"Material dispersion in lightguide glasses\", Electron. Lett. 14, 326 "
        "(1978); coefficients via S. O. Kasap, Optoelectronics and Photonics, Table 1.2",
        "secondary; validity range assumed (near-IR fibre band)", false},
       [](const CatalogueOptions&) { return silica_fleming1978(); }},
      {{"germania", "germania glass (GeO2)",
        "J. W. Fleming, \"Dispersion in GeO2-SiO2 glasses\", Appl. Opt. 23, 4486-4493 (1984)",
        "confirmed", false},
       [](const CatalogueOptions&) { return germania_fleming1984(); }},
      {{"germania_silica", "germania-doped silica (GeO2 mole fraction X)",
        "linear interpolation in X of the Sellmeier B and C of Malitson 1965 silica and "
        "Fleming 1984 GeO2 (common practice)",
        "common practice (model); end members confirmed", true},
       [](const CatalogueOptions& o) { return germania_silica(*o.mole_fraction); }},
      {{"fluorine_silica", "fluorine-doped silica, 1.0 mol% F",
        "J. W. Fleming, Electron. Lett. 14, 326 (1978), same table as silica_fleming1978",
        "secondary (primary paper not seen); validity range assumed (near-IR fibre band)", false},
       [](const CatalogueOptions&) { return fluorine_silica_fleming1978(); }},
      {{"silicon", "crystalline silicon, 26 °C",
        "C. D. Salzberg & J. J. Villa, J. Opt. Soc. Am. 47, 244 (1957) data, Sellmeier fit by "
        "B. Tatian, Appl. Opt. 23, 4477 (1984)",
        "confirmed", false},
       [](const CatalogueOptions&) { return silicon_tatian1984(); }},
      {{"silicon_li1980", "crystalline silicon, 293 K, tabulated",
        "H. H. Li, \"Refractive index of silicon and germanium and its wavelength and "
        "temperature derivatives\", J. Phys. Chem. Ref. Data 9, 561-658 (1980)",
        "confirmed (table values as stored in the refractiveindex.info database, Si/Li-293K)",
        false},
       [](const CatalogueOptions&) { return silicon_li1980(); }},
      {{"silicon_nitride", "stoichiometric LPCVD silicon nitride (Si3N4)",
        "K. Luke, Y. Okawachi, M. R. E. Lamont, A. L. Gaeta, M. Lipson, Opt. Lett. 40, "
        "4823-4826 (2015)",
        "confirmed", false},
       [](const CatalogueOptions&) { return silicon_nitride_luke2015(); }},
      {{"lithium_niobate_o", "congruent lithium niobate (LiNbO3), ordinary index, 21 °C",
        "D. E. Zelmon, D. L. Small, D. Jundt, J. Opt. Soc. Am. B 14, 3319-3322 (1997)",
        "confirmed", false},
       [](const CatalogueOptions&) { return lithium_niobate_ordinary_zelmon1997(); }},
      {{"lithium_niobate_e", "congruent lithium niobate (LiNbO3), extraordinary index, 21 °C",
        "D. E. Zelmon, D. L. Small, D. Jundt, J. Opt. Soc. Am. B 14, 3319-3322 (1997)",
        "confirmed", false},
       [](const CatalogueOptions&) { return lithium_niobate_extraordinary_zelmon1997(); }},
      {{"air", "standard dry air, 15 °C, 101.325 kPa, 450 ppm CO2",
        "P. E. Ciddor, \"Refractive index of air: new equations for the visible and near "
        "infrared\", Appl. Opt. 35, 1566-1573 (1996)",
        "confirmed", false},
       [](const CatalogueOptions&) { return air_ciddor1996(); }},
      {{"vacuum", "vacuum, n = 1", "definition", "exact", false},
       [](const CatalogueOptions&) { return vacuum(); }},
  };
  return list;
}

}  // namespace

const std::vector<CatalogueEntry>& catalogue_entries() {
  static const std::vector<CatalogueEntry> entries = [] {
    std::vector<CatalogueEntry> e;
    for (const Builtin& b : builtins()) e.push_back(b.entry);
    return e;
  }();
  return entries;
}

std::string catalogue_names() {
  std::string s;
  for (const Builtin& b : builtins()) s += (s.empty() ? "" : ", ") + b.entry.name;
  return s;
}

DispersionModel catalogue_material(std::string_view name, const CatalogueOptions& options) {
  const std::string where = "material '" + std::string(name) + "'";
  for (const Builtin& b : builtins()) {
    if (b.entry.name != name) continue;
    if (b.entry.takes_mole_fraction && !options.mole_fraction) {
      throw InputError(where, "needs a dopant mole fraction between 0 and 1 (e.g. 0.05 for "
                              "5 mol% GeO2)");
    }
    if (!b.entry.takes_mole_fraction && options.mole_fraction) {
      throw InputError(where, "takes no mole fraction (only germania_silica does); remove it");
    }
    return b.make(options).with_extrapolation(options.allow_extrapolation);
  }
  throw InputError(where, "is not in the material catalogue; known materials: " +
                              catalogue_names() +
                              " (or define a Sellmeier, Cauchy or tabulated material)");
}

// ---- coefficients ---------------------------------------------------------------------------

// Malitson 1965, form A (C in µm), 0.21–3.71 µm, 20 °C. Fitted to n relative to air with λ in air;
// used here as absolute n against vacuum λ (dispersion_model.hpp, "Convention"). checks.md §1,
// confirmed.
const SellmeierCoefficients& silica_malitson1965_coefficients() {
  static const SellmeierCoefficients c{
      form_a, {{0.6961663, 0.0684043}, {0.4079426, 0.1162414}, {0.8974794, 9.896161}}};
  return c;
}

// Fleming 1984, pure GeO₂ glass, form A, 0.36–4.3 µm. checks.md §1, confirmed.
const SellmeierCoefficients& germania_fleming1984_coefficients() {
  static const SellmeierCoefficients c{
      form_a, {{0.80686642, 0.068972606}, {0.71815848, 0.15396605}, {0.85416831, 11.841931}}};
  return c;
}

DispersionModel silica_malitson1965() {
  return sellmeier_model("silica", "Malitson 1965", silica_malitson1965_coefficients(),
                         {0.21, 3.71});
}

DispersionModel silica_fleming1978() {
  return sellmeier_model("silica_fleming1978", "Fleming 1978", silica_fleming1978_coefficients(),
                         fibre_band);
}

DispersionModel germania_fleming1984() {
  return sellmeier_model("germania", "Fleming 1984", germania_fleming1984_coefficients(),
                         {0.36, 4.3});
}

// Mixing model (checks.md §1, common practice): Bᵢ and the resonance wavelengths Cᵢ interpolated
// linearly in GeO₂ mole fraction between Malitson silica and Fleming-1984 GeO₂. Valid in the fibre
// band 0.6–1.8 µm (common practice), inside both end members' ranges.
DispersionModel germania_silica(double mole_fraction) {
  return sellmeier_mixture_model("germania_silica", "SiO2-GeO2 mixing of Malitson 1965 and "
                                                    "Fleming 1984",
                                 silica_malitson1965_coefficients(),
                                 germania_fleming1984_coefficients(), mole_fraction, fibre_band);
}

// Fleming 1978, SiO₂ with 1.0 mol% F, form A. Secondary: copied from a public code comment that
// reproduces the Fleming 1978 table (checks.md §1); primary paper not seen. Range not given there:
// the fibre band is assumed.
DispersionModel fluorine_silica_fleming1978() {
  return sellmeier_model(
      "fluorine_silica", "Fleming 1978, 1 mol% F",
      {form_a, {{0.691116, 0.068227}, {0.399166, 0.116460}, {0.890423, 9.993707}}}, fibre_band);
}

// Tatian 1984 fit of the Salzberg & Villa 1957 prism data, form A, 1.357–11.04 µm, 26 °C.
// checks.md §1, confirmed.
DispersionModel silicon_tatian1984() {
  return sellmeier_model(
      "silicon", "Salzberg & Villa 1957 / Tatian 1984",
      {form_a, {{10.6684293, 0.301516485}, {0.0030434748, 1.13475115}, {1.54133408, 1104.0}}},
      {1.357, 11.04});
}

// Li 1980, crystalline Si at 293 K, Table of n against λ (µm), 1.2–14 µm, as stored in the
// public-domain refractiveindex.info database (database/data/main/Si/nk/Li-293K.yml); the six
// values checks.md §1 lists agree. Four decimals: good for n (±5e-5), too coarse for D (the
// second derivative of rounded data is noise); use "silicon" for dispersion.
DispersionModel silicon_li1980() {
  static const std::vector<double> lambda = {
      1.20, 1.22, 1.24, 1.26, 1.28, 1.30, 1.32, 1.34, 1.36, 1.38, 1.40, 1.45,
      1.50, 1.55, 1.60, 1.65, 1.70, 1.80, 1.90, 2.00, 2.25, 2.50, 2.75, 3.00,
      4.00, 5.00, 6.00, 7.00, 8.00, 9.00, 10.0, 11.0, 12.0, 13.0, 14.0};
  static const std::vector<double> n = {
      3.5167, 3.5133, 3.5102, 3.5072, 3.5043, 3.5016, 3.4990, 3.4965, 3.4941, 3.4918, 3.4896, 3.4845,
      3.4799, 3.4757, 3.4719, 3.4684, 3.4653, 3.4597, 3.4550, 3.4510, 3.4431, 3.4375, 3.4334, 3.4302,
      3.4229, 3.4195, 3.4177, 3.4165, 3.4158, 3.4153, 3.4150, 3.4147, 3.4145, 3.4144, 3.4142};
  return tabulated_model("silicon_li1980", "Li 1980, 293 K", lambda, n);
}

// Luke et al. 2015, stoichiometric LPCVD Si₃N₄, form A, 0.310–5.504 µm. checks.md §1, confirmed.
DispersionModel silicon_nitride_luke2015() {
  return sellmeier_model("silicon_nitride", "Luke et al. 2015",
                         {form_a, {{3.0249, 0.1353406}, {40314.0, 1239.842}}}, {0.310, 5.504});
}

// Zelmon, Small & Jundt 1997, congruent LiNbO₃, form B (C in µm²), 0.4–5.0 µm, 21 °C.
// checks.md §1, confirmed.
DispersionModel lithium_niobate_ordinary_zelmon1997() {
  return sellmeier_model("lithium_niobate_o", "Zelmon et al. 1997",
                         {form_b, {{2.6734, 0.01764}, {1.2290, 0.05914}, {12.614, 474.60}}},
                         {0.4, 5.0});
}

DispersionModel lithium_niobate_extraordinary_zelmon1997() {
  return sellmeier_model("lithium_niobate_e", "Zelmon et al. 1997",
                         {form_b, {{2.9804, 0.02047}, {0.5981, 0.0666}, {8.9543, 416.08}}},
                         {0.4, 5.0});
}

// Ciddor 1996, eq. (1) for standard air: n − 1 = k1/(k0 − σ²) + k3/(k2 − σ²), σ = 1/λ in µm⁻¹,
// with k1 = 5792105e-8, k0 = 238.0185, k3 = 167917e-8, k2 = 57.362 (all µm⁻²); vacuum λ,
// 0.23–1.69 µm, 15 °C, 101.325 kPa, 450 ppm CO₂. checks.md §1, confirmed.
DispersionModel air_ciddor1996() {
  return gas_dispersion_model("air", "Ciddor 1996", {{0.05792105, 238.0185}, {0.00167917, 57.362}},
                              {0.23, 1.69});
}

DispersionModel vacuum() { return constant_index_model("vacuum", 1.0); }

}  // namespace cladwise
