// Fields of complex modes (solver/leaky_mode_fields.hpp) on the weakly guiding step-index fibre of
// checks.md §2 (n_co 1.4494, n_cl 1.4440, a 4.1 µm, λ 1.55 µm), quarter domain (magnetic wall on
// y = 0, electric on x = 0: HE11 x-polarised):
//  * lossless, no PML: the complex path reproduces the real path's ModeFieldEvaluator fields up to a
//    global phase (the real path is tested against Pozar's TE10 and the exact HE11) and holds 1 W;
//  * weak core absorption κ: the complex field moves by O(κ), in quadrature with the lossless one
//    (first-order perturbation theory, Snyder & Love, "Optical Waveguide Theory" 1983, ch. 18), so
//    it doubles with κ while |E| and S_z stay within 1e-5;
//  * PML far outside: the physical-domain fields equal the closed-wall (real) fields, S_z
//    integrates to 1 W over the physical regions, and the fields match the exact HE11 of the open
//    fibre (Snyder & Love ch. 12; solver/step_index.hpp) to discretisation accuracy.
#include <gtest/gtest.h>

#include <cmath>
#include <complex>
#include <cstdio>
#include <memory>
#include <vector>

#include "leaky_cases.hpp"
#include "mesh/error.hpp"
#include "solver/assembly.hpp"
#include "solver/leaky_mode_fields.hpp"
#include "solver/mode_fields.hpp"
#include "solver/mode_solver.hpp"
#include "solver/step_index.hpp"

