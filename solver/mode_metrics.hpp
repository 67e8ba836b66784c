// Mode metrics: the numbers a fibre or waveguide designer reads off one guided mode, computed by
// element quadrature of the exact element fields (ModeFieldEvaluator::at_reference on the curved
// isoparametric map), never from nodal averages. Definitions, choices and sources: docs/metrics.md.
//
//   effective area        A_eff = (∫|E_t|² dA)² / ∫|E_t|⁴ dA                    (ITU-T G.650.2)
//   Petermann II MFD      2W = 2 [2 ∫|E_p|² dA / ∫|∇E_p|² dA]^½                  (ITU-T G.650.2)
//                         E_p = p̂·E_t, the transverse field along its principal polarisation axis,
//                         ∫|∇E_p|² = ∫(k0²n² − β²)|E_p|² (scalar wave equation, by parts)
//   directional forms     2W_x = 2 [∫|E_p|² dA / ∫|∂E_p/∂x|² dA]^½, likewise y (both give 2w_x,
//                         2w_y for exp(−x²/w_x² − y²/w_y²); the circular form is their harmonic
//                         mean in the sense 2/W² = 1/W_x² + 1/W_y²)
//   Gaussian-fit MFD      2w maximising |∫E_p g_w dA|² / (∫|E_p|² ∫g_w²), g_w = exp(−r²/w²) about
//                         the power centroid (D. Marcuse, BSTJ 56, 703 (1977))
//   1/e² widths           full widths of S_z along x and y through the power centroid where S_z
//                         falls to 1/e² of its maximum on that line; D4σ widths 4[∫(x−x_c)² S_z /
//                         ∫S_z]^½ (ISO 11146 second-moment widths; equal to the 1/e² width for a
//                         Gaussian beam)
//   power fraction        ∫_region S_z dA / ∫ S_z dA per mesh region (confinement)
//   TE / TM fractions     ∫|E_t|² / ∫|E|² and ∫|H_t|² / ∫|H|² (1 for a TE, resp. TM, mode)
//   polarisation          principal axis of C = ∫ Re[E_t E_tᴴ] dA: angle from x (deg), the share
//                         of the major axis λ_max/(λ_max+λ_min), and ∫|E_x|² / ∫|E_t|²
//   nonlinear coefficient γ = 2π n2 / (λ A_eff) (G. P. Agrawal, "Nonlinear Fiber Optics", §2.3)
//   power centroid        ∫ x S_z dA / ∫ S_z dA
// Units are in the member names (µm, µm², 1/(W·km), deg); fractions are dimensionless.
#pragma once

#include <Eigen/Core>

#include <complex>
#include <optional>
#include <string>
#include <vector>

#include "solver/dof_map.hpp"
#include "solver/mesh_locator.hpp"
#include "solver/mode.hpp"
#include "solver/mode_fields.hpp"
#include "solver/mode_solver.hpp"

