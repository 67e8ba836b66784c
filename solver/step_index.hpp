// Step-index fibre: the exact guided modes of a round core of index n_core and radius a in an
// infinite cladding of index n_clad, from the characteristic equation of the full vector problem
// (A. W. Snyder & J. D. Love, "Optical Waveguide Theory", Chapman & Hall 1983, ch. 12;
// K. Okamoto, "Fundamentals of Optical Waveguides", ch. 3), and the weakly
// guiding LP modes of the scalar equation (Snyder & Love ch. 14; D. Gloge, Appl. Opt. 10, 2252
// (1971)). The mathematics, the root bracketing and the field formulas are in docs/step-index.md.
//
// Parameters (V = k0 a sqrt(n_core² − n_clad²), k0 = 2π/λ):
//   U = a sqrt(k0² n_core² − β²),  W = a sqrt(β² − k0² n_clad²),  U² + W² = V²,
//   b = W²/V² (normalised propagation constant),  n_eff = β/k0 = sqrt(n_clad² + (n_core² − n_clad²) b).
//
// Degeneracy: a hybrid mode (HE, EH) of order nu >= 1 has two orthogonal orientations (the cos/sin
// azimuthal pairs, i.e. two polarisations) with the same β; it is ONE entry here, with
// degeneracy() == 2. TE0m and TM0m are single (degeneracy 1). LP0m has 2, LPlm (l >= 1) has 4.
//
// Dispersion (docs/step-index.md, "Dispersion"): group index n_g = dβ/dk0 and chromatic
// dispersion D = (1/c) dn_g/dλ of any exact vector or LP mode of a fibre whose core and cladding
// indices depend on wavelength, from Richardson-extrapolated central differences of the exact
// β(k0); cross-checked by implicit differentiation of the characteristic equation.
#pragma once

#include <Eigen/Core>
#include <complex>
#include <functional>
#include <optional>
#include <string>
#include <vector>

#include "solver/dispersion_model.hpp"

namespace cladwise {

/// A round step-index fibre at one vacuum wavelength. Lengths in micrometres.
struct StepIndexFibre {
  double n_core = 0.0;
  double n_clad = 0.0;
  double radius_um = 0.0;      ///< core radius a
  double wavelength_um = 0.0;  ///< vacuum wavelength λ

