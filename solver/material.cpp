// Material factories with input validation (docs/conventions.md, "Errors").
#include "solver/material.hpp"

#include <Eigen/LU>

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

// ---- general media (see material.hpp) ------------------------------------------------------------
namespace cladwise {

namespace {

void check_passive(std::complex<double> e, const std::string& name, const char* what) {
  if (!std::isfinite(e.real()) || !std::isfinite(e.imag())) {
    throw InputError("material '" + name + "'", std::string(what) + " must be finite");
  }
  if (e.imag() > 0.0) {
    throw InputError("material '" + name + "'",
                     std::string(what) + " has Im > 0, which is gain under the exp(+jωt) "
                     "convention; give absorption as Im ε < 0 or κ ≥ 0 in n − jκ "
                     "(docs/conventions.md)");
  }
}

}  // namespace

TensorMaterial tensor_material(const Material& m) {
  TensorMaterial t;
  t.name = m.name;
  t.eps_t << m.eps_xx, 0.0, 0.0, m.eps_yy;
  t.eps_zz = m.eps_zz;
  t.mu_t << 1.0 / m.mu_inv_xx, 0.0, 0.0, 1.0 / m.mu_inv_yy;
  t.mu_zz = 1.0 / m.mu_inv_zz;
  return t;
}

TensorMaterial complex_index_material(double n, double kappa, std::string name) {
  if (!(n > 0.0) || !std::isfinite(n)) {
    throw InputError("material '" + name + "'",
                     "refractive index must be a positive number, got " + std::to_string(n));
  }
  if (!(kappa >= 0.0) || !std::isfinite(kappa)) {
    throw InputError("material '" + name + "'",
                     "extinction coefficient κ must be >= 0 (n − jκ absorbs), got " +
                         std::to_string(kappa));
  }
  const std::complex<double> nc(n, -kappa);
  return complex_permittivity_material(nc * nc, std::move(name));
}

TensorMaterial complex_permittivity_material(std::complex<double> eps, std::string name) {
  check_passive(eps, name, "relative permittivity");
  if (eps == 0.0) {
    throw InputError("material '" + name + "'", "relative permittivity must not be zero");
  }
  TensorMaterial t;
  t.name = std::move(name);
  t.eps_t = eps * Eigen::Matrix2cd::Identity();
  t.eps_zz = eps;
  return t;
}

TensorMaterial rotated_uniaxial_material(std::complex<double> eps_o, std::complex<double> eps_e,
                                         double theta_rad, std::string name) {
  check_passive(eps_o, name, "ordinary permittivity");
  check_passive(eps_e, name, "extraordinary permittivity");
  TensorMaterial t;
  t.name = std::move(name);
  Eigen::Matrix2d r;
  r << std::cos(theta_rad), -std::sin(theta_rad), std::sin(theta_rad), std::cos(theta_rad);
  Eigen::Matrix2cd d = Eigen::Matrix2cd::Zero();
  d(0, 0) = eps_e;  // the optic axis is the local x axis before the rotation
  d(1, 1) = eps_o;
  t.eps_t = r.cast<std::complex<double>>() * d * r.transpose().cast<std::complex<double>>();
  t.eps_zz = eps_o;
  return t;
}

TensorMaterial z_uniaxial_material(std::complex<double> eps_o, std::complex<double> eps_e,
                                   std::string name) {
  check_passive(eps_o, name, "ordinary permittivity");
  check_passive(eps_e, name, "extraordinary permittivity");
  TensorMaterial t;
  t.name = std::move(name);
  t.eps_t = eps_o * Eigen::Matrix2cd::Identity();
  t.eps_zz = eps_e;
  return t;
}

double max_real_index(const TensorMaterial& m) {
  // Eigenvalues of the in-plane block: (tr ± sqrt(tr² − 4 det))/2.
  const std::complex<double> tr = m.eps_t.trace(), det = m.eps_t.determinant();
  const std::complex<double> disc = std::sqrt(tr * tr - 4.0 * det);
  const double e = std::max({((tr + disc) / 2.0).real(), ((tr - disc) / 2.0).real(), m.eps_zz.real()});
  return e > 0.0 ? std::sqrt(e) : 0.0;
}

bool is_lossless_diagonal(const TensorMaterial& m) {
  const auto real_pos = [](std::complex<double> v) { return v.imag() == 0.0 && v.real() > 0.0; };
  return real_pos(m.eps_t(0, 0)) && real_pos(m.eps_t(1, 1)) && real_pos(m.eps_zz) &&
         m.eps_t(0, 1) == 0.0 && m.eps_t(1, 0) == 0.0 && m.mu_t == Eigen::Matrix2cd::Identity() &&
         m.mu_zz == 1.0;
}

}  // namespace cladwise
