// Step-index fibre: exact vector modes, weak-guidance LP modes, cutoffs and normalised fields.
// Equations and strategy: docs/step-index.md (Snyder & Love 1983 ch. 12 and 14; Okamoto ch. 3).
#include "solver/step_index.hpp"

#include <algorithm>
#include <cassert>
#include <cmath>
#include <limits>
#include <numbers>
#include <sstream>

#include "mesh/error.hpp"
#include "solver/bessel.hpp"
#include "solver/scalar_root.hpp"

namespace cladwise {
namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();
constexpr double kPi = std::numbers::pi;

struct Indices {
  double n1sq, n2sq, delta, v;  // n_core², n_clad², n_core² − n_clad², V
};

Indices indices_of(const StepIndexFibre& f) {
  return {f.n_core * f.n_core, f.n_clad * f.n_clad,
          (f.n_core - f.n_clad) * (f.n_core + f.n_clad), f.v_number()};
}

// W from U without cancellation near cutoff (U → V).
double w_of(double v, double u) { return std::sqrt(std::max(0.0, (v - u) * (v + u))); }

// Order of the Bessel function whose zeros are the poles of h(U) for (family, nu).
int pole_order(ModeFamily family, int nu) {
  switch (family) {
    case ModeFamily::TE:
    case ModeFamily::TM: return 1;
    default: return nu;
  }
}

// The hybrid-mode function h(U) = p − ν − X_s (docs/step-index.md, "Hybrid modes"), from the exact
// equation (Snyder & Love ch. 12)
//   (J'/(UJ) + K'/(WK)) (n1² J'/(UJ) + n2² K'/(WK)) = ν² (β/k)² (1/U² + 1/W²)²
// written as a quadratic in X = U² J'_ν/(U J_ν) = p − ν with p = U J_{ν−1}(U)/J_ν(U):
//   n1² X² + (n1² + n2²) X Y + n2² Y² − R = 0,  Y = −(U²/W²)(q + ν),  q = W K_{ν−1}(W)/K_ν(W),
//   R = ν² (β/k)² V⁴/W⁴.
// EH takes the larger root X_+ and HE the smaller X_−. Everything is scaled by W²/V² (X̂ = X W²/V²
// etc.) so that nothing overflows as W → 0, X_− = (n2² Y² − R)/(n1² X_+) avoids the cancellation
// of the textbook ± form, and n2² Y² − R is expanded so that its 1/W⁴ terms cancel exactly
// ((β/k)² = n2² + (n1² − n2²) W²/V²):
//   (n2² Y² − R) W⁴/V⁴ / W² = n2² (U⁴/V⁴)(q/W²)(2ν + q) − ν² n2² (W² + 2U²)/V⁴ − ν² (n1² − n2²)/V².
double hybrid_function(const Indices& c, int nu, double u, double w, bool eh) {
  const double p = u * bessel::j_ratio(nu, u);
  if (!std::isfinite(p)) return p;  // at a pole
  const double kr = bessel::k_ratio(nu, w);  // q = W kr
  const double q = w * kr;
  const double v2 = c.v * c.v, u2v = (u * u) / v2, w2v = (w * w) / v2;
  const double nu2 = static_cast<double>(nu) * nu;
  const double y_hat = -u2v * (q + nu);
  const double r_hat = nu2 * (c.n2sq + c.delta * w2v);
  const double s = std::sqrt(c.delta * c.delta * y_hat * y_hat + 4.0 * c.n1sq * r_hat);
  const double x_plus_hat = (-(c.n1sq + c.n2sq) * y_hat + s) / (2.0 * c.n1sq);
  if (eh) return p - nu - x_plus_hat / w2v;
  const double d_hat_over_w2 = c.n2sq * u2v * u2v * (kr / w) * (2.0 * nu + q) -
                               nu2 * c.n2sq * (w2v + 2.0 * u2v) / v2 - nu2 * c.delta / v2;
  const double x_minus = d_hat_over_w2 * v2 / (c.n1sq * x_plus_hat);
  return p - nu - x_minus;
}

// h(U) of (family, nu); W is passed in so that a root near cutoff can be refined in W (U = V
// loses W to rounding once W < sqrt(eps) V).
double function_at(const Indices& c, ModeFamily family, int nu, double u, double w) {
  switch (family) {
    case ModeFamily::TE:  // J1/(U J0) + K1/(W K0) = 0, inverted: U J0/J1 + W K0/K1 = 0
      return u * bessel::j_ratio(1, u) + w * bessel::k_ratio(1, w);
    case ModeFamily::TM:  // n1² J1/(U J0) + n2² K1/(W K0) = 0, inverted likewise
      return u * bessel::j_ratio(1, u) + (c.n1sq / c.n2sq) * w * bessel::k_ratio(1, w);
    case ModeFamily::LP:
      if (nu == 0) {  // U J_{−1}/J_0 = −W K_{−1}/K_0 with J_{−1} = −J_1, K_{−1} = K_1
        return -u / bessel::j_ratio(1, u) + w / bessel::k_ratio(1, w);
      }
      return u * bessel::j_ratio(nu, u) + w * bessel::k_ratio(nu, w);
    case ModeFamily::HE: return hybrid_function(c, nu, u, w, false);
    case ModeFamily::EH: return hybrid_function(c, nu, u, w, true);
  }
  return std::numeric_limits<double>::quiet_NaN();
}

double function_at(const Indices& c, ModeFamily family, int nu, double u) {
  return function_at(c, family, nu, u, w_of(c.v, u));
}

// lim h(U) as U → V⁻ (W → 0), from W K_{ν−1}/K_ν → 0 (A&S 9.6.9): finite for TE, TM, LP and
// HE_ν (ν >= 2), −inf for HE_1 and EH (derivation in docs/step-index.md).
double function_at_v(const Indices& c, ModeFamily family, int nu) {
  const double v = c.v;
  switch (family) {
    case ModeFamily::TE:
    case ModeFamily::TM: return v * bessel::j_ratio(1, v);
    case ModeFamily::LP: return nu == 0 ? -v / bessel::j_ratio(1, v) : v * bessel::j_ratio(nu, v);
    case ModeFamily::EH: return -kInf;
    case ModeFamily::HE:
      if (nu == 1) return -kInf;
      return v * bessel::j_ratio(nu, v) - c.n2sq * v * v / ((nu - 1.0) * (c.n1sq + c.n2sq));
  }
  return std::numeric_limits<double>::quiet_NaN();
}

// Roots of h in (0, V): each branch between consecutive poles is sampled at Chebyshev-clustered
// points (dense near both ends, where near-cutoff roots and poles sit), with the exact end values
// (+inf right of a pole, −inf left of one, the limit at V), and each sign change refined by Brent.
struct Root {
  double u, w;
};

std::vector<Root> roots_in_u(const Indices& c, ModeFamily family, int nu, int samples) {
  const double v = c.v;
  std::vector<double> ends{0.0};
  for (double z : bessel::j_zeros(pole_order(family, nu), v)) {
    if (z < v) ends.push_back(z);
  }
  ends.push_back(v);
  auto h = [&](double u) { return function_at(c, family, nu, u); };
  // Near cutoff (W ≪ U) the root is refined again in W, with U = sqrt((V − W)(V + W)), so that
  // W, b = W²/V² and n_eff − n_clad keep full relative precision.
  auto h_of_w = [&](double w) { return function_at(c, family, nu, w_of(v, w), w); };
  auto refine = [&](double ua, double ub, double fa, double fb) {
    const double u = brent_root(h, ua, ub, fa, fb);
    const double w = w_of(v, u);
    if (w > 0.25 * u) return Root{u, w};
    const double wr = brent_root(h_of_w, w_of(v, ub), w_of(v, ua), fb, fa);
    return Root{w_of(v, wr), wr};
  };
  std::vector<Root> roots;
  for (std::size_t i = 0; i + 1 < ends.size(); ++i) {
    const double lo = ends[i], hi = ends[i + 1];
    const bool last = (i + 2 == ends.size());
    std::vector<double> us, hs;
    if (i == 0) {
      // h(0⁺) > 0 for TE, TM, LP (p → 2ν or 0, the K term > 0) and HE (h → 2ν). For EH h → 0⁻,
      // and EH_ν has no root below j_{ν,1}: its modes cut off at the zeros of J_ν and a root
      // cannot cross a pole as V grows, so EH_νm lives in branch m + 1 (docs/step-index.md).
      if (family == ModeFamily::EH) continue;
      us.push_back(0.0);
      hs.push_back(kInf);
    } else {
      us.push_back(lo);
      hs.push_back(kInf);
    }
    for (int k = 1; k <= samples; ++k) {
      const double t = 0.5 * (1.0 - std::cos(kPi * k / (samples + 1.0)));
      const double u = lo + (hi - lo) * t;
      if (u <= us.back() || u >= hi) continue;
      us.push_back(u);
      hs.push_back(h(u));
    }
    us.push_back(hi);
    hs.push_back(last ? function_at_v(c, family, nu) : -kInf);
    for (std::size_t k = 0; k + 1 < us.size(); ++k) {
      if (std::isnan(hs[k]) || std::isnan(hs[k + 1])) {
        throw ComputationError("step-index fibre: the characteristic function of " +
                               std::string(family_name(family)) + " order " + std::to_string(nu) +
                               " is not a number near U = " + std::to_string(us[k]));
      }
      if (hs[k] == 0.0) {
        if (k > 0) roots.push_back({us[k], w_of(v, us[k])});
        continue;
      }
      if ((hs[k] > 0) != (hs[k + 1] > 0) && hs[k + 1] != 0.0) {
        roots.push_back(refine(us[k], us[k + 1], hs[k], hs[k + 1]));
      }
    }
  }
  std::sort(roots.begin(), roots.end(), [](const Root& a, const Root& b) { return a.u < b.u; });
  return roots;
}

// Zeros of the HE_ν (ν >= 2) cutoff function (n1²/n2² + 1) J_{ν−1}(V) − V J_ν(V)/(ν − 1)
// (Snyder & Love Table 12-4). They lie above j_{ν−2,1} > ν − 2 and are about π apart; a scan with
// step 0.05 sees each as one sign change.
std::vector<double> he_cutoffs(const Indices& c, int nu, double v_max) {
  const double ratio = c.n1sq / c.n2sq + 1.0;
  auto f = [&](double x) {
    return ratio * std::cyl_bessel_j(nu - 1.0, x) - x * std::cyl_bessel_j(double(nu), x) / (nu - 1.0);
  };
  std::vector<double> out;
  const double step = 0.05;
  double a = std::max(nu - 2.0, step), fa = f(a);
  while (a < v_max) {
    const double b = a + step, fb = f(b);
    if ((fa > 0) != (fb > 0) && fa != 0.0) {
      const double z = (fb == 0.0) ? b : brent_root(f, a, b, fa, fb);
      if (z < v_max) out.push_back(z);
    }
    a = b;
    fa = fb;
  }
  return out;
}

std::vector<double> cutoffs_of(const Indices& c, ModeFamily family, int nu, double v_max) {
  std::vector<double> out;
  auto zeros_below = [&](int order) {
    for (double z : bessel::j_zeros(order, v_max)) {
      if (z < v_max) out.push_back(z);
    }
  };
  switch (family) {
    case ModeFamily::TE:
    case ModeFamily::TM: zeros_below(0); break;  // J_0(V) = 0
    case ModeFamily::EH: zeros_below(nu); break;  // J_ν(V) = 0, V > 0
    case ModeFamily::HE:
      if (nu == 1) {  // J_1(V) = 0 with V = 0 counted: HE11 never cuts off
        out.push_back(0.0);
        zeros_below(1);
      } else {
        out = he_cutoffs(c, nu, v_max);
      }
      break;
    case ModeFamily::LP:
      if (nu == 0) {  // J_{−1} = −J_1: zeros of J_1 and V = 0 (LP01 never cuts off)
        out.push_back(0.0);
        zeros_below(1);
      } else {
        zeros_below(nu - 1);
      }
      break;
  }
  return out;
}

// Modes of one (family, nu), checked against the number implied by the cutoffs. The tolerance
// band admits a mode whose cutoff is within rounding of V either way.
std::vector<StepIndexMode> family_modes(const StepIndexFibre& fibre, const Indices& c,
                                        ModeFamily family, int nu) {
  const double v = c.v;
  const auto cutoffs = cutoffs_of(c, family, nu, v * (1.0 + 1e-12));
  const auto n_certain = static_cast<std::size_t>(
      std::count_if(cutoffs.begin(), cutoffs.end(), [&](double x) { return x < v * (1.0 - 1e-12); }));
  std::vector<Root> roots;
  bool consistent = false;
  for (int samples : {16, 64, 256}) {
    roots = roots_in_u(c, family, nu, samples);
    if (roots.size() >= n_certain && roots.size() <= cutoffs.size()) {
      consistent = true;
      break;
    }
  }
  if (!consistent) {
    std::ostringstream msg;
    msg << "step-index fibre: found " << roots.size() << " " << family_name(family) << " modes of order "
        << nu << " but the cutoffs imply " << n_certain << " at V = " << v
        << " (change the wavelength slightly; please report this case)";
    throw ComputationError(msg.str());
  }
  const double k0 = fibre.k0_per_um();
  std::vector<StepIndexMode> out;
  for (std::size_t i = 0; i < roots.size(); ++i) {
    StepIndexMode mode;
    mode.family = family;
    mode.nu = nu;
    mode.m = static_cast<int>(i) + 1;
    mode.label = mode_label(family, nu, mode.m);
    mode.u = roots[i].u;
    mode.w = roots[i].w;
    mode.b = (mode.w / v) * (mode.w / v);
    mode.n_eff = std::sqrt(c.n2sq + c.delta * mode.b);
    mode.beta = k0 * mode.n_eff;
    mode.cutoff_v = cutoffs[i];
    out.push_back(mode);
  }
  return out;
}

void sort_by_n_eff(std::vector<StepIndexMode>& modes) {
  std::stable_sort(modes.begin(), modes.end(),
                   [](const StepIndexMode& a, const StepIndexMode& b) { return a.n_eff > b.n_eff; });
}

}  // namespace