namespace cladwise {

/// One quadrature point of a mode's fields over the cross-section.
struct FieldQuadraturePoint {
  Eigen::Vector2d x;        ///< physical position (µm)
  double weight_um2 = 0.0;  ///< quadrature weight × det J (µm²)
  int triangle = -1;
  int region = -1;
  FieldSample field;        ///< normalised E (V/m), H (A/m)
  /// ∂E_i/∂x_j of the transverse field inside the element (V/m per µm): row i = E_x, E_y,
  /// column j = ∂/∂x, ∂/∂y. Central differences of the element polynomial in reference
  /// coordinates (exact for straight order ≤ 2 elements up to rounding), mapped by J⁻ᵀ. Zero when
  /// gradients were not requested.
  Eigen::Matrix2cd grad_et = Eigen::Matrix2cd::Zero();
};

/// Every quadrature point of the mesh with the mode's fields. The rule is exact to degree 4p on
/// straight elements (p = element order), the degree of |E|⁴ (effective area). A rule of degree
/// 4p + 2 changes the metrics of cases/dispersion_smf.toml and seven_core.toml by < 3e-12.
std::vector<FieldQuadraturePoint> sample_mode(const ModeFieldEvaluator& fields, const Mesh& mesh,
                                              int order, bool with_gradients);

struct MetricOptions {
  /// Nonlinear refractive index of the glass that carries the mode (m²/W); 2.6e-20 m²/W is the
  /// usual figure for fused silica at 1.55 µm (common practice). NaN: γ is not computed.
  double n2_m2_per_w = 2.6e-20;
  bool gaussian_fit = true;         ///< compute the Gaussian-fit MFD (a 1-D search)
  bool intensity_widths = true;     ///< compute the 1/e² line-cut widths (needs point location)
  const MeshLocator* locator = nullptr;  ///< reused if given; else built when needed
  /// This mode's sample_mode(fields, mesh, order, true), reused if given (e.g. shared with the
  /// mode's label); else sampled here.
  const std::vector<FieldQuadraturePoint>* samples = nullptr;
};

struct RegionPower {
  std::string region;  ///< mesh region name
  double fraction = 0.0;
};

struct ModeMetrics {
  double effective_area_um2 = 0.0;
  /// Petermann II diameter, circular form, with ∫|∇E_p|² dA evaluated as ∫(k0²n² − β²)|E_p|² dA
  /// (the scalar wave equation ∇²ψ + (k0²n² − β²)ψ = 0 integrated by parts; exact for a scalar
  /// mode, and for a vector mode it omits the interface terms of the O(Δ) jump of E_p). No field
  /// derivatives enter, so it converges like the eigenvalue; see docs/metrics.md.
  double mfd_petermann_um = 0.0;
  /// Directional Petermann II along x and y: ∫|∂E_p/∂x|² and ∫|∂E_p/∂y|² are the total above
  /// split in the ratio of the element-gradient integrals.
  double mfd_petermann_x_um = 0.0;
  double mfd_petermann_y_um = 0.0;
  /// Petermann II from element gradients of E_p (central differences inside each element).
  /// The gradient of an order-p Nédélec field converges one order slower than the field; kept as
  /// a diagnostic of the vector (interface) correction.
  double mfd_petermann_gradient_um = 0.0;
  double mfd_gaussian_um = 0.0;       ///< Gaussian-fit diameter 2w (0 if not computed)
  double width_1e2_x_um = 0.0;        ///< 1/e² full width of S_z along x through the centroid
  double width_1e2_y_um = 0.0;
  double width_d4sigma_x_um = 0.0;    ///< second-moment (D4σ) full width of S_z along x
  double width_d4sigma_y_um = 0.0;
  double centroid_x_um = 0.0;         ///< power centroid
  double centroid_y_um = 0.0;
  std::vector<RegionPower> power_fraction;  ///< per mesh region, in mesh order
  double te_fraction = 0.0;           ///< ∫|E_t|² / ∫|E|²
  double tm_fraction = 0.0;           ///< ∫|H_t|² / ∫|H|²
  double polarisation_angle_deg = 0.0;  ///< principal axis of E_t from x, in (−90, 90]
  double polarisation_purity = 0.0;   ///< λ_max / (λ_max + λ_min) of the E_t covariance, in [½, 1]
  double x_fraction = 0.0;            ///< ∫|E_x|² / ∫|E_t|²
  double nonlinear_coefficient_per_w_km = 0.0;  ///< γ (NaN when n2 is NaN)
  double power_w = 0.0;               ///< ½ Re ∫ (E×H*)·ẑ dA of the fields used (1 W check)
};

/// All metrics of one mode. `problem` and `dofs` are the ones the mode was solved on.
ModeMetrics mode_metrics(const ModeProblem& problem, const DofMap& dofs, const Mode& mode,
                         const MetricOptions& options = {});
/// Same, from an existing evaluator of that mode.
ModeMetrics mode_metrics(const ModeFieldEvaluator& fields, const ModeProblem& problem,
                         const DofMap& dofs, const Mode& mode, const MetricOptions& options = {});

/// Gaussian-fit mode-field radius w (µm) of the quadrature samples of a mode about (cx, cy), with
/// E_p = p̂·E_t: maximises the overlap with exp(−r²/w²) (golden-section search in log w).
double gaussian_fit_radius_um(const std::vector<FieldQuadraturePoint>& samples,
                              const Eigen::Vector2d& polarisation, double cx_um, double cy_um);

/// γ = 2π n2 / (λ A_eff) in 1/(W·km), from n2 (m²/W), λ (µm) and A_eff (µm²).
double nonlinear_coefficient_per_w_km(double n2_m2_per_w, double wavelength_um,
                                      double effective_area_um2);

// ---- polarisation-maintaining fibres ---------------------------------------------------------

struct Birefringence {
  double phase = 0.0;           ///< B = n_x − n_y (x, y: the two fundamental polarisations)
  double beat_length_mm = 0.0;  ///< L_B = λ / |B| (mm); +inf when B = 0
  std::optional<double> group;  ///< B_g = n_g,x − n_g,y, when both group indices are given
  /// Differential group delay per length |B_g| / c (ps/km), when group indices are given.
  std::optional<double> dgd_ps_per_km;
};

/// Birefringence of a polarisation pair from its effective indices (and group indices, which
/// another part of the solver provides), at vacuum wavelength λ (µm).
Birefringence birefringence(double n_eff_x, double n_eff_y, double wavelength_um,
                            std::optional<double> n_group_x = {},
                            std::optional<double> n_group_y = {});

/// Indices into `metrics` of the fundamental x- and y-polarised modes: the first (highest n_eff,
/// metrics given in descending n_eff) mode whose principal axis is nearer x, resp. y, than 45°.
/// Nothing when one of them is missing.
struct PolarisationPair {
  int x_mode = -1;
  int y_mode = -1;
};
std::optional<PolarisationPair> fundamental_polarisation_pair(const std::vector<ModeMetrics>& metrics);

}  // namespace cladwise
