// General media (solver/material.hpp): complex index and permittivity under the exp(+jωt)
// convention (docs/conventions.md), rotated uniaxial crystals, and the kernel tensors ν_t of a
// full in-plane μ (docs/formulation.md §8).
#include <gtest/gtest.h>

#include <cmath>
#include <complex>
#include <numbers>

#include "mesh/error.hpp"
#include "solver/element_kernels.hpp"
#include "solver/material.hpp"

namespace cladwise {
namespace {

using C = std::complex<double>;
constexpr double pi = std::numbers::pi;

TEST(TensorMaterial, ComplexIndexSquaresWithLossNegativeImaginary) {
  // ε = (n − jκ)² = n² − κ² − 2jnκ: Im ε < 0 absorbs under exp(+jωt) (conventions.md).
  const TensorMaterial m = complex_index_material(1.5, 0.01, "lossy");
  EXPECT_NEAR(m.eps_zz.real(), 2.25 - 1e-4, 1e-15);
  EXPECT_NEAR(m.eps_zz.imag(), -0.03, 1e-15);
  EXPECT_EQ(m.eps_t(0, 0), m.eps_zz);
  EXPECT_EQ(m.eps_t(0, 1), C(0.0));
  EXPECT_THROW(complex_index_material(1.5, -0.01, "gain"), InputError);
  EXPECT_THROW(complex_permittivity_material(C(2.0, 0.1), "gain"), InputError);
  // A metal (illustrative gold-like value at 1.55 µm) is accepted; it has no real index.
  const TensorMaterial gold = complex_permittivity_material(C(-95.9, -11.0), "metal");
  EXPECT_EQ(max_real_index(gold), 0.0);
  EXPECT_FALSE(is_lossless_diagonal(gold));
  EXPECT_TRUE(is_lossless_diagonal(complex_index_material(1.45, 0.0)));
}

TEST(TensorMaterial, RotatedUniaxialHasItsAxisAtTheAngle) {
  // LiNbO3 at 1.55 µm, Zelmon et al. JOSA B 14, 3319 (1997) (checks.md §1).
  const double no = 2.211111, ne = 2.137560;
  for (double deg : {0.0, 20.0, 45.0, 90.0, 135.0}) {
    const double th = deg * pi / 180;
    const TensorMaterial m = rotated_uniaxial_material(no * no, ne * ne, th);
    const Eigen::Vector2cd axis(std::cos(th), std::sin(th)), perp(-std::sin(th), std::cos(th));
    EXPECT_LT((m.eps_t * axis - ne * ne * axis).norm(), 1e-14) << deg;   // ε_t a = ε_e a
    EXPECT_LT((m.eps_t * perp - no * no * perp).norm(), 1e-14) << deg;   // ε_t a⊥ = ε_o a⊥
    EXPECT_EQ(m.eps_zz, C(no * no));
    EXPECT_LT(std::abs(m.eps_t(0, 1) - m.eps_t(1, 0)), 1e-15);          // symmetric
    EXPECT_NEAR(max_real_index(m), no, 1e-14);
  }
  // At 45° the off-diagonal term is (ε_e − ε_o)/2 (R diag(ε_e, ε_o) Rᵀ worked by hand).
  const TensorMaterial m45 = rotated_uniaxial_material(no * no, ne * ne, pi / 4);
  EXPECT_NEAR(m45.eps_t(0, 1).real(), (ne * ne - no * no) / 2, 1e-14);
  const TensorMaterial mz = z_uniaxial_material(no * no, ne * ne);
  EXPECT_EQ(mz.eps_zz, C(ne * ne));
  EXPECT_EQ(mz.eps_t(1, 1), C(no * no));
}

TEST(TensorMaterial, NuTensorIsTheRotatedInverseOfMu) {
  // Diagonal μ: ν_t = diag(1/μ_yy, 1/μ_xx), ν_zz = 1/μ_zz (formulation.md eq. 4).
  TensorMaterial m;
  m.mu_t << C(2.0, -0.5), 0.0, 0.0, C(0.5, 0.25);
  m.mu_zz = C(3.0, -1.0);
  MaterialTensors<C> t = material_tensors(m);
  EXPECT_LT(std::abs(t.nu_t(0, 0) - 1.0 / m.mu_t(1, 1)), 1e-15);
  EXPECT_LT(std::abs(t.nu_t(1, 1) - 1.0 / m.mu_t(0, 0)), 1e-15);
  EXPECT_LT(std::abs(t.nu_zz - 1.0 / m.mu_zz), 1e-15);
  // Full symmetric μ_t: (−ẑ×u)·μ_t⁻¹(−ẑ×u) = u·ν_t u for every u, i.e. ν_t = Rᵀ μ_t⁻¹ R with
  // R u = −ẑ × u = (u_y, −u_x).
  m.mu_t << C(2.0, -0.5), C(0.3, 0.1), C(0.3, 0.1), C(0.5, 0.25);
  t = material_tensors(m);
  Eigen::Matrix2cd r;
  r << 0.0, 1.0, -1.0, 0.0;
  EXPECT_LT((t.nu_t - r.transpose() * m.mu_t.inverse() * r).norm(), 1e-14);
}

}  // namespace
}  // namespace cladwise
