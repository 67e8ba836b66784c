// Dispersion model evaluation: Sellmeier, Cauchy, gas (Ciddor-form) and constant formulas with
// analytic λ-derivatives, and the not-a-knot cubic spline of tabulated data (de Boor 1978, ch. IV).
// Formulas and conventions: solver/dispersion_model.hpp and docs/materials.md.
#include "solver/dispersion_model.hpp"

#include <Eigen/SparseCore>
#include <Eigen/SparseLU>

#include <algorithm>
#include <cassert>
#include <cmath>
#include <cstdio>
#include <limits>
#include <numeric>
#include <utility>

#include "mesh/error.hpp"
#include "solver/scalar_root.hpp"

namespace cladwise {
namespace {

std::string fmt(double x) {
  char buf[48];
  std::snprintf(buf, sizeof buf, "%.6g", x);
  return buf;
}

std::string material_where(const std::string& name, const std::string& source) {
  std::string w = "material '" + name + "'";
  if (!source.empty()) w += " (" + source + ")";
  return w;
}

void check_validity_range(const std::string& where, const WavelengthRange& r) {
  if (!(r.min_um > 0.0) || !std::isfinite(r.min_um) || !(r.max_um > r.min_um) ||
      std::isnan(r.max_um)) {
    throw InputError(where, "validity range " + fmt(r.min_um) + "–" + fmt(r.max_um) +
                                " µm is not an interval of positive wavelengths; give "
                                "0 < lambda_min < lambda_max");
  }
}

// k-th of n_intervals + 1 evenly spaced points of a bounded range, ends exact (no rounding out).
double sample_point(const WavelengthRange& r, int k, int n_intervals) {
  if (k == n_intervals) return r.max_um;
  return r.min_um + (r.max_um - r.min_um) * k / n_intervals;
}

// ---- formula families: n, dn/dλ, d²n/dλ² ---------------------------------------------------

// Sellmeier with Cᵢ in µm² (form B). With s = λ², ε = n² = 1 + Σ Bᵢ s/(s − Cᵢ):
//   dε/ds = −Σ Bᵢ Cᵢ/(s − Cᵢ)²,  d²ε/ds² = 2 Σ Bᵢ Cᵢ/(s − Cᵢ)³,
//   ε' = 2λ ε_s,  ε'' = 4λ² ε_ss + 2 ε_s,
// and from ε = n²:  n' = ε'/(2n),  n'' = (ε'' − 2n'²)/(2n).
IndexDerivatives sellmeier_derivatives(const std::vector<PoleTerm>& terms_um2, double lambda,
                                       const std::string& where) {
  const double s = lambda * lambda;
  double eps = 1.0, eps_s = 0.0, eps_ss = 0.0;
  for (const PoleTerm& t : terms_um2) {
    const double q = s - t.c;
    eps += t.b * s / q;
    eps_s -= t.b * t.c / (q * q);
    eps_ss += 2.0 * t.b * t.c / (q * q * q);
  }
  if (!(eps > 0.0) || !std::isfinite(eps)) {
    throw InputError(where, "the Sellmeier fit gives n² = " + fmt(eps) + " at " + fmt(lambda) +
                                " µm (at or across one of its resonances), so there is no real "
                                "index there; use a wavelength inside the fit's validity range");
  }
  const double d_eps = 2.0 * lambda * eps_s;
  const double d2_eps = 4.0 * s * eps_ss + 2.0 * eps_s;
  IndexDerivatives r;
  r.n = std::sqrt(eps);
  r.dn_dlambda = d_eps / (2.0 * r.n);
  r.d2n_dlambda2 = (d2_eps - 2.0 * r.dn_dlambda * r.dn_dlambda) / (2.0 * r.n);
  return r;
}

// Cauchy n = Σ Aₖ λ^(−2k):  n' = −Σ 2k Aₖ λ^(−2k−1),  n'' = Σ 2k(2k+1) Aₖ λ^(−2k−2).
IndexDerivatives cauchy_derivatives(const std::vector<double>& a, double lambda,
                                    const std::string& where) {
  IndexDerivatives r;
  for (std::size_t k = 0; k < a.size(); ++k) {
    const double m = 2.0 * static_cast<double>(k);
    const double p = std::pow(lambda, -m);
    r.n += a[k] * p;
    r.dn_dlambda -= m * a[k] * p / lambda;
    r.d2n_dlambda2 += m * (m + 1.0) * a[k] * p / (lambda * lambda);
  }
  if (!(r.n > 0.0) || !std::isfinite(r.n)) {
    throw InputError(where, "the Cauchy fit gives n = " + fmt(r.n) + " at " + fmt(lambda) +
                                " µm; use a wavelength inside the fit's validity range");
  }
  return r;
}

// Gas form n − 1 = Σ Bᵢ/(Cᵢ − u), u = λ⁻²:  f_u = Σ Bᵢ/(Cᵢ − u)², f_uu = Σ 2Bᵢ/(Cᵢ − u)³,
// u' = −2λ⁻³, u'' = 6λ⁻⁴, so n' = f_u u' and n'' = f_uu u'² + f_u u''.
IndexDerivatives gas_derivatives(const std::vector<PoleTerm>& terms, double lambda,
                                 const std::string& where) {
  const double u = 1.0 / (lambda * lambda);
  double f = 0.0, f_u = 0.0, f_uu = 0.0;
  for (const PoleTerm& t : terms) {
    const double q = t.c - u;
    f += t.b / q;
    f_u += t.b / (q * q);
    f_uu += 2.0 * t.b / (q * q * q);
  }
  IndexDerivatives r;
  r.n = 1.0 + f;
  if (!(r.n > 0.0) || !std::isfinite(r.n)) {
    throw InputError(where, "the dispersion formula gives n = " + fmt(r.n) + " at " +
                                fmt(lambda) + " µm (at or across a resonance); use a wavelength "
                                "inside the fit's validity range");
  }
  const double du = -2.0 * u / lambda;
  const double d2u = 6.0 * u * u;
  r.dn_dlambda = f_u * du;
  r.d2n_dlambda2 = f_uu * du * du + f_u * d2u;
  return r;
}

// ---- cubic spline ---------------------------------------------------------------------------

// Knot second derivatives Mⱼ of the not-a-knot interpolating cubic spline. Interior rows are the
// usual C² conditions  h_{j−1} M_{j−1} + 2(h_{j−1} + h_j) M_j + h_j M_{j+1} = 6(Δ_j − Δ_{j−1}),
// Δ_j = (y_{j+1} − y_j)/h_j; the first and last rows make the third derivative continuous at the
// second and the last-but-one knot: h₁ M₀ − (h₀ + h₁) M₁ + h₀ M₂ = 0 (de Boor 1978, ch. IV).
// The matrix is tridiagonal but for one entry in each end row; a sparse LU solves it.
DispersionModel::Spline make_spline(const std::vector<double>& x, std::vector<double> y) {
  const int n = static_cast<int>(x.size());
  assert(n >= 4 && y.size() == x.size());
  std::vector<Eigen::Triplet<double>> trip;
  trip.reserve(3 * static_cast<std::size_t>(n));
  Eigen::VectorXd rhs = Eigen::VectorXd::Zero(n);
  auto h = [&](int j) { return x[j + 1] - x[j]; };
  trip.emplace_back(0, 0, h(1));
  trip.emplace_back(0, 1, -(h(0) + h(1)));
  trip.emplace_back(0, 2, h(0));
  for (int j = 1; j < n - 1; ++j) {
    trip.emplace_back(j, j - 1, h(j - 1));
    trip.emplace_back(j, j, 2.0 * (h(j - 1) + h(j)));
    trip.emplace_back(j, j + 1, h(j));
    rhs[j] = 6.0 * ((y[j + 1] - y[j]) / h(j) - (y[j] - y[j - 1]) / h(j - 1));
  }
  trip.emplace_back(n - 1, n - 3, h(n - 2));
  trip.emplace_back(n - 1, n - 2, -(h(n - 3) + h(n - 2)));
  trip.emplace_back(n - 1, n - 1, h(n - 3));
  Eigen::SparseMatrix<double> a(n, n);
  a.setFromTriplets(trip.begin(), trip.end());
  Eigen::SparseLU<Eigen::SparseMatrix<double>> lu;
  lu.compute(a);
  if (lu.info() != Eigen::Success) {
    throw ComputationError("cubic spline of a tabulated material: the knot system is singular");
  }
  const Eigen::VectorXd m = lu.solve(rhs);
  DispersionModel::Spline s;
  s.y = std::move(y);
  s.y2.assign(m.data(), m.data() + n);
  return s;
}

// Value and first two derivatives of the spline at xq. On [x_j, x_{j+1}] with t = xq − x_j:
// y = y_j + b t + (M_j/2) t² + d t³, b = Δ_j − h(2M_j + M_{j+1})/6, d = (M_{j+1} − M_j)/(6h).
// Outside the knots the end cubic is continued (used only when extrapolation is allowed).
IndexDerivatives eval_spline(const std::vector<double>& x, const DispersionModel::Spline& s,
                             double xq) {
  const std::size_t n = x.size();
  std::size_t j = static_cast<std::size_t>(std::upper_bound(x.begin(), x.end(), xq) - x.begin());
  j = std::clamp<std::size_t>(j, 1, n - 1) - 1;
  const double hj = x[j + 1] - x[j];
  const double t = xq - x[j];
  const double mj = s.y2[j], mk = s.y2[j + 1];
  const double b = (s.y[j + 1] - s.y[j]) / hj - hj * (2.0 * mj + mk) / 6.0;
  const double c = 0.5 * mj;
  const double d = (mk - mj) / (6.0 * hj);
  IndexDerivatives r;
  r.n = s.y[j] + t * (b + t * (c + t * d));
  r.dn_dlambda = b + t * (2.0 * c + 3.0 * d * t);
  r.d2n_dlambda2 = 2.0 * c + 6.0 * d * t;
  return r;
}

}  // namespace

// ---- WavelengthRange ------------------------------------------------------------------------

WavelengthRange WavelengthRange::unbounded() {
  return {std::numeric_limits<double>::min(), std::numeric_limits<double>::infinity()};
}

bool WavelengthRange::is_unbounded() const {
  return min_um <= std::numeric_limits<double>::min() && std::isinf(max_um);
}

// ---- DispersionModel ------------------------------------------------------------------------

DispersionModel::DispersionModel(std::string name, std::string source, Form form,
                                 WavelengthRange validity)
    : name_(std::move(name)), source_(std::move(source)), form_(std::move(form)),
      validity_(validity) {
  check_validity_range(where(), validity_);
}

std::string DispersionModel::where() const { return material_where(name_, source_); }

const char* DispersionModel::form_name() const {
  struct Namer {
    const char* operator()(const Constant&) const { return "constant"; }
    const char* operator()(const Sellmeier&) const { return "Sellmeier"; }
    const char* operator()(const Cauchy&) const { return "Cauchy"; }
    const char* operator()(const Gas&) const { return "gas"; }
    const char* operator()(const Table&) const { return "tabulated"; }
  };
  return std::visit(Namer{}, form_);
}

DispersionModel DispersionModel::with_extrapolation(bool allow) const {
  DispersionModel copy = *this;
  copy.allow_extrapolation_ = allow;
  return copy;
}

bool DispersionModel::has_loss() const {
  if (const auto* c = std::get_if<Constant>(&form_)) return c->kappa > 0.0;
  if (const auto* t = std::get_if<Table>(&form_)) return t->kappa.has_value();
  return false;
}

void DispersionModel::check_wavelength(double lambda) const {
  if (!(lambda > 0.0) || !std::isfinite(lambda)) {
    throw InputError(where(), "wavelength " + fmt(lambda) + " µm is not a positive number");
  }
  if (allow_extrapolation_ || validity_.contains(lambda)) return;
  const char* what = std::holds_alternative<Table>(form_) ? "the table's range" :
                                                            "the fit's validity range";
  throw InputError(where(), fmt(lambda) + " µm is outside " + what + " " + fmt(validity_.min_um) +
                                "–" + fmt(validity_.max_um) +
                                " µm; set allow_extrapolation to use it anyway");
}

IndexDerivatives DispersionModel::derivatives(double lambda) const {
  check_wavelength(lambda);
  if (const auto* c = std::get_if<Constant>(&form_)) return {c->n, 0.0, 0.0};
  if (const auto* s = std::get_if<Sellmeier>(&form_)) {
    return sellmeier_derivatives(s->terms_um2, lambda, where());
  }
  if (const auto* c = std::get_if<Cauchy>(&form_)) {
    return cauchy_derivatives(c->coefficients, lambda, where());
  }
  if (const auto* g = std::get_if<Gas>(&form_)) return gas_derivatives(g->terms, lambda, where());
  const Table& t = std::get<Table>(form_);
  IndexDerivatives r = eval_spline(t.wavelength_um, t.n, lambda);
  if (!(r.n > 0.0)) {
    throw InputError(where(), "the table extrapolated to " + fmt(lambda) + " µm gives n = " +
                                  fmt(r.n) + "; stay closer to the tabulated range");
  }
  return r;
}

double DispersionModel::index(double lambda) const { return derivatives(lambda).n; }

double DispersionModel::extinction(double lambda) const {
  check_wavelength(lambda);
  if (const auto* c = std::get_if<Constant>(&form_)) return c->kappa;
  if (const auto* t = std::get_if<Table>(&form_); t && t->kappa) {
    // Clipped: a spline may undershoot slightly below zero between small tabulated κ values.
    return std::max(0.0, eval_spline(t->wavelength_um, *t->kappa, lambda).n);
  }
  return 0.0;
}

std::complex<double> DispersionModel::complex_index(double lambda) const {
  return {index(lambda), -extinction(lambda)};
}

std::complex<double> DispersionModel::relative_permittivity(double lambda) const {
  const std::complex<double> n = complex_index(lambda);
  return n * n;
}

double DispersionModel::group_index(double lambda) const {
  const IndexDerivatives d = derivatives(lambda);
  return d.n - lambda * d.dn_dlambda;
}

double DispersionModel::dispersion_ps_per_nm_km(double lambda) const {
  return cladwise::dispersion_ps_per_nm_km(lambda, derivatives(lambda).d2n_dlambda2);
}

// ---- factories ------------------------------------------------------------------------------

DispersionModel constant_index_model(std::string name, double n, double kappa,
                                     WavelengthRange validity) {
  const std::string where = material_where(name, "");
  if (!(n > 0.0) || !std::isfinite(n)) {
    throw InputError(where, "refractive index must be a positive number, got " + fmt(n));
  }
  if (!(kappa >= 0.0) || !std::isfinite(kappa)) {
    throw InputError(where, "extinction coefficient kappa must be >= 0 (n − jκ, "
                            "docs/conventions.md), got " + fmt(kappa));
  }
  return DispersionModel(std::move(name), "", DispersionModel::Constant{n, kappa}, validity);
}

DispersionModel sellmeier_model(std::string name, std::string source, SellmeierCoefficients coeffs,
                                WavelengthRange validity) {
  const std::string where = material_where(name, source);
  check_validity_range(where, validity);
  if (coeffs.terms.empty()) throw InputError(where, "a Sellmeier fit needs at least one term");
  DispersionModel::Sellmeier s;
  for (std::size_t i = 0; i < coeffs.terms.size(); ++i) {
    const PoleTerm& t = coeffs.terms[i];
    if (!std::isfinite(t.b) || !std::isfinite(t.c)) {
      throw InputError(where, "Sellmeier term " + std::to_string(i + 1) +
                                  " has a coefficient that is not a finite number");
    }
    const double c_um2 = coeffs.form == SellmeierForm::resonance_wavelength ? t.c * t.c : t.c;
    if (c_um2 > 0.0 && t.b != 0.0 && validity.contains(std::sqrt(c_um2))) {
      throw InputError(where, "Sellmeier term " + std::to_string(i + 1) + " has its resonance at " +
                                  fmt(std::sqrt(c_um2)) + " µm, inside the validity range " +
                                  fmt(validity.min_um) + "–" + fmt(validity.max_um) +
                                  " µm; check the form (C in µm or in µm²) and the range");
    }
    s.terms_um2.push_back({t.b, c_um2});
  }
  s.published = std::move(coeffs);
  DispersionModel model(std::move(name), std::move(source), std::move(s), validity);
  if (std::isfinite(validity.max_um)) {
    // A fit must give a real index everywhere it claims to be valid (catches swapped B and C).
    for (int k = 0; k <= 64; ++k) model.index(sample_point(validity, k, 64));
  }
  return model;
}

DispersionModel cauchy_model(std::string name, std::string source,
                             std::vector<double> coefficients, WavelengthRange validity) {
  const std::string where = material_where(name, source);
  if (coefficients.empty()) throw InputError(where, "a Cauchy fit needs at least A0");
  for (double a : coefficients) {
    if (!std::isfinite(a)) throw InputError(where, "a Cauchy coefficient is not a finite number");
  }
  DispersionModel model(std::move(name), std::move(source),
                        DispersionModel::Cauchy{std::move(coefficients)}, validity);
  if (std::isfinite(validity.max_um)) {
    for (int k = 0; k <= 64; ++k) model.index(sample_point(validity, k, 64));
  }
  return model;
}

DispersionModel gas_dispersion_model(std::string name, std::string source,
                                     std::vector<PoleTerm> terms, WavelengthRange validity) {
  const std::string where = material_where(name, source);
  check_validity_range(where, validity);
  if (terms.empty()) throw InputError(where, "a dispersion formula needs at least one term");
  for (const PoleTerm& t : terms) {
    if (!std::isfinite(t.b) || !std::isfinite(t.c)) {
      throw InputError(where, "a dispersion term has a coefficient that is not a finite number");
    }
    // Pole where λ⁻² = Cᵢ.
    if (t.c > 0.0 && validity.contains(1.0 / std::sqrt(t.c))) {
      throw InputError(where, "a dispersion term has its resonance at " +
                                  fmt(1.0 / std::sqrt(t.c)) + " µm, inside the validity range");
    }
  }
  return DispersionModel(std::move(name), std::move(source),
                         DispersionModel::Gas{std::move(terms)}, validity);
}

DispersionModel tabulated_model(std::string name, std::string source,
                                std::vector<double> wavelength_um, std::vector<double> n,
                                std::vector<double> kappa) {
  const std::string where = material_where(name, source);
  const std::size_t rows = wavelength_um.size();
  if (n.size() != rows || (!kappa.empty() && kappa.size() != rows)) {
    throw InputError(where, "the table's columns have different lengths (" +
                                std::to_string(rows) + " wavelengths, " + std::to_string(n.size()) +
                                " n, " + std::to_string(kappa.size()) + " k)");
  }
  if (rows < 4) {
    throw InputError(where, "a tabulated material needs at least 4 rows for its cubic spline, got " +
                                std::to_string(rows));
  }
  for (std::size_t i = 0; i < rows; ++i) {
    const std::string row = "row " + std::to_string(i + 1) + ": ";
    if (!(wavelength_um[i] > 0.0) || !std::isfinite(wavelength_um[i])) {
      throw InputError(where, row + "wavelength " + fmt(wavelength_um[i]) +
                                  " µm is not a positive number");
    }
    if (!(n[i] > 0.0) || !std::isfinite(n[i])) {
      throw InputError(where, row + "n = " + fmt(n[i]) + " is not a positive number");
    }
    if (!kappa.empty() && (!(kappa[i] >= 0.0) || !std::isfinite(kappa[i]))) {
      throw InputError(where, row + "k = " + fmt(kappa[i]) +
                                  " must be >= 0 (n − jk, docs/conventions.md)");
    }
  }
  std::vector<std::size_t> order(rows);
  std::iota(order.begin(), order.end(), std::size_t{0});
  std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) {
    return wavelength_um[a] < wavelength_um[b];
  });
  DispersionModel::Table t;
  std::vector<double> ns, ks;
  for (std::size_t i : order) {
    if (!t.wavelength_um.empty() && wavelength_um[i] == t.wavelength_um.back()) {
      throw InputError(where, "wavelength " + fmt(wavelength_um[i]) +
                                  " µm appears twice in the table; keep one row per wavelength");
    }
    t.wavelength_um.push_back(wavelength_um[i]);
    ns.push_back(n[i]);
    if (!kappa.empty()) ks.push_back(kappa[i]);
  }
  t.n = make_spline(t.wavelength_um, std::move(ns));
  if (!kappa.empty()) t.kappa = make_spline(t.wavelength_um, std::move(ks));
  const WavelengthRange range{t.wavelength_um.front(), t.wavelength_um.back()};
  return DispersionModel(std::move(name), std::move(source), std::move(t), range);
}

