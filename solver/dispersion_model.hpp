// Dispersion model: the refractive index of one medium as a function of wavelength, n(λ) − jκ(λ),
// with its validity range and the wavelength derivatives that group index and material dispersion
// need. The published fits themselves live in solver/material_catalogue.hpp; this header is the
// machinery (formula families, table interpolation, range checks). The catalogue's convention and
// every formula's source are in docs/materials.md.
//
// Convention (one for the whole project, docs/materials.md "Convention"):
//   * λ is the VACUUM wavelength in µm everywhere (docs/conventions.md, "Units").
//   * n is taken as the absolute index. Published fits are used exactly as published, even those
//     (Malitson 1965) that were fitted to the index relative to air with λ in air. Converting such
//     a fit to absolute n (n × n_air) would raise n by about 4e-4, and moving λ to vacuum changes n by
//     about 5e-6; both are at or below the fit-to-fit spread of silica itself (checks.md §1:
//     Fleming-78 silica lies 3.6e-4 above Malitson). No air correction is applied anywhere, so
//     index contrasts between catalogue materials are exactly as the fits give them.
//   * Loss: n − jκ under exp(+jωt), κ >= 0 (docs/conventions.md).
//
// Formula families (λ in µm, coefficients in the units stated):
//   Sellmeier form A   n² − 1 = Σ Bᵢ λ² / (λ² − Cᵢ²)      Cᵢ: resonance wavelength, µm
//   Sellmeier form B   n² − 1 = Σ Bᵢ λ² / (λ² − Cᵢ)       Cᵢ: µm²
//   Cauchy             n = A₀ + A₁/λ² + A₂/λ⁴ + …          Aₖ: µm^(2k)
//   gas (Ciddor form)  n − 1 = Σ Bᵢ / (Cᵢ − λ⁻²)          Bᵢ, Cᵢ: µm⁻²  (P. E. Ciddor,
//                      Appl. Opt. 35, 1566 (1996), eq. (1); the Peck & Reeder air fit has the same
//                      shape)
//   constant           n, κ independent of λ
//   tabulated          n(λ) (and optionally κ(λ)) through a cubic spline in λ
// The first and second λ-derivatives are analytic for the formulas and those of the spline for a
// table.
//
// Table interpolation: a cubic interpolating spline in λ with NOT-A-KNOT end conditions
// (C. de Boor, "A Practical Guide to Splines", Springer 1978, ch. IV). It is C² (continuous n, dn/dλ
// and d²n/dλ², so group index and D are continuous), reproduces any cubic exactly, and is O(h⁴) in n
// up to the ends. A natural spline was rejected because it forces d²n/dλ² = 0, hence D = 0, at both
// ends of every table; a monotone (Fritsch–Carlson) cubic was rejected because it is only C¹, so D
// would jump at every tabulated point. κ uses the same spline and is clipped at 0 where the spline
// undershoots between points.
//
// Group index and material dispersion (e.g. G. P. Agrawal, "Nonlinear Fiber Optics", §1.2.3):
//   n_g = n − λ dn/dλ,        D = −(λ/c) d²n/dλ²,  reported in ps/(nm·km).
#pragma once

#include <complex>
#include <optional>
#include <string>
#include <variant>
#include <vector>