// ---- fibre ------------------------------------------------------------------------------------

void StepIndexFibre::validate() const {
  auto require = [](bool ok, const char* where, const std::string& what) {
    if (!ok) throw InputError(where, what);
  };
  auto show = [](double x) {
    std::ostringstream s;
    s.precision(12);
    s << x;
    return s.str();
  };
  require(std::isfinite(n_core) && n_core > 0, "n_core",
          "core index " + show(n_core) + " must be a finite number > 0");
  require(std::isfinite(n_clad) && n_clad > 0, "n_clad",
          "cladding index " + show(n_clad) + " must be a finite number > 0");
  require(n_core > n_clad, "n_core",
          "core index " + show(n_core) + " must exceed the cladding index " + show(n_clad) +
              " for the core to guide light");
  require(std::isfinite(radius_um) && radius_um > 0, "radius_um",
          "core radius " + show(radius_um) + " um must be a finite number > 0");
  require(std::isfinite(wavelength_um) && wavelength_um > 0, "wavelength_um",
          "wavelength " + show(wavelength_um) + " um must be a finite number > 0");
  require(v_number() <= max_v_number(), "radius_um",
          "V = " + show(v_number()) + " exceeds " + show(max_v_number()) +
              " (more than ~20000 guided modes); use a smaller core radius or a longer wavelength");
}

