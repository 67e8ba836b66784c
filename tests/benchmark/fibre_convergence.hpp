// h-refinement series on round step-index fibres (shared by tests/solver/test_fem_fibre_
// convergence.cpp, which asserts the observed orders on small meshes, and fibre_tables, which
// prints the full tables of docs/verification.md).
//
// One parameter h scales the whole D4-symmetric mesh: core and interface size h, cladding size
// 8h, and the growth excess (g − 1) ∝ h, so that the size field h(x) scales uniformly.
// "Straight-sided" moves every order-2 mid-edge node back to its chord: the same unknowns on a
// polygonal core, whose O(h²) geometry error then dominates (checks.md §8).
// Error: the largest |Δn_eff| over all guided modes (both polarisations) against the exact
// vector modes (solver/step_index). Observed order p_obs between successive rows:
//   |Δn_eff| ∝ h^{p_obs},  h ∝ N^{-1/2}  ⇒  p_obs = −2 Δlog|Δn_eff| / Δlog N.
#pragma once

#include <chrono>
#include <cmath>
#include <vector>

#include "fibre_meshes.hpp"

namespace cladwise::bench {

struct ConvergencePoint {
  double h = 0;
  int n_triangles = 0;
  int n_dofs = 0;
  double max_dn = 0;       ///< max |Δn_eff| over the guided modes
  double seconds = 0;      ///< mesh + solve
  double observed_order = std::nan("");  ///< against the previous point
};

inline void straighten(Mesh& mesh) {
  if (mesh.order != 2) return;
  for (const auto& tri : mesh.triangles) {
    for (int k = 0; k < 3; ++k) {
      const auto& a = mesh.nodes[tri[k]];
      const auto& b = mesh.nodes[tri[(k + 1) % 3]];
      mesh.nodes[tri[3 + k]] = {0.5 * (a[0] + b[0]), 0.5 * (a[1] + b[1])};
    }
  }
}

/// `h_ref` is the h at which the growth is `growth_ref`.
inline std::vector<ConvergencePoint> fibre_convergence(const StepIndexFibre& fibre, double wall_radius,
                                                       int order, bool curved,
                                                       const std::vector<double>& hs,
                                                       double h_ref, double growth_ref) {
  const auto exact = solve_vector_modes(fibre);
  std::vector<double> reference;
  for (const auto& m : exact) {
    for (int k = 0; k < m.degeneracy(); ++k) reference.push_back(m.n_eff);
  }
  std::vector<ConvergencePoint> out;
  for (double h : hs) {
    const auto t0 = std::chrono::steady_clock::now();
    FibreMeshSpec s{fibre, wall_radius, order, h, h, 1.0 + (growth_ref - 1.0) * h / h_ref, 8.0 * h, true};
    Mesh mesh = fibre_mesh(s);
    if (!curved) straighten(mesh);
    ModeSolver solver(fibre_problem(mesh, s));
    SolveRequest req;
    req.all_guided = true;
    const SolveResult r = solver.solve(req);
    ConvergencePoint p;
    p.h = h;
    p.n_triangles = mesh.n_triangles();
    p.n_dofs = r.n_dofs;
    p.max_dn = r.modes.size() == reference.size() && r.status == EigenStatus::converged ? 0.0 : INFINITY;
    for (std::size_t i = 0; i < std::min(r.modes.size(), reference.size()); ++i) {
      p.max_dn = std::max(p.max_dn, std::abs(r.modes[i].n_eff - reference[i]));
    }
    p.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
    if (!out.empty()) {
      p.observed_order = -2.0 * std::log(p.max_dn / out.back().max_dn) /
                         std::log(static_cast<double>(p.n_dofs) / out.back().n_dofs);
    }
    out.push_back(p);
  }
  return out;
}

/// Least-squares slope of log|Δn_eff| against log N^{-1/2} over the whole series.
inline double fitted_order(const std::vector<ConvergencePoint>& pts) {
  double sx = 0, sy = 0, sxx = 0, sxy = 0;
  const double n = static_cast<double>(pts.size());
  for (const auto& p : pts) {
    const double x = -0.5 * std::log(static_cast<double>(p.n_dofs)), y = std::log(p.max_dn);
    sx += x, sy += y, sxx += x * x, sxy += x * y;
  }
  return (n * sxy - sx * sy) / (n * sxx - sx * sx);
}

}  // namespace cladwise::bench
