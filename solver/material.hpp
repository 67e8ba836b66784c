// Material: the per-region relative permittivity tensor ε_r (and, for now, μ_r = 1) as the FEM
// kernels see it. Only diagonal tensors in the (x, y, z) frame of the cross-section are modelled:
// isotropic media (ε = n²) and uniaxial/biaxial crystals with axes along x, y, z.
//
// The tensor is templated on the scalar so that lossy materials and PML coordinate stretching
// (complex ε, μ) share the same code path later; the lossless solver uses `Material` = double.
#pragma once

#include <Eigen/Core>

#include <algorithm>
#include <cmath>
#include <complex>
#include <string>

namespace cladwise {

/// Diagonal relative permittivity and inverse relative permeability of one region.
template <typename Scalar>
struct BasicMaterial {
  std::string name;
  Scalar eps_xx{1}, eps_yy{1}, eps_zz{1};           ///< relative permittivity (diagonal)
  Scalar mu_inv_xx{1}, mu_inv_yy{1}, mu_inv_zz{1};  ///< 1/μ_r (diagonal); 1 for all current media
};

using Material = BasicMaterial<double>;

/// Isotropic medium of refractive index n (ε_r = n²). Throws InputError unless n > 0.
Material isotropic_material(double n, std::string name = {});

/// Diagonal anisotropic medium ε_r = diag(eps_xx, eps_yy, eps_zz). Throws InputError unless all
/// three components are positive.
Material diagonal_material(double eps_xx, double eps_yy, double eps_zz, std::string name = {});

/// Largest refractive index the medium offers to any polarisation: sqrt(max ε_ii). A guided mode
/// cannot have n_eff above the largest of these over all regions.
inline double max_index(const Material& m) {
  return std::sqrt(std::max({m.eps_xx, m.eps_yy, m.eps_zz}));
}

/// Smallest refractive index of the medium: sqrt(min ε_ii).
inline double min_index(const Material& m) {
  return std::sqrt(std::min({m.eps_xx, m.eps_yy, m.eps_zz}));
}

// ---- general media: complex (lossy, metallic) and full in-plane tensors --------------------------
//
// Convention (docs/conventions.md): exp(+jωt), so an absorbing medium has Im ε < 0; a complex index
// is n − jκ with κ ≥ 0, ε = (n − jκ)². The tensors are block-diagonal in (t, z): ε = [ε_t 0; 0 ε_zz]
// with a full 2×2 in-plane block ε_t (x, y), and likewise μ. This covers isotropic and lossy media,
// metals (Re ε < 0), uniaxial crystals with the optic axis at any angle in the cross-section or
// along z, and the coordinate-stretched media of a PML or a bend (solver/pml.hpp, solver/bend.hpp).

/// Relative permittivity and permeability of one region, complex, with full in-plane blocks.
struct TensorMaterial {
  std::string name;
  Eigen::Matrix2cd eps_t = Eigen::Matrix2cd::Identity();  ///< [ε_xx ε_xy; ε_yx ε_yy]
  std::complex<double> eps_zz{1.0};
  Eigen::Matrix2cd mu_t = Eigen::Matrix2cd::Identity();   ///< [μ_xx μ_xy; μ_yx μ_yy]
  std::complex<double> mu_zz{1.0};
};

/// The lossless diagonal medium `m` as a TensorMaterial (μ from 1/mu_inv_*).
TensorMaterial tensor_material(const Material& m);

/// Isotropic medium of complex index n − jκ (κ ≥ 0 absorbs): ε = (n − jκ)². Throws InputError
/// unless n > 0 and κ ≥ 0.
TensorMaterial complex_index_material(double n, double kappa, std::string name = {});

/// Isotropic medium of complex relative permittivity ε (metals: Re ε < 0). Throws InputError when
/// Im ε > 0 (gain under exp(+jωt): almost always a sign mistake) or ε = 0.
TensorMaterial complex_permittivity_material(std::complex<double> eps, std::string name = {});

/// Uniaxial crystal with its optic axis in the cross-section at angle θ (radians, counter-clockwise
/// from x): ε_t = R(θ) diag(ε_e, ε_o) R(θ)ᵀ, ε_zz = ε_o. Complex values allowed (Im ≤ 0).
TensorMaterial rotated_uniaxial_material(std::complex<double> eps_o, std::complex<double> eps_e,
                                         double theta_rad, std::string name = {});

/// Uniaxial crystal with its optic axis along z: ε = diag(ε_o, ε_o, ε_e).
TensorMaterial z_uniaxial_material(std::complex<double> eps_o, std::complex<double> eps_e,
                                   std::string name = {});

/// Largest index any polarisation sees in the medium: sqrt of the largest real part of an
/// eigenvalue of ε_t and of ε_zz (0 for a metal). Used for default shifts and bounds.
double max_real_index(const TensorMaterial& m);

/// True when the medium has no loss and no in-plane off-diagonal terms, μ = 1 and Re ε > 0,
/// i.e. when the real lossless path (Material) can represent it exactly.
bool is_lossless_diagonal(const TensorMaterial& m);

}  // namespace cladwise