double StepIndexFibre::k0_per_um() const { return 2.0 * kPi / wavelength_um; }
double StepIndexFibre::numerical_aperture() const {
  return std::sqrt((n_core - n_clad) * (n_core + n_clad));
}
double StepIndexFibre::v_number() const { return k0_per_um() * radius_um * numerical_aperture(); }
double StepIndexFibre::relative_index_difference() const {
  return (n_core - n_clad) * (n_core + n_clad) / (2.0 * n_core * n_core);
}

// ---- modes ------------------------------------------------------------------------------------

const char* family_name(ModeFamily family) {
  switch (family) {
    case ModeFamily::TE: return "TE";
    case ModeFamily::TM: return "TM";
    case ModeFamily::HE: return "HE";
    case ModeFamily::EH: return "EH";
    case ModeFamily::LP: return "LP";
  }
  return "?";
}

std::string mode_label(ModeFamily family, int nu, int m) {
  std::string s = family_name(family);
  s += std::to_string(nu);
  if (nu >= 10 || m >= 10) s += ',';
  s += std::to_string(m);
  return s;
}

int StepIndexMode::degeneracy() const {
  switch (family) {
    case ModeFamily::TE:
    case ModeFamily::TM: return 1;
    case ModeFamily::HE:
    case ModeFamily::EH: return 2;
    case ModeFamily::LP: return nu == 0 ? 2 : 4;
  }
  return 0;
}

