// PML coordinate stretching (solver/pml.hpp) against the closed forms of the uniaxial PML
// (Z. S. Sacks, D. M. Kingsland, R. Lee, J.-F. Lee, IEEE Trans. AP 43, 1460 (1995): Λ = diag(s_y/s_x,
// s_x/s_y, s_x s_y); from memory) and of the cylindrical PML (F. L. Teixeira & W. C. Chew, IEEE
// Microwave Guided Wave Lett. 7, 371 (1997): Λ = diag(s_φ/s_r, s_r/s_φ, s_r s_φ) in (r, φ, z),
// s_φ = r̃/r), and r̃ against a numerical integral of s_r.
#include <gtest/gtest.h>

#include <boost/math/quadrature/gauss_kronrod.hpp>

#include <cmath>
#include <complex>
#include <numbers>

#include "mesh/error.hpp"
#include "solver/pml.hpp"

namespace cladwise {
namespace {

using C = std::complex<double>;

C s_of(const Pml& p, double rho) { return 1.0 - C(0, 1) * p.strength * std::pow(rho / p.thickness, p.power); }

TEST(PmlStretch, CartesianMatchesTheUniaxialTensor) {
  Pml p;
  p.shape = PmlShape::cartesian;
  p.half_width = 3.0;
  p.half_height = 2.0;
  p.thickness = 1.5;
  p.strength = 5.0;
  const TensorMaterial m = complex_index_material(1.45, 0.0);
  const C eps = m.eps_zz;
  // Inside: identity.
  EXPECT_LT((pml_stretch_jacobian(p, {2.9, -1.9}) - Eigen::Matrix2cd::Identity()).norm(), 1e-15);
  // Corner region: both stretched.
  const Eigen::Vector2d x(-3.0 - 0.7, 2.0 + 1.1);
  const C sx = s_of(p, 0.7), sy = s_of(p, 1.1);
  const TensorMaterial st = stretched_material(m, pml_stretch_jacobian(p, x));
  EXPECT_LT(std::abs(st.eps_t(0, 0) - eps * sy / sx), 1e-13);
  EXPECT_LT(std::abs(st.eps_t(1, 1) - eps * sx / sy), 1e-13);
  EXPECT_LT(std::abs(st.eps_zz - eps * sx * sy), 1e-13);
  EXPECT_LT(std::abs(st.eps_t(0, 1)), 1e-15);
  EXPECT_LT(std::abs(st.mu_t(0, 0) - sy / sx), 1e-13);
  EXPECT_LT(std::abs(st.mu_zz - sx * sy), 1e-13);
}

TEST(PmlStretch, CylindricalMatchesTeixeiraChewInTheRotatedFrame) {
  Pml p;
  p.shape = PmlShape::cylindrical;
  p.centre = {0.5, -0.25};
  p.inner_radius = 10.0;
  p.thickness = 4.0;
  p.strength = 8.0;
  p.power = 2;
  const TensorMaterial m = complex_index_material(1.45, 0.0);
  const C eps = m.eps_zz;
  for (double phi : {0.0, 0.4, 2.0, -2.7}) {
    const double r = 12.3, rho = r - p.inner_radius;
    const Eigen::Vector2d x(p.centre[0] + r * std::cos(phi), p.centre[1] + r * std::sin(phi));
    // r̃ = r0 + ∫ s_r dr by adaptive Gauss–Kronrod (Boost.Math)
    const double re = boost::math::quadrature::gauss_kronrod<double, 15>::integrate(
        [&](double t) { return s_of(p, t).real(); }, 0.0, rho);
    const double im = boost::math::quadrature::gauss_kronrod<double, 15>::integrate(
        [&](double t) { return s_of(p, t).imag(); }, 0.0, rho);
    const C s_r = s_of(p, rho), s_phi = (p.inner_radius + C(re, im)) / r;
    Eigen::Matrix2d rot;
    rot << std::cos(phi), -std::sin(phi), std::sin(phi), std::cos(phi);
    Eigen::Matrix2cd lambda = Eigen::Matrix2cd::Zero();
    lambda(0, 0) = s_phi / s_r;
    lambda(1, 1) = s_r / s_phi;
    const Eigen::Matrix2cd expected = eps * (rot.cast<C>() * lambda * rot.transpose().cast<C>());
    const TensorMaterial st = stretched_material(m, pml_stretch_jacobian(p, x));
    EXPECT_LT((st.eps_t - expected).norm(), 1e-12) << phi;
    EXPECT_LT(std::abs(st.eps_zz - eps * s_r * s_phi), 1e-12) << phi;
    EXPECT_LT((st.mu_t - expected / eps).norm(), 1e-12) << phi;
  }
  // Inside the circle nothing changes.
  EXPECT_LT((pml_stretch_jacobian(p, {5.0, 3.0}) - Eigen::Matrix2cd::Identity()).norm(), 1e-15);
}

TEST(PmlStretch, StrengthAndReflectionAreInverse) {
  Pml p;
  p.thickness = 3.0;
  p.power = 2;
  p.inner_radius = 1.0;
  const double k = 0.5;  // normal wavenumber, 1/µm
  p.strength = pml_strength_for_reflection(1e-8, k, p.thickness, p.power);
  EXPECT_NEAR(p.strength, 3.0 * std::log(1e8) / (2 * k * 3.0), 1e-12);
  EXPECT_NEAR(pml_theoretical_reflection(p, k), 1e-8, 1e-20);
  EXPECT_THROW(pml_strength_for_reflection(1.5, k, 3.0), InputError);
  Pml bad = p;
  bad.thickness = 0;
  EXPECT_THROW(validate(bad), InputError);
}

}  // namespace
}  // namespace cladwise
