// Fields of the exact step-index modes: boundary conditions at r = a, Maxwell's curl equations by
// finite differences, and the 1 W normalisation by an independent 2-D quadrature of S_z.
#include <gtest/gtest.h>

#include <boost/math/quadrature/gauss.hpp>
#include <cmath>
#include <complex>
#include <numbers>

#include "mesh/error.hpp"
#include "solver/step_index.hpp"

using namespace cladwise;
using cd = std::complex<double>;

namespace {

// The fibres: checks.md §8 weak fibre and 1 µm silica rod in air, and a few-mode fibre of ours.
std::vector<StepIndexFibre> test_fibres() {
  return {{1.4494, 1.4440, 4.1, 1.55}, {1.444024, 1.0, 1.0, 1.55}, {1.4504, 1.4447, 10.0, 1.55}};
}

double max_abs(const FieldPoint& p) {
  return std::max(p.e_cyl.cwiseAbs().maxCoeff(), kFreeSpaceImpedance * p.h_cyl.cwiseAbs().maxCoeff());
}

// ½ Re ∫∫ (E_x H_y* − E_y H_x*) dx dy in W, from the Cartesian fields only: trapezoid rule in φ
// (exact for the trigonometric polynomials of degree <= 2ν + 2 involved), 30-point Gauss–Legendre
// panels in r over [0, a] and over [a, a + 40 a/W] (K_ν² has decayed by e^{−80} there).
double power_by_quadrature(const StepIndexField& field, const StepIndexFibre& f) {
  using Gauss = boost::math::quadrature::gauss<double, 30>;
  const auto& m = field.mode();
  const int n_phi = 4 * m.nu + 24;
  auto ring = [&](double r) {  // ∫ S_z dφ at radius r
    double sum = 0.0;
    for (int i = 0; i < n_phi; ++i) {
      const double phi = 2.0 * std::numbers::pi * i / n_phi;
      const FieldPoint p = field.at(r * std::cos(phi), r * std::sin(phi));
      sum += 0.5 * std::real(p.e_xyz[0] * std::conj(p.h_xyz[1]) - p.e_xyz[1] * std::conj(p.h_xyz[0]));
    }
    return sum * 2.0 * std::numbers::pi / n_phi * r;
  };
  const double a = f.radius_um;
  double total = 0.0;
  for (int k = 0; k < 4; ++k) total += Gauss::integrate(ring, a * k / 4.0, a * (k + 1) / 4.0);
  const double decay = a / m.w;
  for (int k = 0; k < 80; ++k) {
    total += Gauss::integrate(ring, a + 0.5 * decay * k, a + 0.5 * decay * (k + 1));
  }
  return total * 1e-12;  // µm² → m²
}

}  // namespace

// Tangential E and H (E_φ, E_z, H_φ, H_z) and normal B (μ0 H_r) are continuous at r = a, and
// normal D is: n1² E_r(a⁻) = n2² E_r(a⁺) (J. D. Jackson, "Classical Electrodynamics", §7.3 / §I.5).
TEST(StepIndexFields, BoundaryConditionsHoldAtTheCoreCladdingInterface) {
  for (const auto& f : test_fibres()) {
    for (const auto& m : solve_vector_modes(f)) {
      for (Orientation o : {Orientation::Even, Orientation::Odd}) {
        const StepIndexField field(f, m, o);
        for (double phi : {0.0, 0.3, 1.1, 2.5, 4.0}) {
          const auto in = field.at_polar(f.radius_um, phi, StepIndexField::Side::Core);
          const auto out = field.at_polar(f.radius_um, phi, StepIndexField::Side::Cladding);
          const double scale = max_abs(in), tol = 1e-10 * scale;
          EXPECT_NEAR(std::abs(in.e_cyl[1] - out.e_cyl[1]), 0.0, tol) << m.label << " E_phi";
          EXPECT_NEAR(std::abs(in.e_cyl[2] - out.e_cyl[2]), 0.0, tol) << m.label << " E_z";
          const double z0 = kFreeSpaceImpedance;
          EXPECT_NEAR(z0 * std::abs(in.h_cyl[0] - out.h_cyl[0]), 0.0, tol) << m.label << " H_r";
          EXPECT_NEAR(z0 * std::abs(in.h_cyl[1] - out.h_cyl[1]), 0.0, tol) << m.label << " H_phi";
          EXPECT_NEAR(z0 * std::abs(in.h_cyl[2] - out.h_cyl[2]), 0.0, tol) << m.label << " H_z";
          const double n1sq = f.n_core * f.n_core, n2sq = f.n_clad * f.n_clad;
          EXPECT_NEAR(std::abs(n1sq * in.e_cyl[0] - n2sq * out.e_cyl[0]), 0.0, n1sq * tol)
              << m.label << " D_r";
        }
      }
    }
  }
}

