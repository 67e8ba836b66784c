// Mode metrics by element quadrature of the exact element fields (see mode_metrics.hpp and
// docs/metrics.md for the definitions and their sources).
#include "solver/mode_metrics.hpp"

#include <Eigen/Eigenvalues>

#include <algorithm>
#include <cmath>
#include <limits>
#include <memory>
#include <numbers>
#include <utility>
#include <vector>

#include "solver/assembly.hpp"
#include "solver/element_kernels.hpp"
#include "solver/quadrature.hpp"

namespace cladwise {

namespace {

constexpr double kPi = std::numbers::pi;

/// The transverse field along the unit direction p.
std::complex<double> along(const FieldSample& f, const Eigen::Vector2d& p) {
  return p.x() * f.e.x() + p.y() * f.e.y();
}

/// Principal axis of C = ∫ Re[E_t E_tᴴ] dA: unit vector (x ≥ 0 convention fixed by the angle range).
struct PrincipalAxis {
  Eigen::Vector2d direction{1.0, 0.0};
  double angle_deg = 0.0;
  double purity = 1.0;
  double x_fraction = 1.0;
};

PrincipalAxis principal_axis(const std::vector<FieldQuadraturePoint>& s) {
  Eigen::Matrix2d c = Eigen::Matrix2d::Zero();
  for (const auto& q : s) {
    const auto& e = q.field.e;
    c(0, 0) += q.weight_um2 * std::norm(e.x());
    c(1, 1) += q.weight_um2 * std::norm(e.y());
    c(0, 1) += q.weight_um2 * (e.x() * std::conj(e.y())).real();
  }
  c(1, 0) = c(0, 1);
  PrincipalAxis a;
  const double tr = c.trace();
  if (!(tr > 0.0)) return a;
  Eigen::SelfAdjointEigenSolver<Eigen::Matrix2d> eig(c);
  Eigen::Vector2d v = eig.eigenvectors().col(1);  // largest eigenvalue last
  double angle = std::atan2(v.y(), v.x()) * 180.0 / kPi;
  if (angle > 90.0) angle -= 180.0;
  if (angle <= -90.0) angle += 180.0;
  a.angle_deg = angle;
  a.direction = Eigen::Vector2d(std::cos(angle * kPi / 180.0), std::sin(angle * kPi / 180.0));
  a.purity = eig.eigenvalues()(1) / tr;
  a.x_fraction = c(0, 0) / tr;
  return a;
}

/// Full width of S_z along the line x0 + s·u through the centroid, where S_z falls to 1/e² of its
/// maximum on the line: outermost crossings, refined by bisection on the exact element fields.
double intensity_width(const ModeFieldEvaluator& fields, const MeshLocator& loc,
                       const Eigen::Vector2d& x0, const Eigen::Vector2d& u) {
  const Point2 lo = loc.lower_corner(), hi = loc.upper_corner();
  const double span = std::hypot(hi[0] - lo[0], hi[1] - lo[1]);
  auto s_z = [&](double s) {
    const Eigen::Vector2d x = x0 + s * u;
    const auto p = loc.locate({x.x(), x.y()});
    return p ? fields.at_reference(p->triangle, p->xi).s_z() : 0.0;
  };
  const int n = 2001;
  std::vector<double> s(n), v(n);
  double vmax = 0.0;
  for (int i = 0; i < n; ++i) {
    s[i] = -span + 2.0 * span * i / (n - 1);
    v[i] = s_z(s[i]);
    vmax = std::max(vmax, v[i]);
  }
  if (!(vmax > 0.0)) return 0.0;
  const double level = vmax * std::exp(-2.0);
  int first = -1, last = -1;
  for (int i = 0; i < n; ++i) {
    if (v[i] >= level) {
      if (first < 0) first = i;
      last = i;
    }
  }
  auto crossing = [&](double a, double b) {  // S_z(a) < level <= S_z(b) or the reverse
    const bool a_low = s_z(a) < level;
    for (int it = 0; it < 50; ++it) {
      const double m = 0.5 * (a + b);
      ((s_z(m) < level) == a_low ? a : b) = m;
    }
    return 0.5 * (a + b);
  };
  const double left = first > 0 ? crossing(s[first - 1], s[first]) : s[0];
  const double right = last < n - 1 ? crossing(s[last], s[last + 1]) : s[n - 1];
  return right - left;
}

}  // namespace

std::vector<FieldQuadraturePoint> sample_mode(const ModeFieldEvaluator& fields, const Mesh& mesh,
                                              int order, bool with_gradients) {
  const QuadratureRule& rule = triangle_rule(4 * order);
  std::vector<FieldQuadraturePoint> out;
  // Step of the central differences in reference coordinates: truncation O(h²) only through the
  // curvature of the map, rounding O(ε/h) ≈ 1e-12 relative.
  const double h = 1e-4;
  // Per element, one batch of the rule's points and (with gradients) one of their four stencil
  // points, where only E_t is needed.
  const int nq = rule.n_points();
  std::vector<Eigen::Vector2d> stencil;
  if (with_gradients) {
    for (int k = 0; k < nq; ++k) {
      for (int j = 0; j < 2; ++j) {
        Eigen::Vector2d step = Eigen::Vector2d::Zero();
        step[j] = h;
        stencil.push_back(rule.points[k] + step);
        stencil.push_back(rule.points[k] - step);
      }
    }
  }
  // Elements in parallel; each writes its own slots of `out`, so the result does not depend on
  // the number of threads.
  const int n_t = mesh.n_triangles();
  out.resize(static_cast<std::size_t>(n_t) * nq);
#pragma omp parallel
  {
    std::vector<FieldSample> f(nq);
    std::vector<Eigen::Vector2cd> fe(stencil.size());
#pragma omp for schedule(static)
    for (int t = 0; t < n_t; ++t) {
      const ElementGeometry g = element_geometry(mesh, t);
      fields.at_reference(t, rule.points.data(), nq, f.data());
      if (with_gradients) fields.transverse_e_at(t, stencil.data(), static_cast<int>(stencil.size()), fe.data());
      for (int k = 0; k < nq; ++k) {
        const Eigen::Vector2d& xi = rule.points[k];
        const MappedPoint m = map_point(g, xi);
        FieldQuadraturePoint& q = out[static_cast<std::size_t>(t) * nq + k];
        q.x = m.x;
        q.weight_um2 = rule.weights[k] * m.det;  // dA = det J dξ
        q.triangle = t;
        q.region = mesh.triangle_region[t];
        q.field = f[k];
        if (with_gradients) {
          Eigen::Matrix2cd d_ref;  // ∂E_i/∂ξ_j
          for (int j = 0; j < 2; ++j) {
            d_ref.col(j) = (fe[4 * k + 2 * j] - fe[4 * k + 2 * j + 1]) / (2.0 * h);
          }
          // ∇_x f = J⁻ᵀ ∇_ξ f for each component (rows): grad_et = d_ref · J⁻¹
          q.grad_et = d_ref * m.inv_jt.transpose().cast<std::complex<double>>();
        }
      }
    }
  }
  return out;
}

double gaussian_fit_radius_um(const std::vector<FieldQuadraturePoint>& samples,
                              const Eigen::Vector2d& p, double cx, double cy) {
  double ee = 0.0, r2_mean = 0.0;
  for (const auto& q : samples) {
    const double e2 = std::norm(along(q.field, p));
    ee += q.weight_um2 * e2;
    r2_mean += q.weight_um2 * e2 * ((q.x.x() - cx) * (q.x.x() - cx) + (q.x.y() - cy) * (q.x.y() - cy));
  }
  if (!(ee > 0.0)) return 0.0;
  // The field's own second moment sets the bracket (for a Gaussian, <r²>|E|² = w²/2).
  const double w_guess = std::sqrt(2.0 * r2_mean / ee);
  // The samples' weighted field and squared radius, gathered once for the ~60 evaluations below.
  std::vector<std::complex<double>> we;
  std::vector<double> wt, r2;
  we.reserve(samples.size()), wt.reserve(samples.size()), r2.reserve(samples.size());
  for (const auto& q : samples) {
    we.push_back(q.weight_um2 * along(q.field, p));
    wt.push_back(q.weight_um2);
    r2.push_back((q.x.x() - cx) * (q.x.x() - cx) + (q.x.y() - cy) * (q.x.y() - cy));
  }
  auto efficiency = [&](double log_w) {
    const double inv_w2 = std::exp(-2.0 * log_w);
    double eg_re = 0.0, eg_im = 0.0, gg = 0.0;
    for (std::size_t k = 0; k < r2.size(); ++k) {
      const double g = std::exp(-r2[k] * inv_w2);
      eg_re += we[k].real() * g;
      eg_im += we[k].imag() * g;
      gg += wt[k] * g * g;
    }
    return (eg_re * eg_re + eg_im * eg_im) / (ee * gg);
  };
  // Golden-section search for the maximum of the overlap in log w down to a bracket of 1e-2, then
  // successive parabolic interpolation through the best three points: the overlap is smooth and
  // its maximum flat (quadratic), so the parabola's vertex converges superlinearly; w is only
  // defined to about sqrt(machine ε) relative by a flat maximum, which the 1e-9 stop reflects.
  double a = std::log(0.2 * w_guess), b = std::log(3.0 * w_guess);
  const double ratio = (std::sqrt(5.0) - 1.0) / 2.0;
  double c = b - ratio * (b - a), d = a + ratio * (b - a);
  double fc = efficiency(c), fd = efficiency(d);
  while (b - a > 1e-2) {
    if (fc > fd) {
      b = d, d = c, fd = fc;
      c = b - ratio * (b - a), fc = efficiency(c);
    } else {
      a = c, c = d, fc = fd;
      d = a + ratio * (b - a), fd = efficiency(d);
    }
  }
  // Three points around the best one, kept sorted by abscissa.
  double x0 = c, x1 = 0.5 * (c + d), x2 = d;
  double f0 = fc, f1 = efficiency(x1), f2 = fd;
  double best = f1 >= std::max(f0, f2) ? x1 : (f0 > f2 ? x0 : x2);
  for (int it = 0; it < 20; ++it) {
    const double d10 = (f1 - f0) / (x1 - x0), d21 = (f2 - f1) / (x2 - x1);
    const double curvature = (d21 - d10) / (x2 - x0);
    if (!(curvature < 0.0)) break;  // not concave here: keep the best sample
    const double x = 0.5 * (x0 + x1) - d10 / (2.0 * curvature);
    if (!(x > a && x < b)) break;
    const double fx = efficiency(x);
    const double step = std::abs(x - best);
    // Replace the worst of the three by the new point, keeping them sorted.
    double xs[4] = {x0, x1, x2, x}, fs[4] = {f0, f1, f2, fx};
    int worst = 0;
    for (int k = 1; k < 4; ++k) {
      if (fs[k] < fs[worst]) worst = k;
    }
    std::vector<std::pair<double, double>> keep;
    for (int k = 0; k < 4; ++k) {
      if (k != worst) keep.push_back({xs[k], fs[k]});
    }
    std::sort(keep.begin(), keep.end());
    x0 = keep[0].first, f0 = keep[0].second;
    x1 = keep[1].first, f1 = keep[1].second;
    x2 = keep[2].first, f2 = keep[2].second;
    best = f1 >= std::max(f0, f2) ? x1 : (f0 > f2 ? x0 : x2);
    if (step < 1e-9 || x2 - x0 < 1e-12) break;
  }
  return std::exp(best);
}

double nonlinear_coefficient_per_w_km(double n2_m2_per_w, double wavelength_um,
                                      double effective_area_um2) {
  // γ = 2π n2 / (λ A_eff): n2 in m²/W, λ in m, A_eff in m² gives 1/(W·m); × 1e3 per km.
  return 2.0 * kPi * n2_m2_per_w / (wavelength_um * 1e-6 * effective_area_um2 * 1e-12) * 1e3;
}

ModeMetrics mode_metrics(const ModeProblem& problem, const DofMap& dofs, const Mode& mode,
                         const MetricOptions& options) {
  const ModeFieldEvaluator fields(problem, dofs, mode);
  return mode_metrics(fields, problem, dofs, mode, options);
}

ModeMetrics mode_metrics(const ModeFieldEvaluator& fields, const ModeProblem& problem,
                         const DofMap& dofs, const Mode& mode, const MetricOptions& options) {
  const Mesh& mesh = dofs.mesh();
  std::vector<FieldQuadraturePoint> own_samples;
  if (!options.samples) own_samples = sample_mode(fields, mesh, dofs.order(), true);
  const std::vector<FieldQuadraturePoint>& s = options.samples ? *options.samples : own_samples;
  ModeMetrics r;

  // Power, centroid, region fractions, E_t moments.
  double p = 0.0, px = 0.0, py = 0.0, et2 = 0.0, et4 = 0.0, e2 = 0.0, ht2 = 0.0, h2 = 0.0;
  std::vector<double> region_power(mesh.regions.size(), 0.0);
  for (const auto& q : s) {
    const double sz = q.field.s_z();
    p += q.weight_um2 * sz;
    px += q.weight_um2 * sz * q.x.x();
    py += q.weight_um2 * sz * q.x.y();
    region_power[q.region] += q.weight_um2 * sz;
    const double t2 = std::norm(q.field.e.x()) + std::norm(q.field.e.y());
    et2 += q.weight_um2 * t2;
    et4 += q.weight_um2 * t2 * t2;
    e2 += q.weight_um2 * (t2 + std::norm(q.field.e.z()));
    const double h_t2 = std::norm(q.field.h.x()) + std::norm(q.field.h.y());
    ht2 += q.weight_um2 * h_t2;
    h2 += q.weight_um2 * (h_t2 + std::norm(q.field.h.z()));
  }
  r.power_w = p * 1e-12;  // W/m² · µm² → W
  r.centroid_x_um = px / p;
  r.centroid_y_um = py / p;
  for (std::size_t i = 0; i < region_power.size(); ++i) {
    r.power_fraction.push_back({mesh.regions[i].name, region_power[i] / p});
  }
  r.effective_area_um2 = et2 * et2 / et4;  // (∫|E_t|² dA)² / ∫|E_t|⁴ dA, µm²
  r.te_fraction = et2 / e2;
  r.tm_fraction = ht2 / h2;

  // Second-moment widths of S_z.
  double sxx = 0.0, syy = 0.0;
  for (const auto& q : s) {
    const double sz = q.field.s_z();
    sxx += q.weight_um2 * sz * (q.x.x() - r.centroid_x_um) * (q.x.x() - r.centroid_x_um);
    syy += q.weight_um2 * sz * (q.x.y() - r.centroid_y_um) * (q.x.y() - r.centroid_y_um);
  }
  r.width_d4sigma_x_um = 4.0 * std::sqrt(std::max(0.0, sxx / p));
  r.width_d4sigma_y_um = 4.0 * std::sqrt(std::max(0.0, syy / p));

  // Polarisation and Petermann II on the principal component E_p = p̂·E_t.
  const PrincipalAxis axis = principal_axis(s);
  r.polarisation_angle_deg = axis.angle_deg;
  r.polarisation_purity = axis.purity;
  r.x_fraction = axis.x_fraction;
  const Eigen::Vector2d& pd = axis.direction;
  double ep2 = 0.0, dx2 = 0.0, dy2 = 0.0, wave = 0.0;
  const double k0 = 2.0 * kPi / problem.wavelength_um;
  for (const auto& q : s) {
    ep2 += q.weight_um2 * std::norm(along(q.field, pd));
    const Material& mat = problem.region_materials[q.region];
    const double n2 = pd.x() * pd.x() * mat.eps_xx + pd.y() * pd.y() * mat.eps_yy;  // p̂ᵀ ε_t p̂
    wave += q.weight_um2 * (k0 * k0 * n2 - mode.beta * mode.beta) * std::norm(along(q.field, pd));
    const Eigen::Matrix<std::complex<double>, 1, 2> g = pd.transpose().cast<std::complex<double>>() * q.grad_et;
    dx2 += q.weight_um2 * std::norm(g(0));
    dy2 += q.weight_um2 * std::norm(g(1));
  }
  // ∫|∇E_p|² = ∫(k0²n² − β²)|E_p|² + interface terms (Green's first identity with the scalar
  // wave equation in each homogeneous region); the directional split uses the gradient ratio.
  r.mfd_petermann_um = 2.0 * std::sqrt(2.0 * ep2 / wave);
  r.mfd_petermann_gradient_um = 2.0 * std::sqrt(2.0 * ep2 / (dx2 + dy2));
  r.mfd_petermann_x_um = 2.0 * std::sqrt(ep2 / (wave * dx2 / (dx2 + dy2)));
  r.mfd_petermann_y_um = 2.0 * std::sqrt(ep2 / (wave * dy2 / (dx2 + dy2)));
  if (options.gaussian_fit) {
    r.mfd_gaussian_um = 2.0 * gaussian_fit_radius_um(s, pd, r.centroid_x_um, r.centroid_y_um);
  }
  if (options.intensity_widths) {
    std::unique_ptr<MeshLocator> own;
    const MeshLocator* loc = options.locator;
    if (loc == nullptr) {
      own = std::make_unique<MeshLocator>(mesh);
      loc = own.get();
    }
    const Eigen::Vector2d c(r.centroid_x_um, r.centroid_y_um);
    r.width_1e2_x_um = intensity_width(fields, *loc, c, Eigen::Vector2d(1.0, 0.0));
    r.width_1e2_y_um = intensity_width(fields, *loc, c, Eigen::Vector2d(0.0, 1.0));
  }
  r.nonlinear_coefficient_per_w_km =
      std::isnan(options.n2_m2_per_w)
          ? std::numeric_limits<double>::quiet_NaN()
          : nonlinear_coefficient_per_w_km(options.n2_m2_per_w, problem.wavelength_um,
                                           r.effective_area_um2);
  return r;
}

Birefringence birefringence(double n_eff_x, double n_eff_y, double wavelength_um,
                            std::optional<double> n_group_x, std::optional<double> n_group_y) {
  Birefringence b;
  b.phase = n_eff_x - n_eff_y;
  // L_B = λ/|B|: the length over which the two polarisations slip by one wavelength; µm → mm.
  b.beat_length_mm = b.phase == 0.0 ? std::numeric_limits<double>::infinity()
                                    : wavelength_um * 1e-3 / std::abs(b.phase);
  if (n_group_x && n_group_y) {
    b.group = *n_group_x - *n_group_y;
    // Δτ/L = |B_g|/c: s/m → ps/km is × 1e12 × 1e3.
    constexpr double c_m_per_s = 299792458.0;
    b.dgd_ps_per_km = std::abs(*b.group) / c_m_per_s * 1e15;
  }
  return b;
}

std::optional<PolarisationPair> fundamental_polarisation_pair(const std::vector<ModeMetrics>& metrics) {
  PolarisationPair pair;
  for (int i = 0; i < static_cast<int>(metrics.size()); ++i) {
    const bool x_like = std::abs(metrics[i].polarisation_angle_deg) < 45.0;
    if (x_like && pair.x_mode < 0) pair.x_mode = i;
    if (!x_like && pair.y_mode < 0) pair.y_mode = i;
  }
  if (pair.x_mode < 0 || pair.y_mode < 0) return std::nullopt;
  return pair;
}

}  // namespace cladwise
