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

}  // namespace

int main(int argc, char** argv) {
  const std::string what = argc > 1 ? argv[1] : "pcf";
  const double h = argc > 2 ? std::atof(argv[2]) : 1.0;
  const double r_phys = argc > 3 ? std::atof(argv[3]) : 11.0;
  const double t_pml = argc > 4 ? std::atof(argv[4]) : 4.0;
  const double sigma = argc > 5 ? std::atof(argv[5]) : 8.0;
  if (what == "pcf-y") return bench_pcf(h, false, r_phys, t_pml, sigma, true);
  if (what == "pcf" || what == "pcf-full") return bench_pcf(h, what == "pcf-full", r_phys, t_pml, sigma);
  std::fprintf(stderr, "usage: bench_leaky pcf|pcf-full|bend [h_scale R t sigma]\n");
  return 2;
}
