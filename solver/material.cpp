// Material factories with input validation (docs/conventions.md, "Errors").
#include "solver/material.hpp"

#include <string>

#include "mesh/error.hpp"

namespace cladwise {

Material isotropic_material(double n, std::string name) {
  if (!(n > 0.0) || !std::isfinite(n)) {
    throw InputError("material '" + name + "'",
                     "refractive index must be a positive number, got " + std::to_string(n));
  }
  return diagonal_material(n * n, n * n, n * n, std::move(name));
}

Material diagonal_material(double eps_xx, double eps_yy, double eps_zz, std::string name) {
  for (double e : {eps_xx, eps_yy, eps_zz}) {
    if (!(e > 0.0) || !std::isfinite(e)) {
      throw InputError("material '" + name + "'",
                       "relative permittivity components must be positive (lossless dielectric), "
                       "got " + std::to_string(e));
    }
  }
  Material m;
  m.name = std::move(name);
  m.eps_xx = eps_xx;
  m.eps_yy = eps_yy;
  m.eps_zz = eps_zz;
  return m;
}

}  // namespace cladwise