namespace cladwise {
namespace {

using Complex = std::complex<double>;
constexpr double kNco = 1.4494, kNcl = 1.4440, kA = 4.1, kLambda = 1.55;

/// Fields sampled at the quadrature points (degree `degree`) of the physical triangles, with weights
/// dA in µm².
struct Samples {
  std::vector<double> w;
  std::vector<Eigen::Vector3cd> e, h;
};

template <typename Evaluator>
Samples sample(const Mesh& mesh, const Evaluator& ev, int degree = 6) {
  const QuadratureRule& rule = triangle_rule(degree);
  Samples s;
  for (int t = 0; t < mesh.n_triangles(); ++t) {
    if (mesh.regions[mesh.triangle_region[t]].role == RegionRole::pml) continue;
    const ElementGeometry g = element_geometry(mesh, t);
    for (int q = 0; q < rule.n_points(); ++q) {
      const FieldSample f = ev.at_reference(t, rule.points[q]);
      s.w.push_back(rule.weights[q] * map_point(g, rule.points[q]).det);
      s.e.push_back(f.e);
      s.h.push_back(f.h);
    }
  }
  return s;
}

/// ½ Re ∫ (E × H*)·ẑ dA of the samples (W).
double power_w(const Samples& s) {
  double p = 0.0;
  for (std::size_t i = 0; i < s.w.size(); ++i) p += s.w[i] * FieldSample{s.e[i], s.h[i]}.s_z();
  return p * 1e-12;
}

struct Comparison {
  Complex alpha;       ///< best global factor a ≈ α b, fitted on E
  double rel_e = 0.0;  ///< ‖E_a − α E_b‖ / ‖E_a‖ (L2 over the samples)
  double rel_h = 0.0;  ///< the same for H with the same α
};

Comparison compare(const Samples& a, const Samples& b) {
  Complex num = 0.0;
  double den = 0.0;
  for (std::size_t i = 0; i < a.w.size(); ++i) {
    num += a.w[i] * b.e[i].dot(a.e[i]);  // Σ w conj(b)·a
    den += a.w[i] * b.e[i].squaredNorm();
  }
  Comparison c;
  c.alpha = num / den;
  double de = 0.0, ne = 0.0, dh = 0.0, nh = 0.0;
  for (std::size_t i = 0; i < a.w.size(); ++i) {
    de += a.w[i] * (a.e[i] - c.alpha * b.e[i]).squaredNorm();
    ne += a.w[i] * a.e[i].squaredNorm();
    dh += a.w[i] * (a.h[i] - c.alpha * b.h[i]).squaredNorm();
    nh += a.w[i] * a.h[i].squaredNorm();
  }
  c.rel_e = std::sqrt(de / ne);
  c.rel_h = std::sqrt(dh / nh);
  return c;
}

LeakyModeProblem fibre_problem(const Mesh& mesh, double kappa) {
  LeakyModeProblem p;
  p.mesh = &mesh;
  p.region_materials = testing::materials_by_name(
      mesh, {{"core", complex_index_material(kNco, kappa)}, {"cladding", complex_index_material(kNcl, 0.0)}});
  p.wavelength_um = kLambda;
  p.order = 2;
  p.boundary_walls = testing::walls(mesh, WallType::electric, WallType::magnetic, WallType::electric);
  return p;
}

ModeProblem real_fibre_problem(const Mesh& mesh) {
  ModeProblem p;
  p.mesh = &mesh;
  for (const auto& r : mesh.regions) p.region_materials.push_back(isotropic_material(r.material == "core" ? kNco : kNcl));
  p.wavelength_um = kLambda;
  p.order = 2;
  p.boundary_walls = testing::walls(mesh, WallType::electric, WallType::magnetic, WallType::electric);
  return p;
}

LeakySolveResult solve_one(ComplexModeSolver& s) {
  LeakySolveRequest q;
  q.n_modes = 1;
  return s.solve(q);
}

TEST(LeakyFields, LosslessComplexFieldsEqualTheRealFields) {
  const Mesh mesh = mesh_cross_section(testing::step_index_fibre(kA, 16.0, 0.0, 0.5, 1.2, SymmetryCut::quarter));
  const ModeProblem rp = real_fibre_problem(mesh);
  ModeSolver rs(rp);
  SolveRequest rq;
  rq.n_modes = 1;
  const SolveResult rr = rs.solve(rq);
  ASSERT_EQ(rr.modes.size(), 1u);
  const ModeFieldEvaluator real(rp, rs.dof_map(), rr.modes[0]);

  ComplexModeSolver cs(fibre_problem(mesh, 0.0));
  const LeakySolveResult cr = solve_one(cs);
  ASSERT_EQ(cr.status, EigenStatus::converged);
  ASSERT_EQ(cr.modes.size(), 1u);
  const LeakyModeFieldEvaluator leaky(cs, cr.modes[0]);

  // Power: 1 W re-summed from the public samples, with the kernel rule and a finer one.
  const Samples a = sample(mesh, leaky), b = sample(mesh, real);
  const double p6 = power_w(a), p12 = power_w(sample(mesh, leaky, 12));
  std::printf("power: %.15f W (degree 6), %.15f W (degree 12); PML part %.1e W\n", p6, p12, leaky.pml_power_w());
  EXPECT_NEAR(p6, 1.0, 1e-10);
  EXPECT_NEAR(p12, 1.0, 1e-10);  // the finer rule: the curved elements' non-polynomial part is negligible
  EXPECT_EQ(leaky.pml_power_w(), 0.0);

  // Same fields up to a global phase (the eigenvector sign of the real path).
  const Comparison c = compare(a, b);
  std::printf("complex vs real: |α| = %.12f, arg α = %.3e rad, rel L2 E %.2e, H %.2e\n", std::abs(c.alpha),
              std::arg(c.alpha), c.rel_e, c.rel_h);
  EXPECT_NEAR(std::abs(c.alpha), 1.0, 1e-8);
  EXPECT_LT(c.rel_e, 1e-8);
  EXPECT_LT(c.rel_h, 1e-8);
  // Phase convention: the larger of E_x, E_y at the power peak is real positive; a lossless mode
  // then has real E_t and imaginary E_z everywhere (α = ±1).
  const FieldSample peak = leaky.at_reference(leaky.peak_triangle(), leaky.peak_reference_point());
  EXPECT_GT(peak.e.x().real(), 0.0);
  EXPECT_GE(std::abs(peak.e.x()), std::abs(peak.e.y()));  // x-polarised HE11
  EXPECT_LT(std::abs(peak.e.x().imag()), 1e-12 * std::abs(peak.e.x()));
  EXPECT_LT(std::abs(std::abs(c.alpha.real()) - 1.0), 1e-8);
  double max_re_ez = 0.0, max_e = 0.0;
  for (std::size_t i = 0; i < a.w.size(); ++i) {
    max_re_ez = std::max(max_re_ez, std::abs(a.e[i].z().real()) + std::abs(a.e[i].x().imag()));
    max_e = std::max(max_e, a.e[i].norm());
  }
  EXPECT_LT(max_re_ez, 1e-8 * max_e);

  // Nodal and point values are the element fields.
  const NodalFields nodal = leaky.at_nodes();
  const int t0 = leaky.peak_triangle();
  const int corner = mesh.triangles[t0][0];
  const auto at_corner = leaky.at_point(t0, mesh.nodes[corner]);
  ASSERT_TRUE(at_corner.has_value());
  EXPECT_LT((at_corner->e - leaky.at_reference(t0, {0.0, 0.0}).e).norm(), 1e-9 * at_corner->e.norm());
  // The peak lies inside the core, away from interfaces, where E is continuous: the average over
  // elements equals the one-sided value to discretisation accuracy.
  EXPECT_LT((nodal.e[corner] - at_corner->e).norm(), 1e-3 * at_corner->e.norm());
  EXPECT_FALSE(leaky.at_point(t0, {100.0, 100.0}).has_value());

}

TEST(LeakyFields, WeakCoreAbsorptionMovesTheFieldsLinearlyInKappa) {
  const Mesh mesh = mesh_cross_section(testing::step_index_fibre(kA, 16.0, 0.0, 0.5, 1.2, SymmetryCut::quarter));
  Samples s[3];
  const double kappa[3] = {0.0, 1e-5, 2e-5};
  std::vector<std::unique_ptr<ComplexModeSolver>> solvers;
  for (int i = 0; i < 3; ++i) {
    solvers.push_back(std::make_unique<ComplexModeSolver>(fibre_problem(mesh, kappa[i])));
    const LeakySolveResult r = solve_one(*solvers.back());
    ASSERT_EQ(r.status, EigenStatus::converged);
    ASSERT_EQ(r.modes.size(), 1u);
    const LeakyModeFieldEvaluator ev(*solvers.back(), r.modes[0]);
    s[i] = sample(mesh, ev);
    EXPECT_NEAR(power_w(s[i]), 1.0, 1e-10);
    if (i > 0) {
      EXPECT_LT(r.modes[0].n_eff.imag(), 0.0);
    }
  }
  const Comparison c1 = compare(s[1], s[0]), c2 = compare(s[2], s[0]);
  std::printf("κ 1e-5: rel L2 E %.3e, H %.3e, α %.12f%+.2ei; κ 2e-5: E %.3e, H %.3e; ratio E %.4f\n", c1.rel_e,
              c1.rel_h, c1.alpha.real(), c1.alpha.imag(), c2.rel_e, c2.rel_h, c2.rel_e / c1.rel_e);
  // The complex field changes at first order, E_κ = E_0 + jκE_1 with E_1 in phase with E_0 (the
  // perturbation δε = −2jnκ is imaginary on a real operator). Its size, ~70κ here, is set by the
  // coupling to the cladding modes of the walled disk: κ k0² 2n / (γ² + (j01/16 µm)²) ≈ 3.5e-3
  // times an overlap below one (Snyder & Love ch. 18, first-order field correction; estimate).
  EXPECT_LT(c1.rel_e, 1.5e-3);
  EXPECT_LT(c1.rel_h, 1.5e-3);
  // It is the first-order response, not noise: it doubles with κ.
  EXPECT_NEAR(c2.rel_e / c1.rel_e, 2.0, 0.02);
  EXPECT_NEAR(c2.rel_h / c1.rel_h, 2.0, 0.02);
  EXPECT_GT(c1.rel_e, 1e-8);
  // Being in quadrature, it leaves the moduli |E_i| and the power density S_z unchanged to first
  // order: they stay within 1e-5 of the lossless ones.
  double dm = 0.0, nm = 0.0, ds = 0.0, ns = 0.0;
  for (std::size_t i = 0; i < s[0].w.size(); ++i) {
    const double w = s[0].w[i];
    dm += w * (s[1].e[i].cwiseAbs() - s[0].e[i].cwiseAbs()).squaredNorm();
    nm += w * s[0].e[i].squaredNorm();
    const double sz0 = FieldSample{s[0].e[i], s[0].h[i]}.s_z(), sz1 = FieldSample{s[1].e[i], s[1].h[i]}.s_z();
    ds += w * (sz1 - sz0) * (sz1 - sz0);
    ns += w * sz0 * sz0;
  }
  std::printf("κ 1e-5: rel L2 of |E_i| %.2e, of S_z %.2e\n", std::sqrt(dm / nm), std::sqrt(ds / ns));
  EXPECT_LT(std::sqrt(dm / nm), 1e-5);
  EXPECT_LT(std::sqrt(ds / ns), 1e-5);
}

TEST(LeakyFields, PmlFarOutsideReproducesTheClosedWallAndTheExactFields) {
  // Physical disk 36 µm, PML 4 µm: the HE11 field at the layer is ~1e-5 of its peak (γ ≈ 0.34/µm).
  const double r_phys = 36.0, t_pml = 4.0;
  const Mesh mesh = mesh_cross_section(testing::step_index_fibre(kA, r_phys, t_pml, 0.5, 1.5, SymmetryCut::quarter));
  // Closed wall: the same mesh, the layer filled with plain cladding, electric wall outside it.
  const ModeProblem rp = real_fibre_problem(mesh);
  ModeSolver rs(rp);
  SolveRequest rq;
  rq.n_modes = 1;
  const SolveResult rr = rs.solve(rq);
  ASSERT_EQ(rr.modes.size(), 1u);
  const ModeFieldEvaluator closed(rp, rs.dof_map(), rr.modes[0]);

  LeakyModeProblem lp = fibre_problem(mesh, 0.0);
  Pml pml;
  pml.inner_radius = r_phys;
  pml.thickness = t_pml;
  pml.strength = 8.0;
  lp.pml = pml;
  ComplexModeSolver cs(lp);
  const LeakySolveResult cr = solve_one(cs);
  ASSERT_EQ(cr.status, EigenStatus::converged);
  ASSERT_EQ(cr.modes.size(), 1u);
  const LeakyModeFieldEvaluator open(cs, cr.modes[0]);
  const Samples a = sample(mesh, open), b = sample(mesh, closed);
  const Comparison c = compare(a, b);
  std::printf("PML vs closed wall: n_eff %.12f %+.2e vs %.12f; |α| %.10f, rel L2 E %.2e, H %.2e; "
              "physical power %.13f W, PML %.1e W\n",
              cr.modes[0].n_eff.real(), cr.modes[0].n_eff.imag(), rr.modes[0].n_eff, std::abs(c.alpha), c.rel_e,
              c.rel_h, power_w(a), open.pml_power_w());
  EXPECT_NEAR(cr.modes[0].n_eff.real(), rr.modes[0].n_eff, 1e-10);
  EXPECT_NEAR(std::abs(c.alpha), 1.0, 1e-6);
  EXPECT_LT(c.rel_e, 1e-6);
  EXPECT_LT(c.rel_h, 1e-6);
  EXPECT_NEAR(power_w(a), 1.0, 1e-10);  // 1 W over the physical regions only
  EXPECT_LT(std::abs(open.pml_power_w()), 1e-6);
  EXPECT_NE(open.pml_power_w(), 0.0);   // the layer regions were evaluated, and left out

  // Against the exact HE11 of the open fibre this PML models (Even = x-polarised), normalised to
  // 1 W over the full cross-section: the quarter domain holds a quarter of its power, so the FEM
  // fields are twice the exact ones.
  const StepIndexFibre fibre{kNco, kNcl, kA, kLambda};
  const auto modes = solve_vector_modes(fibre);
  const StepIndexField exact(fibre, modes[0], Orientation::Even);
  const QuadratureRule& rule = triangle_rule(6);
  Samples x;
  for (int t = 0; t < mesh.n_triangles(); ++t) {
    if (mesh.regions[mesh.triangle_region[t]].role == RegionRole::pml) continue;
    const ElementGeometry g = element_geometry(mesh, t);
    for (int q = 0; q < rule.n_points(); ++q) {
      const MappedPoint m = map_point(g, rule.points[q]);
      const FieldPoint f = exact.at(m.x.x(), m.x.y());
      x.w.push_back(rule.weights[q] * m.det);
      x.e.push_back(2.0 * f.e_xyz);
      x.h.push_back(2.0 * f.h_xyz);
    }
  }
  const Comparison ce = compare(x, a);
  std::printf("exact HE11 vs complex FEM: α = %.6f%+.2ei, rel L2 E %.2e, H %.2e\n", ce.alpha.real(),
              ce.alpha.imag(), ce.rel_e, ce.rel_h);
  EXPECT_NEAR(std::abs(ce.alpha), 1.0, 1e-5);
  EXPECT_LT(ce.rel_e, 3e-3);  // h 0.5 µm core, 1.5 µm cladding, order 2: 1.7e-3 observed
  EXPECT_LT(ce.rel_h, 3e-3);
}

TEST(LeakyFields, BentFieldsTendToTheStraightFieldsAsTheRadiusGrows) {
  // The bend's fields are those of the transformed frame (E_z = h Ê_s, h = 1 + x/R); as R → ∞ they
  // must approach the straight guide's, with a difference of order a/R (first order in 1/R).
  const Mesh mesh = mesh_cross_section(testing::step_index_fibre(kA, 16.0, 0.0, 0.5, 1.2, SymmetryCut::quarter));
  ComplexModeSolver straight(fibre_problem(mesh, 0.0));
  const LeakySolveResult r0 = solve_one(straight);
  ASSERT_EQ(r0.modes.size(), 1u);
  const Samples s0 = sample(mesh, LeakyModeFieldEvaluator(straight, r0.modes[0]));
  double rel[2];
  const double radii[2] = {1e6, 1e7};  // 1 m and 10 m
  for (int i = 0; i < 2; ++i) {
    LeakyModeProblem p = fibre_problem(mesh, 0.0);
    Bend bend;
    bend.radius_um = radii[i];
    p.bend = bend;
    ComplexModeSolver bent(p);
    const LeakySolveResult r = solve_one(bent);
    ASSERT_EQ(r.modes.size(), 1u);
    const Samples s = sample(mesh, LeakyModeFieldEvaluator(bent, r.modes[0]));
    EXPECT_NEAR(power_w(s), 1.0, 1e-10);
    const Comparison c = compare(s, s0);
    rel[i] = std::max(c.rel_e, c.rel_h);
    std::printf("R %.0e µm: n_eff %.12f (straight %.12f), rel L2 E %.2e H %.2e\n", radii[i], r.modes[0].n_eff.real(),
                r0.modes[0].n_eff.real(), c.rel_e, c.rel_h);
  }
  // Size: δε = 2n² x/R on the quarter domain (x ≥ 0, so first order) against the gap to the walled
  // disk's cladding modes, k0² 2n² (16 µm/R) / (γ² + (j01/16 µm)²) ≈ 8e-3 at R = 1 m, times an
  // overlap below one (estimate, as in the absorption test); 4.9e-4 observed.
  EXPECT_LT(rel[0], 2e-3);
  EXPECT_NEAR(rel[0] / rel[1], 10.0, 0.5);  // first order in 1/R
}

TEST(LeakyFields, RejectsAModeOfAnotherMesh) {
  const Mesh mesh = mesh_cross_section(testing::step_index_fibre(kA, 12.0, 0.0, 1.0, 2.0, SymmetryCut::quarter));
  const ComplexModeSolver cs(fibre_problem(mesh, 0.0));
  LeakyMode m;
  m.beta = 5.0;
  m.eigenvector = Eigen::VectorXcd::Zero(cs.n_dofs() + 1);
  EXPECT_THROW(LeakyModeFieldEvaluator ev(cs, m), InputError);
  m.eigenvector = Eigen::VectorXcd::Zero(cs.n_dofs());
  EXPECT_THROW(LeakyModeFieldEvaluator ev(cs, m), ComputationError);  // no power
}

}  // namespace
}  // namespace cladwise
