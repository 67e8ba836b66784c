// Weak absorption in the core of a step-index fibre. First-order perturbation theory (A. W. Snyder
// & J. D. Love, "Optical Waveguide Theory", Chapman & Hall 1983, ch. 18): for ε_core → (n − jκ)²,
// δε_r ≈ −2jnκ and
//   Im δβ = −(ωε0/4P) ∫ 2nκ |E|² dA = −k0 κ Γ,   Γ = n_co ∫_core |E|² dA / (2 Z0 P),
// i.e. modal loss = Γ × bulk loss k0 κ. Under weak guidance Γ is the core power fraction
// η = ∫_core S_z dA / P. Both Γ and η are computed here from the exact HE11 field of
// solver/step_index.hpp (1 W normalisation) by Gauss–Legendre quadrature over the core.
#include <gtest/gtest.h>

#include <boost/math/quadrature/gauss.hpp>

#include <cmath>
#include <cstdio>
#include <numbers>

#include "leaky_cases.hpp"
#include "solver/step_index.hpp"

namespace cladwise {
namespace {

constexpr double pi = std::numbers::pi;

TEST(ComplexAbsorption, ModalLossIsTheCoreFractionOfTheBulkLoss) {
  // Weakly guiding fibre of checks.md §2: n_co 1.4494, n_cl 1.4440, a 4.1 µm, λ 1.55 µm.
  const StepIndexFibre fibre{1.4494, 1.4440, 4.1, 1.55};
  const auto modes = solve_vector_modes(fibre);
  const StepIndexField field(fibre, modes[0]);  // HE11, even (x-polarised)
  using Gauss = boost::math::quadrature::gauss<double, 30>;
  double e2 = 0.0, sz = 0.0;  // ∫_core |E|² dA, ∫_core S_z dA with dA in µm²
  for (int part = 0; part < 4; ++part) {  // φ in four quarters: Gauss in r and φ
    const double p0 = part * pi / 2;
    e2 += Gauss::integrate([&](double r) {
      return r * Gauss::integrate([&](double phi) {
        return field.at(r * std::cos(phi), r * std::sin(phi)).e_xyz.squaredNorm();
      }, p0, p0 + pi / 2);
    }, 0.0, fibre.radius_um);
    sz += Gauss::integrate([&](double r) {
      return r * Gauss::integrate([&](double phi) {
        const FieldPoint f = field.at(r * std::cos(phi), r * std::sin(phi));
        return 0.5 * (f.e_xyz.x() * std::conj(f.h_xyz.y()) - f.e_xyz.y() * std::conj(f.h_xyz.x())).real();
      }, p0, p0 + pi / 2);
    }, 0.0, fibre.radius_um);
  }
  const double gamma = fibre.n_core * e2 * 1e-12 / (2.0 * kFreeSpaceImpedance * 1.0);  // P = 1 W
  const double eta = sz * 1e-12;
  std::printf("exact HE11: Γ = %.6f, core power fraction η = %.6f\n", gamma, eta);
  ASSERT_GT(eta, 0.5);
  ASSERT_LT(eta, 1.0);

  const double kappa = 1e-5;
  const Mesh mesh = mesh_cross_section(testing::step_index_fibre(4.1, 18.0, 0.0, 0.4, 1.2, SymmetryCut::quarter));
  LeakyModeProblem p;
  p.mesh = &mesh;
  p.region_materials = testing::materials_by_name(
      mesh, {{"core", complex_index_material(1.4494, kappa)}, {"cladding", complex_index_material(1.4440, 0.0)}});
  p.wavelength_um = 1.55;
  p.order = 2;
  p.boundary_walls = testing::walls(mesh, WallType::electric, WallType::magnetic, WallType::electric);
  ComplexModeSolver s(p);
  LeakySolveRequest q;
  q.n_modes = 1;
  const LeakySolveResult r = s.solve(q);
  ASSERT_EQ(r.status, EigenStatus::converged);
  ASSERT_EQ(r.modes.size(), 1u);
  const LeakyMode& m = r.modes[0];
  const double ratio = m.n_eff_imag / kappa;  // modal loss / bulk loss
  const double bulk_db_per_m = loss_db_per_m(s.k0(), kappa);
  std::printf("FEM: n_eff %.10f %+.4e, loss %.3f dB/m of bulk %.3f dB/m: ratio %.6f (Γ %.6f, η %.6f)\n",
              m.n_eff.real(), m.n_eff.imag(), m.loss_db_per_m, bulk_db_per_m, ratio, gamma, eta);
  EXPECT_LT(m.n_eff.imag(), 0.0);                // absorption is loss, not gain
  EXPECT_NEAR(ratio / gamma, 1.0, 5e-4);         // first-order perturbation, exact field
  EXPECT_NEAR(ratio / eta, 1.0, 1e-2);           // weak-guidance statement (Snyder & Love ch. 18)
  EXPECT_NEAR(m.loss_db_per_m / (eta * bulk_db_per_m), 1.0, 1e-2);
}

}  // namespace
}  // namespace cladwise
