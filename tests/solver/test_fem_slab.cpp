// Three-layer symmetric dielectric slab spanning a box, so that the fundamental mode is exactly
// one-dimensional, against the exact transcendental equations solved here with a bracketing
// root finder (Boost.Math TOMS 748).
//
// Slab: core |x| < d/2 between claddings out to electric side walls at x = ±W/2; y ∈ [0, H].
//  * TE (E = E_y(x) ŷ): all four walls electric (E_y is normal to the walls y = 0, H). With the
//    wall at distance s = W/2 − d/2 from the core the cladding field is sinh(γ(W/2 − |x|)), and
//    continuity of E_y and ∂_x E_y gives   κ tan(κd/2) = γ coth(γ s)
//    (D. Marcuse, "Theory of Dielectric Optical Waveguides", 2nd ed., Academic Press 1991, §1.3,
//    even TE modes κ tan(κd/2) = γ, with the open cladding e^{−γ|x|} replaced by the walled one;
//    coth → 1 recovers Marcuse's equation), κ² = k0² ε_yy,1 − β², γ² = β² − k0² ε_yy,2.
//  * TM (H = H_y(x) ŷ): side walls electric (E_z = 0 ⇒ ∂_x H_y = 0, cladding cosh(γ(W/2 − |x|))),
//    top and bottom magnetic (n × H = 0 is satisfied by H ∥ n... H_y is normal to y = 0, H).
//    From ∇×H = jωε0 ε E with ε = diag(ε_xx, ε_yy, ε_zz): E_x = β H_y/(ωε0 ε_xx),
//    E_z = ∂_x H_y/(jωε0 ε_zz), and (∇×E)_y = −jωμ0 H_y gives H_y'' = (ε_zz/ε_xx)(β² − k0² ε_xx) H_y.
//    Continuity of H_y and E_z ∝ H_y'/ε_zz:   (κ/ε_zz,1) tan(κd/2) = (γ/ε_zz,2) tanh(γ s),
//    κ² = (ε_zz,1/ε_xx,1)(k0² ε_xx,1 − β²), γ² = (ε_zz,2/ε_xx,2)(β² − k0² ε_xx,2)
//    (isotropic limit: Marcuse §1.3 even TM modes κ tan(κd/2) = (n1²/n2²) γ).
// The anisotropic case checks where each tensor component enters the kernels: ε_yy in the TE
// mode only, ε_xx and ε_zz in the TM mode only.
#include <gtest/gtest.h>

#include <boost/math/tools/roots.hpp>

#include <cmath>
#include <cstdint>
#include <numbers>

#include "solver/mode_solver.hpp"
#include "fem_test_meshes.hpp"