std::vector<StepIndexMode> solve_vector_modes(const StepIndexFibre& fibre) {
  fibre.validate();
  const Indices c = indices_of(fibre);
  std::vector<StepIndexMode> modes;
  for (ModeFamily f : {ModeFamily::TE, ModeFamily::TM}) {
    auto fm = family_modes(fibre, c, f, 0);
    modes.insert(modes.end(), fm.begin(), fm.end());
  }
  // HE_ν has the lowest cutoff of order ν, and cutoffs rise with ν: stop at the first ν >= 2 with
  // no HE mode.
  for (int nu = 1;; ++nu) {
    auto he = family_modes(fibre, c, ModeFamily::HE, nu);
    auto eh = family_modes(fibre, c, ModeFamily::EH, nu);
    if (he.empty() && eh.empty() && nu >= 2) break;
    modes.insert(modes.end(), he.begin(), he.end());
    modes.insert(modes.end(), eh.begin(), eh.end());
  }
  sort_by_n_eff(modes);
  return modes;
}

std::vector<StepIndexMode> solve_lp_modes(const StepIndexFibre& fibre) {
  fibre.validate();
  const Indices c = indices_of(fibre);
  std::vector<StepIndexMode> modes;
  for (int l = 0;; ++l) {
    auto lp = family_modes(fibre, c, ModeFamily::LP, l);
    if (lp.empty()) break;  // LP_l cuts off at j_{l−1,1}, which rises with l
    modes.insert(modes.end(), lp.begin(), lp.end());
  }
  sort_by_n_eff(modes);
  return modes;
}