namespace cladwise {

/// Closed wavelength interval [min_um, max_um] (vacuum µm) on which a fit or table is valid.
struct WavelengthRange {
  double min_um = 0.0;
  double max_um = 0.0;
  bool contains(double wavelength_um) const {
    return wavelength_um >= min_um && wavelength_um <= max_um;
  }
  /// (0, +inf): for models with no published limits (constant index, user models left open).
  static WavelengthRange unbounded();
  bool is_unbounded() const;
};

/// How a Sellmeier coefficient Cᵢ is given (see the file header).
enum class SellmeierForm {
  resonance_wavelength,          ///< form A: Cᵢ in µm, term Bᵢ λ²/(λ² − Cᵢ²)
  resonance_wavelength_squared,  ///< form B: Cᵢ in µm², term Bᵢ λ²/(λ² − Cᵢ)
};

/// One pole term Bᵢ, Cᵢ of a Sellmeier or gas-dispersion formula.
struct PoleTerm {
  double b = 0.0;
  double c = 0.0;
};

/// Sellmeier coefficients as published (any number of terms).
struct SellmeierCoefficients {
  SellmeierForm form = SellmeierForm::resonance_wavelength;
  std::vector<PoleTerm> terms;
};

/// n and its first two λ-derivatives at one wavelength (real part of the index; µm⁻¹, µm⁻²).
struct IndexDerivatives {
  double n = 0.0;
  double dn_dlambda = 0.0;     ///< dn/dλ, 1/µm
  double d2n_dlambda2 = 0.0;   ///< d²n/dλ², 1/µm²
};

/// Speed of light in vacuum, m/s (exact, SI 2019).
inline constexpr double speed_of_light_m_per_s = 299792458.0;

/// D = −(λ/c) d²n/dλ² in ps/(nm·km) from λ in µm and d²n/dλ² in µm⁻²:
/// λ·n'' is in µm⁻¹ = 1e6 m⁻¹, and 1 ps/(nm·km) = 1e-6 s/m², hence the factor 1e12/c.
inline double dispersion_ps_per_nm_km(double wavelength_um, double d2n_dlambda2_per_um2) {
  return -wavelength_um * d2n_dlambda2_per_um2 * 1e12 / speed_of_light_m_per_s;
}

/// The refractive index of one medium against vacuum wavelength. Built by the factory functions
/// below (which validate their input and throw InputError naming the material); evaluation outside
/// validity() throws InputError unless the model allows extrapolation.
class DispersionModel {
public:
  struct Constant {
    double n = 1.0;
    double kappa = 0.0;
  };
  struct Sellmeier {
    SellmeierCoefficients published;  ///< as given (form A or B), for reports and docs
    std::vector<PoleTerm> terms_um2;  ///< the same terms with Cᵢ in µm² (form B), used to evaluate
  };
  struct Cauchy {
    std::vector<double> coefficients;  ///< A₀, A₁, A₂, …: n = Σ Aₖ λ^(−2k)
  };
  struct Gas {
    std::vector<PoleTerm> terms;  ///< n − 1 = Σ Bᵢ/(Cᵢ − λ⁻²), Bᵢ and Cᵢ in µm⁻²
  };
  /// Cubic spline through (λⱼ, yⱼ): second derivatives at the knots (de Boor ch. IV).
  struct Spline {
    std::vector<double> y;
    std::vector<double> y2;  ///< d²y/dλ² at each knot
  };
  struct Table {
    std::vector<double> wavelength_um;  ///< strictly increasing knots
    Spline n;
    std::optional<Spline> kappa;
  };
  using Form = std::variant<Constant, Sellmeier, Cauchy, Gas, Table>;

  DispersionModel(std::string name, std::string source, Form form, WavelengthRange validity);

  const std::string& name() const { return name_; }
  /// Short citation ("Malitson 1965"); empty for user models without one.
  const std::string& source() const { return source_; }
  const WavelengthRange& validity() const { return validity_; }
  const Form& form() const { return form_; }
  /// "constant", "Sellmeier", "Cauchy", "gas", "tabulated".
  const char* form_name() const;

  bool allows_extrapolation() const { return allow_extrapolation_; }
  /// A copy that evaluates outside validity() (formula continued; a table's end cubic extended).
  DispersionModel with_extrapolation(bool allow = true) const;

  /// True if κ can be non-zero (a constant with κ > 0 or a table with a κ column).
  bool has_loss() const;

