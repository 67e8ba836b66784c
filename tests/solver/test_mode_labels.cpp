// Mode labels of the FEM modes of a few-mode step-index fibre against the labels of the exact
// vector modes (solver/step_index: Snyder & Love, "Optical Waveguide Theory", ch. 12), matched by
// descending n_eff, each exact hybrid mode taking two FEM modes: HE11 ×2, TE01, HE21 ×2, TM01,
// EH11 ×2, HE31 ×2, HE12 ×2; their LP groups (Snyder & Love Table 14-1); and the generic
// polarisation-plus-order labels ("x-pol fundamental", ...) of an elliptical-core fibre.
// Fibre: n1 = 1.46, n2 = 1.444, a = 5.1 µm, λ = 1.55 µm (V = 4.46; a design of our own).
#include <gtest/gtest.h>

#include <cstdio>

#include "mode_metrics_fibres.hpp"
#include "solver/mode_labels.hpp"
#include "solver/step_index.hpp"

namespace cladwise {
namespace {

TEST(ModeLabels, FewModeFibreLabelledAsTheExactModes) {
  const StepIndexFibre fib{1.46, 1.444, 5.1, 1.55};
  const auto exact = solve_vector_modes(fib);
  int total = 0;
  for (const auto& m : exact) total += m.degeneracy();
  testing::FibreSpec s;
  s.cores = {{"core", {0.0, 0.0}, fib.radius_um}};
  s.wall_radius_um = 5 * fib.radius_um;
  s.core_size_um = 0.6;
  s.clad_size_um = 2.5;
  const Mesh mesh = testing::fibre_mesh(s);
  ModeSolver solver(testing::fibre_problem(mesh, fib.n_core, fib.n_clad, fib.wavelength_um, 2));
  SolveRequest req;
  req.all_guided = true;
  const SolveResult r = solver.solve(req);
  ASSERT_EQ(r.status, EigenStatus::converged);
  ASSERT_EQ(static_cast<int>(r.modes.size()), total);
  const MeshLocator loc(mesh);
  LabelOptions opt;
  opt.centre = Point2{0.0, 0.0};
  opt.core_radius_um = fib.radius_um;
  std::size_t next = 0;
  for (const auto& m : exact) {
    for (int k = 0; k < m.degeneracy(); ++k, ++next) {
      const ModeFieldEvaluator f(solver.problem(), solver.dof_map(), r.modes[next]);
      const ModeLabel l = label_mode(f, loc, opt);
      std::printf("exact %-5s %.7f | FEM %.7f: %-5s %-5s %-22s purity %.4f\n", m.label.c_str(), m.n_eff,
                  r.modes[next].n_eff, l.label.c_str(), l.lp_label.c_str(), l.generic_label.c_str(),
                  l.harmonic_purity);
      EXPECT_EQ(l.label, m.label);
      EXPECT_GT(l.harmonic_purity, 0.9) << m.label;
    }
  }
  // LP groups by Snyder & Love Table 14-1 (HEνm → LP(ν−1)m, EHνm → LP(ν+1)m, TE/TM0m → LP1m).
  const ModeFieldEvaluator f0(solver.problem(), solver.dof_map(), r.modes[0]);
  EXPECT_EQ(label_mode(f0, loc, opt).lp_label, "LP01");
}

TEST(ModeLabels, EllipticalCoreGenericLabels) {
  // Elliptical core 3 × 1.5 µm semi-axes, n1 = 1.48, n2 = 1.444 (a design of our own): the first
  // two modes are the x- and y-polarised fundamentals (x, the major axis, first: common practice).
  testing::FibreSpec s;
  s.cores = {{"core", {0.0, 0.0}, 3.0, 1.5}};
  s.wall_radius_um = 14.0;
  s.core_size_um = 0.35;
  s.clad_size_um = 2.0;
  const Mesh mesh = testing::fibre_mesh(s);
  ModeSolver solver(testing::fibre_problem(mesh, 1.48, 1.444, 1.55, 2));
  SolveRequest req;
  req.n_modes = 4;
  const SolveResult r = solver.solve(req);
  ASSERT_GE(r.modes.size(), 4u);
  const MeshLocator loc(mesh);
  std::vector<std::string> labels;
  for (int k = 0; k < 4; ++k) {
    const ModeFieldEvaluator f(solver.problem(), solver.dof_map(), r.modes[k]);
    labels.push_back(label_mode(f, loc, LabelOptions{}).label);
    std::printf("n_eff %.7f: %s\n", r.modes[k].n_eff, labels.back().c_str());
  }
  EXPECT_EQ(labels[0], "x-pol fundamental");
  EXPECT_EQ(labels[1], "y-pol fundamental");
  EXPECT_EQ(labels[2].substr(labels[2].size() - 9), "LP11-like");
}

}  // namespace
}  // namespace cladwise
