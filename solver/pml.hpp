// Perfectly matched layer by complex coordinate stretching (docs/formulation.md §8).
//
// Outside the physical domain the transverse coordinates are continued into the complex plane,
// x → x̃(x) with Jacobian J = ∂x̃/∂x; outgoing waves exp(−jk·x̃) then decay without reflection at
// the interface (J.-P. Bérenger, J. Comput. Phys. 114, 185 (1994); W. C. Chew & W. H. Weedon,
// Microw. Opt. Technol. Lett. 7, 599 (1994)). In the real coordinates this is the same problem in
// an anisotropic medium (transformation rule, Teixeira & Chew, IEEE Microwave Guided Wave Lett.
// 7, 371 (1997) for the cylindrical case):
//
//   ε' = det(J) J⁻¹ ε J⁻ᵀ,   μ' = det(J) J⁻¹ μ J⁻ᵀ,   J = [J_t 0; 0 1]  (z is not stretched).
//
// Profiles, with ρ the depth into the layer, t its thickness and s = 1 − jσ(ρ) under exp(+jωt):
//   σ(ρ) = σ_max (ρ/t)^m   (polynomial grading, m = 2 by default; Bérenger 1994)
//   Cartesian (rectangular frame):  J_t = diag(s_x(ρ_x), s_y(ρ_y))
//   cylindrical (disk boundary):    J_t = R(φ) diag(s_r, s_φ) R(φ)ᵀ,  s_r = s(ρ), s_φ = r̃/r,
//                                   r̃ = r − j σ_max t/(m+1) (ρ/t)^{m+1}
// For isotropic ε these give the familiar ε' = ε diag(s_y/s_x, s_x/s_y, s_x s_y) and, in the
// (r, φ, z) frame, ε' = ε diag(s_φ/s_r, s_r/s_φ, s_r s_φ).
//
// Strength: a wave exp(−j k_n ρ̃) with wavenumber k_n normal to the layer, crossing it twice
// (PEC backing), returns with the theoretical reflection R = exp(−2 k_n σ_max t/(m+1)). For a
// plane wave at normal incidence k_n = k0 n; a leaky mode meets the layer at grazing incidence
// with k_n = k0 sqrt(n² − n_eff²) ≪ k0 n, so σ_max must be larger (several units) than the
// plane-wave estimate suggests. Check stability under a change of σ_max (ComplexModeSolver can).
#pragma once

#include <Eigen/Core>

#include <complex>

#include "mesh/mesh.hpp"
#include "solver/element_kernels.hpp"
#include "solver/material.hpp"

namespace cladwise {

enum class PmlShape {
  cylindrical,  ///< radial stretching outside a circle (disk outer boundary)
  cartesian,    ///< x and y stretching outside an axis-aligned rectangle
};

struct Pml {
  PmlShape shape = PmlShape::cylindrical;
  Point2 centre{0.0, 0.0};   ///< centre of the circle or rectangle (µm)
  double inner_radius = 0;   ///< cylindrical: radius where the layer starts (µm)
  double half_width = 0;     ///< cartesian: half sizes of the inner (physical) rectangle (µm)
  double half_height = 0;
  double thickness = 0;      ///< t (µm)
  int power = 2;             ///< m of σ(ρ) = σ_max (ρ/t)^m
  double strength = 0;       ///< σ_max (dimensionless): s = 1 − j σ_max (ρ/t)^m
};

/// Throws InputError (naming "pml.<field>") unless thickness > 0, strength ≥ 0, power ≥ 0 and the
/// inner circle or rectangle is positive.
void validate(const Pml& pml);

/// σ_max giving the theoretical reflection `reflection` (0 < R < 1) for a wave of normal
/// wavenumber k_normal (1/µm; k0 n for a plane wave at normal incidence, k0 sqrt(n² − n_eff²) for a
/// leaky mode): σ_max = (m + 1) ln(1/R) / (2 k_normal t).
double pml_strength_for_reflection(double reflection, double k_normal, double thickness,
                                   int power = 2);

/// The theoretical reflection exp(−2 k_normal σ_max t/(m+1)) of `pml` for normal wavenumber
/// k_normal (1/µm).
double pml_theoretical_reflection(const Pml& pml, double k_normal);

/// J_t = ∂x̃/∂x at the point x (µm); the identity inside the inner circle or rectangle.
Eigen::Matrix2cd pml_stretch_jacobian(const Pml& pml, const Eigen::Vector2d& x);

/// The medium `m` seen through an in-plane coordinate stretch J_t:
/// ε'_t = det J_t J_t⁻¹ ε_t J_t⁻ᵀ, ε'_zz = det J_t ε_zz, and the same for μ.
TensorMaterial stretched_material(const TensorMaterial& m, const Eigen::Matrix2cd& j_t);

/// Kernel tensors of `m` inside the PML at x.
MaterialTensors<std::complex<double>> pml_tensors(const Pml& pml, const TensorMaterial& m,
                                                  const Eigen::Vector2d& x);

}  // namespace cladwise