std::optional<StepIndexMode> solve_mode(const StepIndexFibre& fibre, ModeFamily family, int nu,
                                        int m) {
  fibre.validate();
  if (m < 1 || nu < 0 || ((family == ModeFamily::TE || family == ModeFamily::TM) && nu != 0) ||
      ((family == ModeFamily::HE || family == ModeFamily::EH) && nu < 1)) {
    throw InputError("mode", "no mode " + mode_label(family, nu, m) + " exists in a step-index fibre");
  }
  const auto modes = family_modes(fibre, indices_of(fibre), family, nu);
  if (static_cast<std::size_t>(m) > modes.size()) return std::nullopt;
  return modes[static_cast<std::size_t>(m) - 1];
}

std::vector<double> cutoff_v_numbers(const StepIndexFibre& fibre, ModeFamily family, int nu,
                                     double v_max) {
  return cutoffs_of(indices_of(fibre), family, nu, v_max);
}

double characteristic_function(const StepIndexFibre& fibre, ModeFamily family, int nu, double u) {
  return function_at(indices_of(fibre), family, nu, u);
}

std::vector<std::string> lp_constituents(const StepIndexMode& lp) {
  assert(lp.family == ModeFamily::LP);
  const int l = lp.nu, m = lp.m;
  if (l == 0) return {mode_label(ModeFamily::HE, 1, m)};
  if (l == 1) {
    return {mode_label(ModeFamily::TE, 0, m), mode_label(ModeFamily::TM, 0, m),
            mode_label(ModeFamily::HE, 2, m)};
  }
  return {mode_label(ModeFamily::EH, l - 1, m), mode_label(ModeFamily::HE, l + 1, m)};
}

// ---- fields -----------------------------------------------------------------------------------
//
// E_z = A F(r) cos(νφ + ψ), H_z = B F(r) sin(νφ + ψ), F = J_ν(κr)/J_ν(U) in the core and
// K_ν(γr)/K_ν(W) in the cladding (κ = U/a, γ = W/a), so E_z and H_z are continuous by
// construction. The transverse fields follow from Maxwell's equations for exp(j(ωt − βz)),
//   E_t = (−j/k_c²)(β ∇_t E_z − ω μ0 ẑ × ∇_t H_z),  H_t = (−j/k_c²)(β ∇_t H_z + ω ε ẑ × ∇_t E_z),
// k_c² = κ² (core) or −γ² (cladding), written with J_ν' = (J_{ν−1} − J_{ν+1})/2,
// νJ_ν/x = (J_{ν−1} + J_{ν+1})/2 (A&S 9.1.27) and the K analogues (A&S 9.6.26) so that nothing
// is divided by r. Continuity of E_φ and H_φ at r = a fixes B/A (docs/step-index.md).

StepIndexField::StepIndexField(const StepIndexFibre& fibre, const StepIndexMode& mode,
                               Orientation orientation)
    : fibre_(fibre), mode_(mode) {
  fibre_.validate();
  if (mode.family == ModeFamily::LP) {
    throw InputError("mode " + mode.label,
                     "LP modes are scalar approximations; take the field of a vector mode (HE, EH, "
                     "TE, TM) instead");
  }
  const Indices c = indices_of(fibre_);
  const int nu = mode_.nu;
  const double a = fibre_.radius_um, u = mode_.u, w = mode_.w;
  k0_ = fibre_.k0_per_um();
  kappa_ = u / a;
  gamma_ = w / a;
  j_nu_u_ = bessel::j(nu, u);
  log_k_nu_w_ = bessel::log_k(nu, w);
  const double z0 = kFreeSpaceImpedance;
  switch (mode_.family) {
    case ModeFamily::TE:
      psi_ = kPi / 2;  // cos(ψ) = 0: no E_z
      a_ = 0.0;
      b_ = 1.0;
      break;
    case ModeFamily::TM:
      psi_ = 0.0;  // sin(ψ) = 0: no H_z
      a_ = 1.0;
      b_ = 0.0;
      break;
    default: {
      psi_ = orientation == Orientation::Even ? 0.0 : -kPi / 2;
      a_ = 1.0;
      // E_φ continuity:  ν (β/k)(1/U² + 1/W²) A + Z0 (Jr + Kr) B = 0,
      // H_φ continuity:  (n1² Jr + n2² Kr) A + Z0 ν (β/k)(1/U² + 1/W²) B = 0,
      // Jr = J_ν'/(U J_ν), Kr = K_ν'/(W K_ν). Both hold at a root; use the better conditioned.
      const double jr = (u * bessel::j_ratio(nu, u) - nu) / (u * u);
      const double kr = -(w * bessel::k_ratio(nu, w) + nu) / (w * w);
      const double s = nu * mode_.n_eff * (1.0 / (u * u) + 1.0 / (w * w));
      const double amp1 = (std::fabs(jr) + std::fabs(kr)) / std::fabs(jr + kr);
      const double amp2 = (c.n1sq * std::fabs(jr) + c.n2sq * std::fabs(kr)) /
                          std::fabs(c.n1sq * jr + c.n2sq * kr);
      b_ = (amp1 <= amp2) ? -s * a_ / (z0 * (jr + kr)) : -(c.n1sq * jr + c.n2sq * kr) * a_ / (z0 * s);
    }
  }
  const double p = unnormalised_power_w();
  if (!(p > 0) || !std::isfinite(p)) {
    throw ComputationError("step-index fibre: mode " + mode_.label +
                           " has no positive finite power (too close to cutoff?)");
  }
  a_ /= std::sqrt(p);
  b_ /= std::sqrt(p);
}

