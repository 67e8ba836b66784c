// Mode labels from the azimuthal harmonics of the transverse field (see mode_labels.hpp).
#include "solver/mode_labels.hpp"

#include <Eigen/Eigenvalues>

#include <cmath>
#include <complex>
#include <numbers>
#include <vector>

#include "solver/mode_metrics.hpp"

namespace cladwise {

namespace {

using cd = std::complex<double>;
constexpr double kPi = std::numbers::pi;

/// E at a physical point, zero outside the mesh.
Eigen::Vector3cd e_at(const ModeFieldEvaluator& f, const MeshLocator& loc, double x, double y) {
  const auto p = loc.locate({x, y});
  return p ? f.at_reference(p->triangle, p->xi).e : Eigen::Vector3cd::Zero();
}

/// Harmonic n of the cylindrical components on one circle: c_n(F) = (1/N) Σ F(φ_k) e^{−inφ_k}.
struct CircleHarmonics {
  std::vector<cd> er, ephi;  // index n + n_max, n in [−n_max, n_max]
};

CircleHarmonics circle_harmonics(const ModeFieldEvaluator& f, const MeshLocator& loc, const Point2& c,
                                 double r, int n_angles, int n_max) {
  CircleHarmonics h;
  h.er.assign(2 * n_max + 1, 0.0);
  h.ephi.assign(2 * n_max + 1, 0.0);
  for (int k = 0; k < n_angles; ++k) {
    const double phi = 2.0 * kPi * (k + 0.5) / n_angles;  // half-step: off the mesh's mirror lines
    const double cs = std::cos(phi), sn = std::sin(phi);
    const Eigen::Vector3cd e = e_at(f, loc, c[0] + r * cs, c[1] + r * sn);
    const cd er = cs * e.x() + sn * e.y(), ep = -sn * e.x() + cs * e.y();
    for (int n = -n_max; n <= n_max; ++n) {
      const cd w = std::polar(1.0 / n_angles, -n * phi);
      h.er[n + n_max] += er * w;
      h.ephi[n + n_max] += ep * w;
    }
  }
  return h;
}

/// Sign changes of a complex radial profile, projected on its largest sample's phase; samples
/// below 1e-3 of the largest are skipped (they are numerical zeros or the axis).
int sign_changes(const std::vector<cd>& v) {
  double vmax = 0.0;
  cd ref = 1.0;
  for (const cd& z : v) {
    if (std::abs(z) > vmax) vmax = std::abs(z), ref = z;
  }
  if (vmax == 0.0) return 0;
  const cd phase = std::conj(ref) / std::abs(ref);
  int changes = 0, last = 0;
  for (const cd& z : v) {
    const double s = (z * phase).real();
    if (std::abs(s) < 1e-3 * vmax) continue;
    const int sign = s > 0 ? 1 : -1;
    if (last != 0 && sign != last) ++changes;
    last = sign;
  }
  return changes;
}

struct Shape {
  Eigen::Vector2d centroid = Eigen::Vector2d::Zero();
  Eigen::Vector2d axis{1.0, 0.0};
  double rms_radius = 1.0;  // sqrt(<r²>) of |E_t|² about the centroid (µm)
};

Shape mode_shape(const ModeFieldEvaluator& f, const Mesh& mesh,
                 const std::vector<FieldQuadraturePoint>* samples) {
  std::vector<FieldQuadraturePoint> own;
  if (!samples) own = sample_mode(f, mesh, mesh.order, false);
  const std::vector<FieldQuadraturePoint>& s = samples ? *samples : own;
  Shape out;
  double p = 0.0, et = 0.0;
  Eigen::Vector2d c = Eigen::Vector2d::Zero();
  Eigen::Matrix2d cov = Eigen::Matrix2d::Zero();
  for (const auto& q : s) {
    const double sz = q.field.s_z();
    p += q.weight_um2 * sz;
    c += q.weight_um2 * sz * q.x;
    const auto& e = q.field.e;
    cov(0, 0) += q.weight_um2 * std::norm(e.x());
    cov(1, 1) += q.weight_um2 * std::norm(e.y());
    cov(0, 1) += q.weight_um2 * (e.x() * std::conj(e.y())).real();
  }
  cov(1, 0) = cov(0, 1);
  out.centroid = c / p;
  Eigen::SelfAdjointEigenSolver<Eigen::Matrix2d> eig(cov);
  out.axis = eig.eigenvectors().col(1);
  double r2 = 0.0;
  for (const auto& q : s) {
    const double t2 = std::norm(q.field.e.x()) + std::norm(q.field.e.y());
    et += q.weight_um2 * t2;
    r2 += q.weight_um2 * t2 * (q.x - out.centroid).squaredNorm();
  }
  out.rms_radius = std::sqrt(r2 / et);
  return out;
}

std::string lp_name(int l, int m) {
  return "LP" + std::to_string(l) + (l >= 10 || m >= 10 ? "," : "") + std::to_string(m);
}

}  // namespace

ModeLabel label_mode(const ModeFieldEvaluator& fields, const MeshLocator& locator,
                     const LabelOptions& options) {
  const int n_max = std::max(1, options.n_angles / 2 - 1);
  const Shape shape = mode_shape(fields, locator.mesh(), options.samples);
  ModeLabel out;
  out.polarisation = std::abs(shape.axis.x()) >= std::abs(shape.axis.y()) ? 'x' : 'y';
  const std::string pol = std::string(1, out.polarisation) + "-pol ";

  // Generic: harmonics of the principal component E_p about the power centroid.
  {
    const Point2 c{shape.centroid.x(), shape.centroid.y()};
    // Harmonics n in [−n_max, n_max] of E_p on one circle, from one pass over its samples.
    auto ep_harmonics = [&](double r, int n_lo, int n_hi) {
      std::vector<cd> h(n_hi - n_lo + 1, 0.0);
      for (int k = 0; k < options.n_angles; ++k) {
        const double phi = 2.0 * kPi * (k + 0.5) / options.n_angles;
        const Eigen::Vector3cd e = e_at(fields, locator, c[0] + r * std::cos(phi), c[1] + r * std::sin(phi));
        const cd ep = shape.axis.x() * e.x() + shape.axis.y() * e.y();
        for (int n = n_lo; n <= n_hi; ++n) h[n - n_lo] += ep * std::polar(1.0 / options.n_angles, -n * phi);
      }
      return h;
    };
    std::vector<double> power(n_max + 1, 0.0);
    for (double rr : {0.5, 1.0, 1.5}) {
      const std::vector<cd> h = ep_harmonics(rr * shape.rms_radius, -n_max, n_max);
      for (int n = 0; n <= n_max; ++n) {
        power[n] += std::norm(h[n + n_max]) + (n > 0 ? std::norm(h[n_max - n]) : 0.0);
      }
    }
    int l = 0;
    double total = 0.0;
    for (int n = 0; n <= n_max; ++n) {
      total += power[n];
      if (power[n] > power[l]) l = n;
    }
    std::vector<cd> radial;
    for (int i = 1; i <= 60; ++i) radial.push_back(ep_harmonics(2.0 * shape.rms_radius * i / 60.0, l, l)[0]);
    const int m = 1 + sign_changes(radial);
    out.generic_label = pol + (l == 0 && m == 1 ? std::string("fundamental") : lp_name(l, m) + "-like");
    out.azimuthal_order = l;
    out.radial_order = m;
    out.harmonic_purity = total > 0 ? power[l] / total : 0.0;
    out.label = out.generic_label;
  }
  if (!options.centre || !(options.core_radius_um > 0.0)) return out;

  // Circular: harmonics of (E_r, E_φ) on circles inside the core (away from the interface, where
  // E_r jumps).
  const double a = options.core_radius_um;
  std::vector<CircleHarmonics> circles;
  for (double rr : {0.3, 0.55, 0.8}) {
    circles.push_back(circle_harmonics(fields, locator, *options.centre, rr * a, options.n_angles, n_max));
  }
  std::vector<double> power(n_max + 1, 0.0);
  double total = 0.0;
  for (const auto& h : circles) {
    for (int n = 0; n <= n_max; ++n) {
      double pn = std::norm(h.er[n_max + n]) + std::norm(h.ephi[n_max + n]);
      if (n > 0) pn += std::norm(h.er[n_max - n]) + std::norm(h.ephi[n_max - n]);
      power[n] += pn;
      total += pn;
    }
  }
  int nu = 0;
  for (int n = 1; n <= n_max; ++n) {
    if (power[n] > power[nu]) nu = n;
  }
  out.harmonic_purity = total > 0 ? power[nu] / total : 0.0;
  out.azimuthal_order = nu;
  // u = c_ν(E_r) = (A/2)e^{iψ}, v = i c_ν(E_φ) = (B/2)e^{iψ}: Re(v ū) has the sign of A·B.
  double ab = 0.0, er0 = 0.0, ephi0 = 0.0;
  for (const auto& h : circles) {
    const cd u = h.er[n_max + nu], v = cd(0, 1) * h.ephi[n_max + nu];
    ab += (v * std::conj(u)).real();
    er0 += std::norm(u);
    ephi0 += std::norm(v);
  }
  if (nu == 0) {
    out.family = ephi0 > er0 ? ModeFamily::TE : ModeFamily::TM;
  } else {
    out.family = ab < 0 ? ModeFamily::HE : ModeFamily::EH;
  }
  // Radial order from the LP radial function inside the core.
  std::vector<cd> radial;
  const int n_r = 120;
  for (int i = 1; i <= n_r; ++i) {
    const double r = a * i / (n_r + 1.0);
    const CircleHarmonics h = circle_harmonics(fields, locator, *options.centre, r, options.n_angles, nu);
    const cd u = h.er[2 * nu], v = cd(0, 1) * h.ephi[2 * nu];  // n = +ν (index ν + n_max, n_max = ν)
    switch (out.family) {
      case ModeFamily::TE: radial.push_back(v); break;
      case ModeFamily::TM: radial.push_back(u); break;
      case ModeFamily::HE: radial.push_back(u - v); break;
      default: radial.push_back(u + v); break;
    }
  }
  out.radial_order = 1 + sign_changes(radial);
  out.label = mode_label(out.family, nu, out.radial_order);
  const int l = out.family == ModeFamily::HE ? nu - 1 : out.family == ModeFamily::EH ? nu + 1 : 1;
  out.lp_label = lp_name(l, out.radial_order);
  return out;
}

ModeLabel label_mode(const ModeProblem& problem, const DofMap& dofs, const Mode& mode,
                     const LabelOptions& options) {
  const ModeFieldEvaluator fields(problem, dofs, mode);
  const MeshLocator locator(dofs.mesh());
  return label_mode(fields, locator, options);
}

}  // namespace cladwise