  /// Throws InputError naming the parameter (where() is "n_core", "n_clad", "radius_um" or
  /// "wavelength_um") unless all are finite, n_core > n_clad > 0, radius > 0 and wavelength > 0,
  /// and unless V <= max_v_number().
  void validate() const;
  double k0_per_um() const;             ///< 2π/λ
  double v_number() const;              ///< V = k0 a NA
  double numerical_aperture() const;    ///< NA = sqrt(n_core² − n_clad²)
  double relative_index_difference() const;  ///< Δ = (n_core² − n_clad²) / (2 n_core²)
  /// Largest V accepted (about V²/2 ≈ 20 000 guided modes); beyond it ray optics is the tool.
  static constexpr double max_v_number() { return 200.0; }
};

enum class ModeFamily { TE, TM, HE, EH, LP };

const char* family_name(ModeFamily family);

/// One guided mode. For TE/TM nu = 0; for LP, nu is the azimuthal order l.
struct StepIndexMode {
  ModeFamily family = ModeFamily::HE;
  int nu = 0;  ///< azimuthal order ν (l for LP)
  int m = 0;   ///< radial order, 1, 2, ... in order of decreasing n_eff within (family, nu)
  std::string label;  ///< "HE11", "TE01", "EH21", "LP11"; "HE12,3" once ν or m has two digits
  double n_eff = 0.0;
  double beta = 0.0;  ///< propagation constant β (1/µm), fields ∝ exp(j(ωt − βz))
  double u = 0.0;     ///< U
  double w = 0.0;     ///< W
  double b = 0.0;     ///< W²/V²
  double cutoff_v = 0.0;  ///< V at which this mode stops being guided (0 for HE11 and LP01)
  int degeneracy() const;  ///< see the header comment
};

/// Label of a mode: family, ν, m ("HE11"; "EH10,2" when ν or m >= 10, to stay unambiguous).
std::string mode_label(ModeFamily family, int nu, int m);

/// Every guided vector mode (TE0m, TM0m, HEνm, EHνm) from the exact characteristic equation,
/// sorted by descending n_eff. U is refined to ~1e-15 relative. Throws InputError for an invalid
/// fibre and ComputationError if the roots found disagree with the count implied by the cutoffs.
std::vector<StepIndexMode> solve_vector_modes(const StepIndexFibre& fibre);

/// Every guided LP mode of the weak-guidance equation U J_{l-1}(U)/J_l(U) = −W K_{l-1}(W)/K_l(W),
/// sorted by descending n_eff (n_eff from b with the fibre's own n_core, n_clad).
std::vector<StepIndexMode> solve_lp_modes(const StepIndexFibre& fibre);

/// One mode by (family, nu, m), or nothing if it is not guided at this V.
std::optional<StepIndexMode> solve_mode(const StepIndexFibre& fibre, ModeFamily family, int nu,
                                        int m);

/// The cutoff V values of (family, nu), ascending, all below v_max (exact: Snyder & Love Table
/// 12-4 for the vector modes, zeros of J_{l-1} for LP_l).
std::vector<double> cutoff_v_numbers(const StepIndexFibre& fibre, ModeFamily family, int nu,
                                     double v_max);

/// The characteristic function h(U) of (family, nu) at the fibre's V: zero at the modes, with
/// poles (+inf just above, −inf just below) at the zeros of J_nu (J_1 for TE/TM, J_l for LP_l).
/// Exposed for tests and for later dβ/dk work; see docs/step-index.md for its exact form.
double characteristic_function(const StepIndexFibre& fibre, ModeFamily family, int nu, double u);

/// Labels of the vector modes that make up an LP mode under weak guidance: LP0m = HE1m;
/// LP1m = TE0m + TM0m + HE2m; LPlm = EH(l−1)m + HE(l+1)m (Snyder & Love Table 14-1).
std::vector<std::string> lp_constituents(const StepIndexMode& lp);

/// Azimuthal orientation of a hybrid mode: Even has E_z ∝ cos(νφ), H_z ∝ sin(νφ) (HE11 Even is
/// x-polarised); Odd has E_z ∝ sin(νφ), H_z ∝ −cos(νφ) (HE11 Odd is y-polarised). Ignored for
/// TE0m (E_z = 0) and TM0m (H_z = 0), which are rotationally symmetric.
enum class Orientation { Even, Odd };

/// Complex phasor fields at one point, time dependence exp(j(ωt − βz)); E in V/m, H in A/m.
/// Phase: E_t and H_t are real, E_z and H_z imaginary (−jE_z real, as in solver/mode.hpp).
struct FieldPoint {
  Eigen::Vector3cd e_xyz, h_xyz;        ///< (x, y, z) components
  Eigen::Vector3cd e_cyl, h_cyl;        ///< (r, φ, z) components; φ = 0 taken at r = 0
};

/// The field of one vector mode, normalised to 1 W: ½ Re ∫ (E × H*)·ẑ dA = 1 W with dA in m²
/// (docs/conventions.md). The power integral is done in closed form (Lommel integrals,
/// docs/step-index.md) and checked against 2-D quadrature in the tests.
class StepIndexField {
public:
  /// Throws InputError for an LP mode (the scalar modes have no vector field here).
  StepIndexField(const StepIndexFibre& fibre, const StepIndexMode& mode,
                 Orientation orientation = Orientation::Even);

  FieldPoint at(double x_um, double y_um) const;
  /// Which side's formula to use at r = a (both agree there to rounding; tests compare them).
  enum class Side { Automatic, Core, Cladding };
  /// The field at polar position (r, φ); Automatic uses the core formula for r <= a.
  FieldPoint at_polar(double r_um, double phi_rad, Side side = Side::Automatic) const;
  /// After normalisation: E_z = j A cos(νφ + ψ) and H_z = j B sin(νφ + ψ) at r = a; A (V/m), B (A/m).
  double e_z_amplitude() const { return a_; }
  double h_z_amplitude() const { return b_; }
  const StepIndexMode& mode() const { return mode_; }

private:
  double unnormalised_power_w() const;