// ½ Re ∫ (E × H*)·ẑ dA (W) for the current A, B. With the J_{ν±1} forms of the transverse fields
// the φ integral leaves (angle factor π, or 2π for ν = 0)
//   core:     (1/4κ²)[P P1 ∫ J_{ν−1}² r dr + Q Q1 ∫ J_{ν+1}² r dr] / J_ν(U)²,
//   cladding: (1/4γ²)[P P2 ∫ K_{ν−1}² r dr + Q Q2 ∫ K_{ν+1}² r dr] / K_ν(W)²,
// P = βA + k0 Z0 B, Q = k0 Z0 B − βA, P_i = k0 n_i² A/Z0 + βB, Q_i = βB − k0 n_i² A/Z0, and the
// Lommel integrals (G. N. Watson, "A Treatise on the Theory of Bessel Functions", §5.11; from
// memory, and checked against 2-D quadrature in tests/solver/test_step_index_fields.cpp)
//   ∫_0^a J_m(κr)² r dr = (a²/2)[J_m(U)² − J_{m−1}(U) J_{m+1}(U)],
//   ∫_a^∞ K_m(γr)² r dr = (a²/2)[K_{m−1}(W) K_{m+1}(W) − K_m(W)²].
double StepIndexField::unnormalised_power_w() const {
  const Indices c = indices_of(fibre_);
  const int nu = mode_.nu;
  const double a = fibre_.radius_um, u = mode_.u, w = mode_.w, beta = mode_.beta;
  const double z0 = kFreeSpaceImpedance;
  const double pp = beta * a_ + k0_ * z0 * b_, qq = k0_ * z0 * b_ - beta * a_;
  const double p1 = k0_ * c.n1sq * a_ / z0 + beta * b_, q1 = beta * b_ - k0_ * c.n1sq * a_ / z0;
  const double p2 = k0_ * c.n2sq * a_ / z0 + beta * b_, q2 = beta * b_ - k0_ * c.n2sq * a_ / z0;
  const double angle = nu == 0 ? 2.0 * kPi : kPi;
  auto ij = [&](int m) {  // ∫_0^a J_m(κr)² r dr / J_ν(U)²
    const double jm = bessel::j(m, u) / j_nu_u_;
    return 0.5 * a * a * (jm * jm - bessel::j(m - 1, u) / j_nu_u_ * (bessel::j(m + 1, u) / j_nu_u_));
  };
  auto ik = [&](int m) {  // ∫_a^∞ K_m(γr)² r dr / K_ν(W)²
    const double lk = bessel::log_k(m, w) - log_k_nu_w_;
    const double lkm = bessel::log_k(m - 1, w) - log_k_nu_w_;
    const double lkp = bessel::log_k(m + 1, w) - log_k_nu_w_;
    return 0.5 * a * a * (std::exp(lkm + lkp) - std::exp(2.0 * lk));
  };
  const double core = angle / (4.0 * kappa_ * kappa_) * (pp * p1 * ij(nu - 1) + qq * q1 * ij(nu + 1));
  const double clad = angle / (4.0 * gamma_ * gamma_) * (pp * p2 * ik(nu - 1) + qq * q2 * ik(nu + 1));
  return (core + clad) * 1e-12;  // µm² → m²
}

FieldPoint StepIndexField::at(double x_um, double y_um) const {
  const double r = std::hypot(x_um, y_um);
  const double phi = (r == 0.0) ? 0.0 : std::atan2(y_um, x_um);
  return at_polar(r, phi);
}