// ∇×E = −jωμ0 H and ∇×H = jωε E with ∂/∂z = −jβ, by central differences (h = 1e-4 a) at points
// inside the core and in the cladding: checks the field formulas themselves, not only the
// interface.
TEST(StepIndexFields, SatisfyMaxwellsCurlEquations) {
  for (const auto& f : test_fibres()) {
    const double k0 = f.k0_per_um(), z0 = kFreeSpaceImpedance, h = 1e-4 * f.radius_um;
    for (const auto& m : solve_vector_modes(f)) {
      const StepIndexField field(f, m, Orientation::Even);
      const cd j(0.0, 1.0);
      // One scale per mode (fields of order ν >= 2 vanish on the axis): the largest field on the
      // sample points, times k0.
      double scale_e = 0.0;
      for (double rr : {0.37, 0.8, 1.0}) scale_e = std::max(scale_e, k0 * max_abs(field.at_polar(rr * f.radius_um, 0.7)));
      for (double rr : {0.0, 0.37, 0.8, 1.3, 1.9}) {
        const double r = rr * f.radius_um, phi = 0.7;
        const double x = r * std::cos(phi), y = r * std::sin(phi);
        const auto p = field.at(x, y);
        const auto px = field.at(x + h, y), mx = field.at(x - h, y);
        const auto py = field.at(x, y + h), my = field.at(x, y - h);
        const double nsq = rr < 1.0 ? f.n_core * f.n_core : f.n_clad * f.n_clad;
        auto dx = [&](const Eigen::Vector3cd FieldPoint::*v, int c) { return ((px.*v)[c] - (mx.*v)[c]) / (2 * h); };
        auto dy = [&](const Eigen::Vector3cd FieldPoint::*v, int c) { return ((py.*v)[c] - (my.*v)[c]) / (2 * h); };
        const auto E = &FieldPoint::e_xyz, H = &FieldPoint::h_xyz;
        const Eigen::Vector3cd curl_e(dy(E, 2) + j * m.beta * p.e_xyz[1], -j * m.beta * p.e_xyz[0] - dx(E, 2),
                                      dx(E, 1) - dy(E, 0));
        const Eigen::Vector3cd curl_h(dy(H, 2) + j * m.beta * p.h_xyz[1], -j * m.beta * p.h_xyz[0] - dx(H, 2),
                                      dx(H, 1) - dy(H, 0));
        const Eigen::Vector3cd want_e = -j * k0 * z0 * p.h_xyz;       // −jωμ0 H (µm units)
        const Eigen::Vector3cd want_h = j * k0 * nsq / z0 * p.e_xyz;  // jωε E
        EXPECT_LT((curl_e - want_e).norm(), 1e-6 * scale_e) << m.label << " r/a = " << rr;
        EXPECT_LT(z0 * (curl_h - want_h).norm(), 1e-6 * scale_e) << m.label << " r/a = " << rr;
      }
    }
  }
}

// ½ Re ∫ (E × H*)·ẑ dA = 1 W with dA in m² (docs/conventions.md), by 2-D quadrature independent
// of the module's closed-form power.
TEST(StepIndexFields, CarryOneWattOfPower) {
  double worst = 0.0;
  for (const auto& f : test_fibres()) {
    for (const auto& m : solve_vector_modes(f)) {
      for (Orientation o : {Orientation::Even, Orientation::Odd}) {
        if (o == Orientation::Odd && m.nu == 0) continue;
        const double p = power_by_quadrature(StepIndexField(f, m, o), f);
        EXPECT_NEAR(p, 1.0, 1e-10) << m.label << " a = " << f.radius_um;
        worst = std::max(worst, std::fabs(p - 1.0));
      }
    }
  }
  std::printf("max |P - 1 W| over all modes = %.3g\n", worst);
}

// Orientation and symmetry: HE11 Even is x-polarised and Odd y-polarised at the axis; TE0m has no
// E_z and no E_r, TM0m no H_z and no H_r (Snyder & Love Table 12-3, from memory).
TEST(StepIndexFields, PolarisationAndSymmetryOfNamedModes) {
  const StepIndexFibre rod{1.444024, 1.0, 1.0, 1.55};
  const auto modes = solve_vector_modes(rod);
  const StepIndexField even(rod, modes.at(0), Orientation::Even), odd(rod, modes.at(0), Orientation::Odd);
  ASSERT_EQ(modes.at(0).label, "HE11");
  const auto pe = even.at(0.0, 0.0), po = odd.at(0.0, 0.0);
  EXPECT_GT(std::abs(pe.e_xyz[0]), 1e6);  // ~ 1e7 V/m for 1 W in ~1 µm²
  EXPECT_LT(std::abs(pe.e_xyz[1]), 1e-12 * std::abs(pe.e_xyz[0]));
  EXPECT_LT(std::abs(po.e_xyz[0]), 1e-12 * std::abs(po.e_xyz[1]));
  // Transverse fields real, E_z imaginary (the phase convention of the header).
  EXPECT_LT(std::abs(pe.e_xyz[0].imag()), 1e-12 * std::abs(pe.e_xyz[0]));
  const auto edge = even.at(0.9, 0.1);
  EXPECT_LT(std::abs(edge.e_xyz[2].real()), 1e-12 * std::abs(edge.e_xyz[2]));
  for (const auto& m : modes) {
    if (m.nu != 0) continue;
    const StepIndexField field(rod, m);
    for (double r : {0.3, 0.9, 1.4}) {
      const auto p = field.at_polar(r, 0.4);
      const double s = max_abs(p);
      if (m.family == ModeFamily::TE) {
        EXPECT_LT(std::abs(p.e_cyl[2]) + std::abs(p.e_cyl[0]), 1e-12 * s) << m.label;
      } else {
        EXPECT_LT(kFreeSpaceImpedance * (std::abs(p.h_cyl[2]) + std::abs(p.h_cyl[0])), 1e-12 * s) << m.label;
      }
    }
  }
  StepIndexMode lp = solve_lp_modes(rod).at(0);
  EXPECT_THROW(StepIndexField(rod, lp), cladwise::InputError);
}
