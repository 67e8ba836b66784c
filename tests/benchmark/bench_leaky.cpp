// Benchmark (not a test): leaky and lossy modes on domains too large for the test suite.
//
//   bench_leaky pcf [h_scale]      six-hole fibre (White et al. 2002), quarter domain, PML sweep
//   bench_leaky pcf-full [h_scale] the same on the full domain
//   bench_leaky bend               weakly guiding fibre bend loss vs Marcuse (1976), several R
#include <chrono>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <numbers>
#include <string>

#include "../solver/leaky_cases.hpp"
#include "solver/complex_mode_solver.hpp"

using namespace cladwise;
using namespace cladwise::testing;

namespace {

double seconds_since(std::chrono::steady_clock::time_point t0) {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
}

// Multipole-method value, White et al. JOSA B 19, 2322 (2002) via checks.md §3.
constexpr double kPcfRe = 1.445395345, kPcfIm = 3.150e-8;

int bench_pcf(double h_scale, bool full, double r_phys, double t_pml, double strength, bool y_pol = false) {
  const auto t0 = std::chrono::steady_clock::now();
  const CrossSection s = six_hole_fibre(r_phys, t_pml, 0.5 * h_scale, 0.35 * h_scale, 0.8 * h_scale,
                                        full ? SymmetryCut::none : SymmetryCut::quarter);
  const Mesh mesh = mesh_cross_section(s);
  const double t_mesh = seconds_since(t0);
  LeakyModeProblem p;
  p.mesh = &mesh;
  p.region_materials = materials_by_name(mesh, {{"silica", complex_index_material(1.45, 0.0)},
                                                {"air", complex_index_material(1.0, 0.0)}});
  p.wavelength_um = 1.45;
  p.order = 2;
  p.boundary_walls = y_pol ? walls(mesh, WallType::electric, WallType::electric, WallType::magnetic)
                          : walls(mesh, WallType::electric, WallType::magnetic, WallType::electric);
  Pml pml;
  pml.shape = PmlShape::cylindrical;
  pml.inner_radius = r_phys;
  pml.thickness = t_pml;
  pml.strength = strength;
  p.pml = pml;
  ComplexModeSolver solver(p);
  LeakySolveRequest req;
  req.n_modes = full ? 2 : 1;
  req.n_target = 1.45;
  const auto t1 = std::chrono::steady_clock::now();
  const LeakySolveResult r = solver.solve(req);
  const double t_solve = seconds_since(t1);
  for (const auto& m : r.modes) {
    std::printf("pcf %s h_scale %.2f R %.1f t %.1f sigma %.1f dofs %d  n_eff %.10f %+.4e  dRe %+.2e  "
                "Im/Im_ref %.4f  loss %.4f dB/m  frac %.6f  res %.1e  mesh %.1fs solve %.1fs (%s, dropped %d)\n",
                full ? "full" : "quarter", h_scale, r_phys, t_pml, strength, r.n_dofs, m.n_eff.real(),
                m.n_eff.imag(), m.n_eff.real() - kPcfRe, m.n_eff_imag / kPcfIm, m.loss_db_per_m,
                m.physical_fraction, m.residual, t_mesh, t_solve, std::string(to_string(r.status)).c_str(),
                r.n_pml_modes_dropped);
  }
  if (r.modes.empty()) std::printf("pcf: no mode (%s)\n", std::string(to_string(r.status)).c_str());
  std::fflush(stdout);
  return 0;
}

int bench_bend(double r_phys, double t_pml, double strength, double h_clad) {
  const StepIndexFibre f{1.4494, 1.4440, 4.1, 1.55};
  double prev_fem = 0, prev_ref = 0, prev_r = 0;
  for (double r_mm : {5.0, 7.5, 10.0, 12.5, 15.0}) {
    const double r_um = r_mm * 1000;
    const auto t0 = std::chrono::steady_clock::now();
    int dofs = 0;
    const LeakyMode m = bent_fibre_mode(r_um, r_phys, t_pml, strength, 0.6, h_clad,
                                        BendModel::exact_transformation, &dofs);
    const double t = seconds_since(t0);
    const LeakyMode c = bent_fibre_mode(r_um, r_phys, t_pml, strength, 0.6, h_clad, BendModel::conformal_index);
    const double ref = marcuse_loss_db_per_m(f, r_um);
    std::printf("bend R %5.1f mm dofs %d: n_eff %.9f %+.3e loss %.4g dB/m (%.4g dB/turn, %.4g dB/90deg) "
                "conformal %.4g  Marcuse %.4g  ratio %.3f  phys %.4f  %.1fs",
                r_mm, dofs, m.n_eff.real(), m.n_eff.imag(), m.loss_db_per_m,
                bend_loss_db(m.loss_db_per_m, r_um, 2 * std::numbers::pi),
                bend_loss_db(m.loss_db_per_m, r_um, std::numbers::pi / 2), c.loss_db_per_m, ref,
                m.loss_db_per_m / ref, m.physical_fraction, t);
    if (prev_r > 0) {
      const double slope_fem = std::log(m.loss_db_per_m / prev_fem) / (r_um - prev_r);
      const double slope_ref = std::log(ref / prev_ref) / (r_um - prev_r);
      std::printf("  slope FEM %.4e ref %.4e /um (ratio %.3f)", slope_fem, slope_ref, slope_fem / slope_ref);
    }
    std::printf("\n");
    std::fflush(stdout);
    prev_fem = m.loss_db_per_m;
    prev_ref = ref;
    prev_r = r_um;
  }
  return 0;
}

}  // namespace

int main(int argc, char** argv) {
  const std::string what = argc > 1 ? argv[1] : "pcf";
  const double h = argc > 2 ? std::atof(argv[2]) : 1.0;
  const double r_phys = argc > 3 ? std::atof(argv[3]) : 11.0;
  const double t_pml = argc > 4 ? std::atof(argv[4]) : 4.0;
  const double sigma = argc > 5 ? std::atof(argv[5]) : 8.0;
  if (what == "bend") return bench_bend(argc > 3 ? r_phys : 30.0, argc > 4 ? t_pml : 6.0, argc > 5 ? sigma : 10.0, h);
  if (what == "pcf-y") return bench_pcf(h, false, r_phys, t_pml, sigma, true);
  if (what == "pcf" || what == "pcf-full") return bench_pcf(h, what == "pcf-full", r_phys, t_pml, sigma);
  std::fprintf(stderr, "usage: bench_leaky pcf|pcf-full|bend [h_scale R t sigma]\n");
  return 2;
}