FieldPoint StepIndexField::at_polar(double r_um, double phi_rad, Side side) const {
  const Indices c = indices_of(fibre_);
  const int nu = mode_.nu;
  const double beta = mode_.beta, z0 = kFreeSpaceImpedance;
  const double cs = std::cos(nu * phi_rad + psi_), sn = std::sin(nu * phi_rad + psi_);
  const double pp = beta * a_ + k0_ * z0 * b_, qq = k0_ * z0 * b_ - beta * a_;
  const std::complex<double> j(0.0, 1.0);
  const bool core = side == Side::Core || (side == Side::Automatic && r_um <= fibre_.radius_um);
  std::complex<double> er, ep, ez, hr, hp, hz;
  if (core) {
    const double x = kappa_ * r_um;
    const double fm = bessel::j(nu - 1, x) / j_nu_u_, fp = bessel::j(nu + 1, x) / j_nu_u_;
    const double f0 = bessel::j(nu, x) / j_nu_u_;
    const double p1 = k0_ * c.n1sq * a_ / z0 + beta * b_, q1 = beta * b_ - k0_ * c.n1sq * a_ / z0;
    const double g = 1.0 / (2.0 * kappa_);
    er = -j * g * (pp * fm + qq * fp) * cs;
    ep = -j * g * (-pp * fm + qq * fp) * sn;
    hr = j * g * (-p1 * fm + q1 * fp) * sn;
    hp = -j * g * (p1 * fm + q1 * fp) * cs;
    ez = a_ * f0 * cs;
    hz = b_ * f0 * sn;
  } else {
    const double x = gamma_ * r_um;
    const double fm = std::exp(bessel::log_k(nu - 1, x) - log_k_nu_w_);
    const double fp = std::exp(bessel::log_k(nu + 1, x) - log_k_nu_w_);
    const double f0 = std::exp(bessel::log_k(nu, x) - log_k_nu_w_);
    const double p2 = k0_ * c.n2sq * a_ / z0 + beta * b_, q2 = beta * b_ - k0_ * c.n2sq * a_ / z0;
    const double g = 1.0 / (2.0 * gamma_);
    er = j * g * (-pp * fm + qq * fp) * cs;
    ep = j * g * (pp * fm + qq * fp) * sn;
    hr = -j * g * (p2 * fm + q2 * fp) * sn;
    hp = j * g * (-p2 * fm + q2 * fp) * cs;
    ez = a_ * f0 * cs;
    hz = b_ * f0 * sn;
  }
  // Global phase j: the transverse fields come out real and E_z, H_z imaginary, matching the FEM
  // unknowns (e_t = βE_t, e_z = −jE_z real; solver/mode.hpp).
  er *= j; ep *= j; ez *= j; hr *= j; hp *= j; hz *= j;
  const double cp = std::cos(phi_rad), sp = std::sin(phi_rad);
  FieldPoint out;
  out.e_cyl = Eigen::Vector3cd(er, ep, ez);
  out.h_cyl = Eigen::Vector3cd(hr, hp, hz);
  out.e_xyz = Eigen::Vector3cd(er * cp - ep * sp, er * sp + ep * cp, ez);
  out.h_xyz = Eigen::Vector3cd(hr * cp - hp * sp, hr * sp + hp * cp, hz);
  return out;
}

// ---- dispersion -------------------------------------------------------------------------------
//
// β(k0) of one mode is smooth in k0 while the mode stays guided; its roots are accurate to ~1e-15
// (relative), so central differences with a modest step and one Richardson extrapolation give
// n_g and D far below any FEM error (docs/step-index.md "Dispersion"):
//   D1(h) = [β(k0 + h) − β(k0 − h)] / 2h         = β'  + β⁽³⁾ h²/6  + O(h⁴),
//   D2(h) = [β(k0 + h) − 2β(k0) + β(k0 − h)] / h² = β'' + β⁽⁴⁾ h²/12 + O(h⁴),
//   R = [4 D(h) − D(2h)] / 3 = exact + O(h⁴)   (L. F. Richardson, Phil. Trans. A 226, 299 (1927)).
// n_g = β'(k0); D = (1/c) dn_g/dλ with dk0/dλ = −k0/λ, i.e. dn_g/dλ = −(k0²/2π) β''.

IndexModel index_model(const DispersionModel& model) {
  return [model](double wavelength_um) { return model.derivatives(wavelength_um); };
}

IndexModel index_model(double wavelength_um, const IndexDerivatives& d) {
  return [wavelength_um, d](double lam) {
    const double x = lam - wavelength_um;
    return IndexDerivatives{d.n + x * d.dn_dlambda + 0.5 * x * x * d.d2n_dlambda2,
                            d.dn_dlambda + x * d.d2n_dlambda2, d.d2n_dlambda2};
  };
}

IndexModel index_model(double n) {
  return [n](double) { return IndexDerivatives{n, 0.0, 0.0}; };
}

StepIndexFibre DispersiveStepIndexFibre::at(double wavelength_um) const {
  assert(n_core && n_clad);
  return StepIndexFibre{n_core(wavelength_um).n, n_clad(wavelength_um).n, radius_um, wavelength_um};
}

