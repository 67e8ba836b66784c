// A material as a case file names it: one dispersion model (isotropic), three (diagonal
// principal indices along x, y, z) or two (uniaxial crystal: ordinary and extraordinary, with the
// optic axis in the cross-section at an angle or along z). Evaluated at a wavelength it gives the
// relative permittivity tensor the solver takes (docs/conventions.md: loss makes Im ε < 0).
#pragma once

#include <complex>
#include <string>
#include <vector>

#include "solver/dispersion_model.hpp"

namespace cladwise::io {

/// Relative permittivity tensor in the cross-section frame: in-plane block [xx xy; xy yy] and zz.
struct PermittivityTensor {
  std::complex<double> xx, xy, yy, zz;
  bool is_real() const;
  bool is_diagonal() const;
};

struct MaterialSpec {
  enum class Kind { isotropic, diagonal, uniaxial };
  std::string name;
  std::string where;                    ///< "case.toml:5"
  Kind kind = Kind::isotropic;
  std::vector<DispersionModel> models;  ///< isotropic: {n}; diagonal: {n_x, n_y, n_z}; uniaxial: {n_o, n_e}
  double optic_axis_deg = 0;            ///< uniaxial: in-plane axis angle from x (counter-clockwise)
  bool optic_axis_along_z = false;      ///< uniaxial: axis along the guide instead

  PermittivityTensor permittivity(double wavelength_um) const;
  /// Largest and smallest real refractive index the material offers at λ (principal values).
  double max_index(double wavelength_um) const;
  double min_index(double wavelength_um) const;
  /// True if any model carries absorption (κ > 0 possible).
  bool lossy() const;
  /// One-line description for reports: "Sellmeier (Malitson 1965)", "constant 1.444", ...
  std::string describe() const;
};

/// An isotropic material of constant index n (no dispersion, no loss).
MaterialSpec constant_index_material(const std::string& name, double n, const std::string& where);

}  // namespace cladwise::io
