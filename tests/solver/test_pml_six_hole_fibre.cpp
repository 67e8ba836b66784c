// Leaky fundamental mode of the six-hole silica microstructured fibre through the cylindrical PML,
// against the multipole method: T. P. White et al., JOSA B 19, 2322 (2002) and B. T. Kuhlmey et
// al., JOSA B 19, 2331 (2002), n_eff = 1.445395345 + i 3.150e-8 (quoted in a thesis, checks.md §3;
// secondary). Loss = 20 log10(e) k0 Im n_eff = 1.186 dB/m (computed from the formula).
//
// Quarter domain: for the x-polarised member of the degenerate pair E_x is even in y and E_y odd
// in x, so y = 0 is a magnetic wall and x = 0 an electric wall; the y-polarised partner has them
// swapped. The outer edge of the PML is an electric wall.
//
// Observed: the real part converges to 1.44539523 (11k → 141k unknowns move it by 6e-8), 1.1e-7
// below the quoted multipole value, and the imaginary part to 3.1945e-8, 1.4 % above it. An
// independent full-vector multipole computation of the same fibre (tests/benchmark/
// multipole_six_hole.py: the published method of White et al. implemented here from Maxwell's
// equations and Graf's addition theorem, sharing no code with the FEM) converges to
// 1.445395232149 + i 3.194525e-8 at 12–14 harmonics per hole and gives the quoted
// 1.445395345 + i 3.1506e-8 only at the truncation |m| ≤ 5. So the quoted value is taken to be
// under-converged: the real part is held to 1.5e-7 of it (not the 1e-7) and the loss to
// 5 %; the converged multipole value, a number computed in this project, not a published one,
// is the tight check (3e-8 and 0.3 %).
#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <numbers>

#include "leaky_cases.hpp"

namespace cladwise {
namespace {

constexpr double kRe = 1.445395345, kIm = 3.150e-8;  // multipole method (White et al. 2002)
constexpr double kLossDbPerM = 1.186;                 // 8.686 k0 Im n_eff (checks.md §3)
// Converged multipole value, |m| ≤ 12–14 (computed by tests/benchmark/multipole_six_hole.py).
constexpr double kReMultipole = 1.445395232149, kImMultipole = 3.194525e-8;

struct PcfRun {
  LeakyMode mode;
  int n_dofs = 0;
};

PcfRun solve_pcf(double h_scale, double t_pml, double strength, bool x_polarised) {
  const double r_phys = 11.0;
  const Mesh mesh = mesh_cross_section(testing::six_hole_fibre(
      r_phys, t_pml, 0.5 * h_scale, 0.35 * h_scale, 0.8 * h_scale, SymmetryCut::quarter));
  LeakyModeProblem p;
  p.mesh = &mesh;
  p.region_materials = testing::materials_by_name(
      mesh, {{"silica", complex_index_material(1.45, 0.0)}, {"air", complex_index_material(1.0, 0.0)}});
  p.wavelength_um = 1.45;
  p.order = 2;
  p.boundary_walls = x_polarised
                         ? testing::walls(mesh, WallType::electric, WallType::magnetic, WallType::electric)
                         : testing::walls(mesh, WallType::electric, WallType::electric, WallType::magnetic);
  Pml pml;
  pml.shape = PmlShape::cylindrical;
  pml.inner_radius = r_phys;
  pml.thickness = t_pml;
  pml.strength = strength;
  p.pml = pml;
  ComplexModeSolver solver(p);
  LeakySolveRequest req;
  req.n_modes = 1;
  req.n_target = 1.45;
  const LeakySolveResult r = solver.solve(req);
  EXPECT_EQ(r.status, EigenStatus::converged);
  EXPECT_EQ(r.modes.size(), 1u);
  PcfRun run;
  run.n_dofs = r.n_dofs;
  if (!r.modes.empty()) run.mode = r.modes[0];
  std::printf("h %.2f t %.1f sigma %.1f %s dofs %d: n_eff %.10f %+.4e  loss %.4f dB/m  phys %.6f  res %.1e\n",
              h_scale, t_pml, strength, x_polarised ? "x-pol" : "y-pol", r.n_dofs,
              run.mode.n_eff.real(), run.mode.n_eff.imag(), run.mode.loss_db_per_m,
              run.mode.physical_fraction, run.mode.residual);
  return run;
}

TEST(PmlSixHoleFibre, BothPartnersMatchTheMultipoleMethod) {
  const PcfRun x = solve_pcf(0.5, 4.0, 8.0, true);
  const PcfRun y = solve_pcf(0.5, 4.0, 8.0, false);
  for (const PcfRun* r : {&x, &y}) {
    EXPECT_NEAR(r->mode.n_eff.real(), kRe, 1.5e-7);
    EXPECT_LT(r->mode.n_eff.imag(), 0.0);  // lossy under exp(j(ωt − βz))
    EXPECT_NEAR(r->mode.n_eff_imag / kIm, 1.0, 0.05);
    EXPECT_NEAR(r->mode.loss_db_per_m / kLossDbPerM, 1.0, 0.05);
    EXPECT_GT(r->mode.physical_fraction, 0.999);
    EXPECT_LT(r->mode.residual, 1e-12);
    // Against the converged multipole computation: the mesh error of this mesh (1.2e-8 in Re).
    EXPECT_NEAR(r->mode.n_eff.real(), kReMultipole, 3e-8);
    EXPECT_NEAR(r->mode.n_eff_imag / kImMultipole, 1.0, 0.003);
  }
  // The C6v pair is degenerate (checks.md §3); the two symmetry classes see different quarter
  // meshes, so they agree to the discretisation error (2.8e-7 at h_scale 1, 4e-9 at 0.5).
  EXPECT_NEAR(y.mode.n_eff.real(), x.mode.n_eff.real(), 2e-8);
  EXPECT_NEAR(y.mode.n_eff_imag / x.mode.n_eff_imag, 1.0, 0.002);
}

TEST(PmlSixHoleFibre, LossIsStableUnderPmlThicknessAndStrength) {
  const PcfRun base = solve_pcf(1.0, 4.0, 8.0, true);
  const PcfRun thick = solve_pcf(1.0, 6.0, 8.0, true);
  const PcfRun strong = solve_pcf(1.0, 4.0, 14.0, true);
  for (const PcfRun* o : {&thick, &strong}) {
    EXPECT_NEAR(o->mode.n_eff_imag / base.mode.n_eff_imag, 1.0, 0.02);   // issue 5: stable to 2 %
    EXPECT_NEAR(o->mode.n_eff.real(), base.mode.n_eff.real(), 1e-9);
  }
}

}  // namespace
}  // namespace cladwise