namespace cladwise {
namespace {

constexpr double kW = 2.4, kD = 0.8, kH = 0.25, kLambda = 1.0;
const double kK0 = 2 * std::numbers::pi / kLambda;

double find_beta(const std::function<double(double)>& f, double lo, double hi) {
  std::uintmax_t it = 200;
  const auto r = boost::math::tools::toms748_solve(f, lo, hi, boost::math::tools::eps_tolerance<double>(50), it);
  return 0.5 * (r.first + r.second);
}

double exact_te(const Material& core, const Material& clad) {
  const double s = 0.5 * (kW - kD);
  auto f = [&](double beta) {
    const double kappa = std::sqrt(kK0 * kK0 * core.eps_yy - beta * beta);
    const double gamma = std::sqrt(beta * beta - kK0 * kK0 * clad.eps_yy);
    return kappa * std::tan(0.5 * kappa * kD) - gamma / std::tanh(gamma * s);
  };
  const double hi = kK0 * std::sqrt(core.eps_yy) * (1 - 1e-12);
  const double lo = std::max(kK0 * std::sqrt(clad.eps_yy) * (1 + 1e-12),
                             std::sqrt(kK0 * kK0 * core.eps_yy - std::pow(std::numbers::pi / kD, 2)) * (1 + 1e-12));
  return find_beta(f, lo, hi);
}

double exact_tm(const Material& core, const Material& clad) {
  const double s = 0.5 * (kW - kD);
  auto f = [&](double beta) {
    const double kappa = std::sqrt(core.eps_zz / core.eps_xx * (kK0 * kK0 * core.eps_xx - beta * beta));
    const double gamma = std::sqrt(clad.eps_zz / clad.eps_xx * (beta * beta - kK0 * kK0 * clad.eps_xx));
    return kappa / core.eps_zz * std::tan(0.5 * kappa * kD) - gamma / clad.eps_zz * std::tanh(gamma * s);
  };
  const double hi = kK0 * std::sqrt(core.eps_xx) * (1 - 1e-12);
  const double kappa_max = std::numbers::pi / kD;  // κd/2 < π/2 for the fundamental mode
  const double beta_at_kappa_max =
      std::sqrt(std::max(0.0, kK0 * kK0 * core.eps_xx - kappa_max * kappa_max * core.eps_xx / core.eps_zz));
  const double lo = std::max(kK0 * std::sqrt(clad.eps_xx), beta_at_kappa_max) * (1 + 1e-12);
  return find_beta(f, lo, hi);
}

double fem_beta(const Material& core, const Material& clad, bool te, int order, int nx) {
  const Mesh mesh = testing::rectangle_mesh(
      -0.5 * kW, 0.5 * kW, 0.0, kH, nx, std::max(2, nx / 6), order, {{"clad", "clad"}, {"core", "core"}},
      [](double xc, double) { return std::abs(xc) < 0.5 * kD ? 1 : 0; });
  const WallType side = WallType::electric;
  const WallType top = te ? WallType::electric : WallType::magnetic;
  ModeProblem p{&mesh, {clad, core}, kLambda, order, {side, side, top, top}};
  ModeSolver solver(p);
  SolveRequest req;
  req.n_modes = 1;
  const SolveResult r = solver.solve(req);
  EXPECT_EQ(r.status, EigenStatus::converged);
  EXPECT_GE(r.modes.size(), 1u);
  if (r.modes.empty()) return 0.0;
  EXPECT_LT(r.modes[0].residual, 1e-8);
  return r.modes[0].beta;
}

void check_slab(const Material& core, const Material& clad, const char* what) {
  for (bool te : {true, false}) {
    const double exact = te ? exact_te(core, clad) : exact_tm(core, clad);
    double err_prev = 0.0, rate = 0.0;
    for (int nx : {12, 24, 48}) {  // interfaces x = ±d/2 lie on mesh lines (cells of W/nx)
      const double beta = fem_beta(core, clad, te, 2, nx);
      const double err = std::abs(beta * beta - exact * exact);
      std::printf("%s %s order 2 nx %2d: n_eff %.10f exact %.10f |Δβ²| %.2e\n", what, te ? "TE0" : "TM0",
                  nx, beta / kK0, exact / kK0, err);
      if (nx > 12) rate = std::log(err_prev / err) / std::log(2.0);
      err_prev = err;
    }
    // asymptotic rate from the two finest meshes (the coarse ones barely resolve the tails)
    std::printf("%s %s order 2 observed rate %.2f\n", what, te ? "TE0" : "TM0", rate);
    EXPECT_GE(rate, 3.5) << what << (te ? " TE" : " TM");
    EXPECT_LT(err_prev, 2e-6 * exact * exact);
    // order 1 on the finest mesh, looser
    const double b1 = fem_beta(core, clad, te, 1, 48);
    EXPECT_LT(std::abs(b1 - exact) / exact, 2e-3) << what << (te ? " TE" : " TM") << " order 1";
  }
}

TEST(FemSlab, IsotropicTeAndTmFundamentalModes) {
  check_slab(isotropic_material(1.5), isotropic_material(1.0), "isotropic");
}

TEST(FemSlab, DiagonalAnisotropyEntersTheRightComponents) {
  check_slab(diagonal_material(2.0, 2.4, 2.2), diagonal_material(1.2, 1.0, 1.1), "anisotropic");
}

// Uniform box filled with ε = diag(ε_xx, ε_yy, ε_zz) and electric walls: TE_m0 (E = E_y(x) ŷ)
// sees only ε_yy, TE_0n (E = E_x(y) x̂) only ε_xx:  β² = k0² ε_yy − (mπ/a)²,  β² = k0² ε_xx − (nπ/b)²
// (the Pozar §3.3 derivation with the single permittivity component the field meets).
TEST(FemSlab, AnisotropicFilledMetallicGuide) {
  const double a = 2.0, b = 1.0, lambda = 1.55;
  const double k0 = 2 * std::numbers::pi / lambda;
  const Material fill = diagonal_material(2.1, 2.9, 3.3);
  const Mesh mesh = testing::rectangle_mesh(0, a, 0, b, 16, 8, 2);
  ModeProblem p{&mesh, {fill}, lambda, 2, std::vector<WallType>(4, WallType::electric)};
  ModeSolver solver(p);
  SolveRequest req;
  req.n_modes = 8;
  const SolveResult r = solver.solve(req);
  ASSERT_EQ(r.status, EigenStatus::converged);
  const double pi = std::numbers::pi;
  for (double exact : {k0 * k0 * fill.eps_yy - std::pow(pi / a, 2), k0 * k0 * fill.eps_yy - std::pow(2 * pi / a, 2),
                       k0 * k0 * fill.eps_xx - std::pow(pi / b, 2)}) {
    double nearest = 1e300;
    for (const Mode& m : r.modes) nearest = std::min(nearest, std::abs(m.beta * m.beta - exact));
    EXPECT_LT(nearest, 1e-5 * exact) << "β² = " << exact;
  }
}

}  // namespace
}  // namespace cladwise
