// Exploration tool (not a test): one weakly guiding fibre solve with given mesh controls, printing
// unknowns, HE11 errors against the exact vector modes, pair split, stage times and Arnoldi cost.
//   fibre_study ORDER SYMMETRIC(0|1) CORE_SIZE INTERFACE_SIZE GROWTH CLAD_SIZE [N_MODES] [TOL]
#include <chrono>
#include <cstdio>
#include <cstdlib>

#include "fibre_meshes.hpp"

using namespace cladwise;

int main(int argc, char** argv) {
  if (argc < 7) {
    std::fprintf(stderr, "usage: fibre_study ORDER SYM HC HI G HB [NMODES] [ARNOLDI_TOL]\n");
    return 2;
  }
  bench::FibreMeshSpec s;
  s.fibre = {1.4504, 1.4447, 4.1, 1.55};
  s.wall_radius_um = 8 * 4.1;
  s.order = std::atoi(argv[1]);
  s.symmetric = std::atoi(argv[2]) != 0;
  s.core_size = std::atof(argv[3]);
  s.interface_size = std::atof(argv[4]);
  s.growth = std::atof(argv[5]);
  s.clad_size = std::atof(argv[6]);
  const int n_modes = argc > 7 ? std::atoi(argv[7]) : 2;
  const auto t0 = std::chrono::steady_clock::now();
  const Mesh mesh = bench::fibre_mesh(s);
  const double mesh_s = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
  ModeSolver solver(bench::fibre_problem(mesh, s));
  SolveRequest req;
  req.n_modes = n_modes;
  if (argc > 8) req.arnoldi_tolerance = std::atof(argv[8]);
  if (argc > 9) req.krylov_dimension = std::atoi(argv[9]);
  if (argc > 10) req.all_guided = std::atoi(argv[10]) != 0;
  const SolveResult r = solver.solve(req);
  const double exact = solve_vector_modes(s.fibre).front().n_eff;
  const double e0 = r.modes.size() > 0 ? r.modes[0].n_eff - exact : 1.0;
  const double e1 = r.modes.size() > 1 ? r.modes[1].n_eff - exact : 1.0;
  double res = 0;
  for (const auto& m : r.modes) res = std::max(res, m.residual);
  std::printf("order %d sym %d hc %.3f hi %.3f g %.2f hb %.2f | tri %d dofs %d | err %.2e %.2e split %.1e"
              " | mesh %.2f asm %.2f fact %.2f eig %.2f | nev %d runs %d ops %ld res %.1e %s nmodes %zu\n",
              s.order, s.symmetric, s.core_size, s.interface_size, s.growth, s.clad_size,
              mesh.n_triangles(), r.n_dofs, e0, e1, std::abs(e0 - e1), mesh_s, r.timing.assembly_s,
              r.timing.factorization_s, r.timing.eigensolve_s, r.n_eigenvalues, r.n_arnoldi_runs,
              r.n_operator_applications, res, std::string(to_string(r.status)).c_str(), r.modes.size());
  return 0;
}
