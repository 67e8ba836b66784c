// Material: the per-region relative permittivity tensor ε_r (and, for now, μ_r = 1) as the FEM
// kernels see it. Only diagonal tensors in the (x, y, z) frame of the cross-section are modelled:
// isotropic media (ε = n²) and uniaxial/biaxial crystals with axes along x, y, z.
//
// The tensor is templated on the scalar so that lossy materials and PML coordinate stretching
// (complex ε, μ) share the same code path later; the lossless solver uses `Material` = double.
#pragma once

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

}  // namespace cladwise