DispersionModel sellmeier_mixture_model(std::string name, std::string source,
                                        const SellmeierCoefficients& first,
                                        const SellmeierCoefficients& second, double mole_fraction,
                                        WavelengthRange validity) {
  const std::string where = material_where(name, source);
  if (!(mole_fraction >= 0.0 && mole_fraction <= 1.0)) {
    throw InputError(where, "mole fraction " + fmt(mole_fraction) +
                                " is outside 0–1 (give e.g. 0.05 for 5 mol%)");
  }
  // Programmer errors: the catalogue pairs only form-A fits of equal length.
  assert(first.form == SellmeierForm::resonance_wavelength &&
         second.form == SellmeierForm::resonance_wavelength);
  assert(first.terms.size() == second.terms.size());
  SellmeierCoefficients mixed;
  mixed.form = SellmeierForm::resonance_wavelength;
  for (std::size_t i = 0; i < first.terms.size(); ++i) {
    const PoleTerm& a = first.terms[i];
    const PoleTerm& b = second.terms[i];
    mixed.terms.push_back({a.b + mole_fraction * (b.b - a.b), a.c + mole_fraction * (b.c - a.c)});
  }
  return sellmeier_model(std::move(name), std::move(source), std::move(mixed), validity);
}

std::optional<double> zero_dispersion_wavelength(const DispersionModel& model, double lo_um,
                                                 double hi_um) {
  assert(lo_um < hi_um);
  constexpr int n_scan = 64;
  auto d = [&](double lambda) { return model.dispersion_ps_per_nm_km(lambda); };
  double a = lo_um, fa = d(a);
  for (int k = 1; k <= n_scan; ++k) {
    const double b = k == n_scan ? hi_um : lo_um + (hi_um - lo_um) * k / n_scan;
    const double fb = d(b);
    if (fa == 0.0) return a;
    if ((fa < 0.0) != (fb < 0.0)) return brent_root(d, a, b, fa, fb, 1e-12);
    a = b;
    fa = fb;
  }
  return std::nullopt;
}

}  // namespace cladwise