  StepIndexFibre fibre_;
  StepIndexMode mode_;
  double psi_ = 0.0;   ///< azimuthal phase: E_z ∝ cos(νφ + ψ), H_z ∝ sin(νφ + ψ)
  double a_ = 0.0;     ///< E_z amplitude at r = a (V/m)
  double b_ = 0.0;     ///< H_z amplitude at r = a (A/m)
  double k0_ = 0.0, kappa_ = 0.0, gamma_ = 0.0;  ///< k0, U/a, W/a (1/µm)
  double j_nu_u_ = 0.0;     ///< J_ν(U)
  double log_k_nu_w_ = 0.0; ///< log K_ν(W)
};

// ---- dispersion: a fibre of dispersive glasses -------------------------------------------------

/// Index of one medium against vacuum wavelength (µm): n, dn/dλ and d²n/dλ² there.
using IndexModel = std::function<IndexDerivatives(double wavelength_um)>;

/// The index of a dispersion model (its validity range applies: outside it, InputError).
IndexModel index_model(const DispersionModel& model);
/// A local quadratic model n(λ) = n + n'(λ − λ0) + ½ n''(λ − λ0)² from the index and its two
/// derivatives at λ0: exact for n_g and D at λ0, which depend on n, n' and n'' only.
IndexModel index_model(double wavelength_um, const IndexDerivatives& at_wavelength);
/// A constant index (dn/dλ = 0).
IndexModel index_model(double n);

/// A round step-index fibre whose core and cladding indices depend on wavelength.
struct DispersiveStepIndexFibre {
  IndexModel n_core;
  IndexModel n_clad;
  double radius_um = 0.0;
  /// The fibre at one vacuum wavelength (indices evaluated there).
  StepIndexFibre at(double wavelength_um) const;
};

/// Group index and chromatic dispersion of one mode at one wavelength.
struct StepIndexModeDispersion {
  StepIndexMode mode;                   ///< the mode at the wavelength
  double n_group = 0.0;                 ///< n_g = dβ/dk0 (material dispersion included)
  double dispersion_ps_per_nm_km = 0.0; ///< D = (1/c) dn_g/dλ = −(k0²/2πc) d²β/dk0²
  /// |Richardson value − plain central difference at the finer step|: a bound on the error of
  /// the plain difference, hence (the Richardson error being far smaller) a conservative bound.
  double n_group_error = 0.0;
  double dispersion_error_ps_per_nm_km = 0.0;
};

/// n_g and D of mode (family, nu, m) at `wavelength_um` by central differences of the exact β(k0)
/// at k0 ± h and k0 ± 2h, h = relative_step·k0, combined by one Richardson step (error O(h⁴);
/// docs/step-index.md "Dispersion"). Nothing if the mode is not guided at every stencil point.
/// With root accuracy ~1e-15 and h = 1e-3 k0: n_g to ~1e-11, D to ~1e-5 ps/(nm·km).
std::optional<StepIndexModeDispersion> step_index_dispersion(const DispersiveStepIndexFibre& fibre,
                                                             double wavelength_um, ModeFamily family,
                                                             int nu, int m,
                                                             double relative_step = 1e-3);

/// n_g of mode (family, nu, m) by implicit differentiation of its characteristic equation
/// h(U; k0) = 0 (characteristic_function) at the root: dU/dk0 = −(∂h/∂k0)_U / (∂h/∂U)_k0, the
/// partial derivatives by 5-point differences of h, and from β² = k0² n1² − U²/a²,
///   n_g = [k0 n1 (n1 − λ dn1/dλ) − U (dU/dk0)/a²] / β.
/// Independent of the root finding at other wavelengths; used to check step_index_dispersion().
std::optional<double> step_index_group_index_implicit(const DispersiveStepIndexFibre& fibre,
                                                      double wavelength_um, ModeFamily family, int nu,
                                                      int m);

/// Cutoff of TE0m in a fibre whose cladding ends at an electric wall (tangential E = 0) of
/// radius R: the V at which n_eff = n_clad, root of U J0(U)/J1(U) = −2ε/(1 − ε), ε = (a/R)²,
/// next to j_{0,m} (derivation in docs/step-index.md "Cutoff in a walled cladding"). As R → ∞ it
/// tends to j_{0,m}; V_c ≈ j_{0,m} (1 + 2ε/j_{0,m}²) for small ε.
double te_cutoff_v_with_electric_wall(int m, double core_radius_over_wall_radius);

/// Impedance of free space Z0 = μ0 c (Ω), CODATA 2018.
inline constexpr double kFreeSpaceImpedance = 376.730313668;

}  // namespace cladwise