  /// Real part n of the index. Throws InputError outside validity() (unless extrapolation is
  /// allowed), for λ that is not a positive number, and where the formula gives no real index.
  double index(double wavelength_um) const;
  /// Extinction coefficient κ >= 0 (0 for formula models).
  double extinction(double wavelength_um) const;
  /// n − jκ (docs/conventions.md sign).
  std::complex<double> complex_index(double wavelength_um) const;
  /// ε_r = (n − jκ)².
  std::complex<double> relative_permittivity(double wavelength_um) const;
  /// n, dn/dλ, d²n/dλ² of the real part.
  IndexDerivatives derivatives(double wavelength_um) const;
  /// n_g = n − λ dn/dλ.
  double group_index(double wavelength_um) const;
  /// D = −(λ/c) d²n/dλ² in ps/(nm·km).
  double dispersion_ps_per_nm_km(double wavelength_um) const;

private:
  void check_wavelength(double wavelength_um) const;
  std::string where() const;

  std::string name_;
  std::string source_;
  Form form_;
  WavelengthRange validity_;
  bool allow_extrapolation_ = false;
};

// ---- factories (each throws InputError naming the material on bad coefficients) -------------

/// Constant index n − jκ; validity unbounded unless given.
DispersionModel constant_index_model(std::string name, double n, double kappa = 0.0,
                                     WavelengthRange validity = WavelengthRange::unbounded());

/// Sellmeier fit, form A or B, any number of terms. Rejects non-finite coefficients, an empty
/// term list, a pole (λ² = Cᵢ in form B terms) inside the validity range, and a fit whose n² is not
/// positive somewhere in the range.
DispersionModel sellmeier_model(std::string name, std::string source, SellmeierCoefficients coeffs,
                                WavelengthRange validity);

/// Cauchy fit n = A₀ + A₁/λ² + A₂/λ⁴ + … (coefficients A₀, A₁, … in µm^(2k)).
DispersionModel cauchy_model(std::string name, std::string source,
                             std::vector<double> coefficients, WavelengthRange validity);

/// Gas dispersion n − 1 = Σ Bᵢ/(Cᵢ − λ⁻²) (Ciddor 1996 form), Bᵢ and Cᵢ in µm⁻².
DispersionModel gas_dispersion_model(std::string name, std::string source,
                                     std::vector<PoleTerm> terms, WavelengthRange validity);

/// Tabulated n (and optionally κ, same length or empty) against vacuum wavelength in µm, e.g. the
/// parsed columns of a CSV file. At least 4 rows; rows may come in any order but wavelengths must
/// be distinct, positive and finite, n > 0, κ >= 0. Validity is [first, last] tabulated λ.
DispersionModel tabulated_model(std::string name, std::string source,
                                std::vector<double> wavelength_um, std::vector<double> n,
                                std::vector<double> kappa = {});

/// Mixing model of two form-A Sellmeier fits with the same number of terms: every Bᵢ and Cᵢ
/// (resonance wavelength, µm) interpolated linearly in the mole fraction x of the second
/// component, Bᵢ(x) = Bᵢᵃ + x (Bᵢᵇ − Bᵢᵃ), Cᵢ(x) = Cᵢᵃ + x (Cᵢᵇ − Cᵢᵃ) (the GeO₂–SiO₂ practice
/// after J. W. Fleming, Appl. Opt. 23, 4486 (1984); common practice). Throws InputError unless
/// 0 <= x <= 1.
DispersionModel sellmeier_mixture_model(std::string name, std::string source,
                                        const SellmeierCoefficients& first,
                                        const SellmeierCoefficients& second, double mole_fraction,
                                        WavelengthRange validity);

/// First wavelength in [lo_um, hi_um] where D changes sign (material zero-dispersion wavelength),
/// located on a 64-interval scan and refined by Brent's method to ~1e-12 µm; nullopt if D keeps
/// one sign on the scan. The interval must lie inside the model's validity unless it extrapolates.
std::optional<double> zero_dispersion_wavelength(const DispersionModel& model, double lo_um,
                                                 double hi_um);

}  // namespace cladwise
