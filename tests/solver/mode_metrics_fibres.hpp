// Test helpers for the mode-metric, label, overlap and coupled-core tests: step-index fibre
// meshes straight from the mesher (mesh_cross_section), and the same metric integrals of the
// exact step-index fields (solver/step_index.hpp) by an independent polar quadrature.
#pragma once

#include <Eigen/Core>

#include <cmath>
#include <complex>
#include <numbers>
#include <string>
#include <vector>

#include "mesh/cross_section.hpp"
#include "mesh/gmsh_mesher.hpp"
#include "solver/material.hpp"
#include "solver/mode_solver.hpp"
#include "solver/quadrature.hpp"
#include "solver/step_index.hpp"

namespace cladwise::testing {

struct CoreSpec {
  std::string name;
  Point2 centre{0.0, 0.0};
  double radius_um = 0.0;
  double semi_axis_y_um = 0.0;  ///< > 0: an ellipse with semi-axes (radius_um, semi_axis_y_um)
};

struct FibreSpec {
  std::vector<CoreSpec> cores;
  double wall_radius_um = 0.0;
  double core_size_um = 0.5;
  double clad_size_um = 3.0;
  double growth = 1.3;
  int order = 2;
  SymmetryCut symmetry = SymmetryCut::none;
};

/// Mesh of cores (regions named as given, material "core") in a cladding disk ("cladding").
inline Mesh fibre_mesh(const FibreSpec& s) {
  CrossSection c;
  c.background_material = "cladding";
  c.background_name = "cladding";
  c.outer.kind = OuterBoundary::Kind::disk;
  c.outer.radius = s.wall_radius_um;
  for (const auto& k : s.cores) {
    RegionSpec r;
    r.name = k.name;
    r.material = "core";
    if (k.semi_axis_y_um > 0) {
      r.shapes = {Shape{Ellipse{k.radius_um, k.semi_axis_y_um}, Placement{k.centre, 0.0}}};
    } else {
      r.shapes = {Shape{Disk{k.radius_um}, Placement{k.centre, 0.0}}};
    }
    r.mesh_size = s.core_size_um;
    r.guiding = true;
    c.regions.push_back(r);
  }
  c.symmetry = s.symmetry;
  c.controls.order = s.order;
  c.controls.default_size = s.clad_size_um;
  c.controls.growth = s.growth;
  return mesh_cross_section(c);
}

/// Every region not named "cladding" gets n_core; all boundaries electric unless `walls` given.
inline ModeProblem fibre_problem(const Mesh& mesh, double n_core, double n_clad, double wavelength_um,
                                 int order, std::vector<WallType> walls = {}) {
  ModeProblem p;
  p.mesh = &mesh;
  for (const auto& r : mesh.regions) {
    p.region_materials.push_back(r.name == "cladding" ? isotropic_material(n_clad, "cladding")
                                                      : isotropic_material(n_core, "core"));
  }
  p.wavelength_um = wavelength_um;
  p.order = order;
  p.boundary_walls = walls.empty() ? std::vector<WallType>(mesh.boundaries.size(), WallType::electric)
                                   : walls;
  return p;
}

/// Metric integrals of an exact step-index field over the disk r < r_max, by Gauss–Legendre in r
/// (split at the core radius) and the trapezoidal rule in φ (exact for the trigonometric
/// polynomials of the exact fields). Gradients by central differences in r and φ on the side of
/// the point.
struct ExactIntegrals {
  double et2 = 0, et4 = 0;   ///< ∫|E_t|², ∫|E_t|⁴ (µm² units)
  double ex2 = 0;            ///< ∫|E_x|²
  double dx2 = 0, dy2 = 0;   ///< ∫|∂E_x/∂x|², ∫|∂E_x/∂y|²
  double wave = 0;           ///< ∫(k0²n² − β²)|E_x|² (1/µm² · µm² units)
  double mfd_wave_um() const { return 2.0 * std::sqrt(2.0 * ex2 / wave); }
  double effective_area_um2() const { return et2 * et2 / et4; }
  double mfd_petermann_um() const { return 2.0 * std::sqrt(2.0 * ex2 / (dx2 + dy2)); }
  double mfd_x_um() const { return 2.0 * std::sqrt(ex2 / dx2); }
  double mfd_y_um() const { return 2.0 * std::sqrt(ex2 / dy2); }
};

inline ExactIntegrals exact_integrals(const StepIndexField& f, const StepIndexFibre& fib, double r_max) {
  const double a = fib.radius_um, k0 = fib.k0_per_um(), beta = f.mode().beta;
  ExactIntegrals out;
  std::vector<double> gx, gw;
  gauss_legendre_01(16, gx, gw);
  const int n_phi = 64;
  auto piece = [&](double r0, double r1, StepIndexField::Side side) {
    for (std::size_t i = 0; i < gx.size(); ++i) {
      const double r = r0 + (r1 - r0) * gx[i], wr = (r1 - r0) * gw[i] * r;
      const double h = 1e-5 * a;
      for (int k = 0; k < n_phi; ++k) {
        const double phi = 2.0 * std::numbers::pi * k / n_phi, w = wr * 2.0 * std::numbers::pi / n_phi;
        const Eigen::Vector3cd e = f.at_polar(r, phi, side).e_xyz;
        const std::complex<double> dr =
            (f.at_polar(r + h, phi, side).e_xyz.x() - f.at_polar(r - h, phi, side).e_xyz.x()) / (2 * h);
        const double hp = 1e-5;
        const std::complex<double> dp =
            (f.at_polar(r, phi + hp, side).e_xyz.x() - f.at_polar(r, phi - hp, side).e_xyz.x()) / (2 * hp * r);
        const std::complex<double> ddx = std::cos(phi) * dr - std::sin(phi) * dp;
        const std::complex<double> ddy = std::sin(phi) * dr + std::cos(phi) * dp;
        const double t2 = std::norm(e.x()) + std::norm(e.y());
        out.et2 += w * t2;
        out.et4 += w * t2 * t2;
        out.ex2 += w * std::norm(e.x());
        out.dx2 += w * std::norm(ddx);
        out.dy2 += w * std::norm(ddy);
        const double n = side == StepIndexField::Side::Core ? fib.n_core : fib.n_clad;
        out.wave += w * (k0 * k0 * n * n - beta * beta) * std::norm(e.x());
      }
    }
  };
  const int n_core = 6, n_clad = 40;
  for (int j = 0; j < n_core; ++j) piece(a * j / n_core, a * (j + 1) / n_core, StepIndexField::Side::Core);
  for (int j = 0; j < n_clad; ++j)
    piece(a + (r_max - a) * j / n_clad, a + (r_max - a) * (j + 1) / n_clad, StepIndexField::Side::Cladding);
  return out;
}

}  // namespace cladwise::testing