std::optional<StepIndexModeDispersion> step_index_dispersion(const DispersiveStepIndexFibre& fibre,
                                                             double wavelength_um, ModeFamily family,
                                                             int nu, int m, double relative_step) {
  if (!(relative_step > 0.0 && relative_step < 0.05)) {
    throw InputError("step_index_dispersion", "relative_step must lie in (0, 0.05)");
  }
  const double k0 = 2.0 * kPi / wavelength_um, h = relative_step * k0;
  const auto centre = solve_mode(fibre.at(wavelength_um), family, nu, m);
  if (!centre) return std::nullopt;
  double beta[5];  // β(k0 + j h), j = −2..2
  beta[2] = centre->beta;
  for (int j : {-2, -1, 1, 2}) {
    const auto mode = solve_mode(fibre.at(2.0 * kPi / (k0 + j * h)), family, nu, m);
    if (!mode) return std::nullopt;
    beta[j + 2] = mode->beta;
  }
  const double d1_h = (beta[3] - beta[1]) / (2.0 * h), d1_2h = (beta[4] - beta[0]) / (4.0 * h);
  const double d2_h = (beta[3] - 2.0 * beta[2] + beta[1]) / (h * h);
  const double d2_2h = (beta[4] - 2.0 * beta[2] + beta[0]) / (4.0 * h * h);
  const double ng = (4.0 * d1_h - d1_2h) / 3.0;
  const double b2 = (4.0 * d2_h - d2_2h) / 3.0;
  // (1/c) dn_g/dλ with dn_g/dλ in 1/µm → ps/(nm·km): ×1e12/c (as dispersion_ps_per_nm_km()).
  const double scale = -(k0 * k0) / (2.0 * kPi) * 1e12 / speed_of_light_m_per_s;
  StepIndexModeDispersion out;
  out.mode = *centre;
  out.n_group = ng;
  out.dispersion_ps_per_nm_km = scale * b2;
  out.n_group_error = std::fabs(ng - d1_h);
  out.dispersion_error_ps_per_nm_km = std::fabs(scale * (b2 - d2_h));
  return out;
}

std::optional<double> step_index_group_index_implicit(const DispersiveStepIndexFibre& fibre,
                                                      double wavelength_um, ModeFamily family, int nu,
                                                      int m) {
  const StepIndexFibre f0 = fibre.at(wavelength_um);
  const auto mode = solve_mode(f0, family, nu, m);
  if (!mode) return std::nullopt;
  const double k0 = f0.k0_per_um(), u = mode->u, v = f0.v_number(), a = fibre.radius_um;
  // 5-point central differences (error O(δ⁴)); the steps stay inside the branch (U < V).
  auto five_point = [](auto&& g, double x, double d) {
    return (-g(x + 2 * d) + 8 * g(x + d) - 8 * g(x - d) + g(x - 2 * d)) / (12 * d);
  };
  const double du = 1e-4 * std::min(u, v - u);
  const double h_u =
      five_point([&](double x) { return characteristic_function(f0, family, nu, x); }, u, du);
  const double dk = 1e-4 * k0 * std::min(1.0, (v - u) / v);
  const double h_k = five_point(
      [&](double kk) { return characteristic_function(fibre.at(2.0 * kPi / kk), family, nu, u); }, k0, dk);
  const double du_dk0 = -h_k / h_u;
  const IndexDerivatives n1 = fibre.n_core(wavelength_um);
  const double n1_group = n1.n - wavelength_um * n1.dn_dlambda;
  return (k0 * n1.n * n1_group - u * du_dk0 / (a * a)) / mode->beta;
}

double te_cutoff_v_with_electric_wall(int m, double core_radius_over_wall_radius) {
  if (m < 1 || !(core_radius_over_wall_radius >= 0.0 && core_radius_over_wall_radius < 1.0)) {
    throw InputError("te_cutoff_v_with_electric_wall", "needs m >= 1 and 0 <= a/R < 1");
  }
  const double eps = core_radius_over_wall_radius * core_radius_over_wall_radius;
  const double rhs = -2.0 * eps / (1.0 - eps);
  // g(U) = U J0/J1 − rhs falls from +inf to −inf between consecutive zeros of J1 (the TE branch
  // structure of "Root bracketing" in docs/step-index.md), so the root next to j_{0,m} is the one
  // in (j_{1,m−1}, j_{1,m}), with j_{1,0} = 0.
  const auto j1 = bessel::j_zeros(1, 4.0 * (m + 1));
  const double lo = (m == 1) ? 0.0 : j1.at(m - 2), hi = j1.at(m - 1);
  auto g = [&](double x) { return x * bessel::j_ratio(1, x) - rhs; };
  return brent_root(g, lo, hi, kInf, -kInf);
}

}  // namespace cladwise
