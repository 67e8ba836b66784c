// Complex coordinate stretching of a perfectly matched layer (see pml.hpp).
#include "solver/pml.hpp"

#include <Eigen/LU>

#include <algorithm>
#include <cmath>
#include <string>

#include "mesh/error.hpp"

namespace cladwise {

namespace {

constexpr std::complex<double> kJ{0.0, 1.0};

// s(ρ) = 1 − j σ_max (ρ/t)^m and its integral ∫₀^ρ s = ρ − j σ_max t/(m+1) (ρ/t)^{m+1}.
std::complex<double> stretch(const Pml& p, double rho) {
  if (rho <= 0.0) return 1.0;
  return 1.0 - kJ * p.strength * std::pow(std::min(rho, p.thickness) / p.thickness, p.power);
}

std::complex<double> stretched_depth(const Pml& p, double rho) {
  if (rho <= 0.0) return rho;
  return rho - kJ * p.strength * p.thickness / (p.power + 1.0) *
                   std::pow(std::min(rho, p.thickness) / p.thickness, p.power + 1.0);
}

}  // namespace

void validate(const Pml& p) {
  if (!(p.thickness > 0.0) || !std::isfinite(p.thickness)) {
    throw InputError("pml.thickness", "must be a positive length in micrometres, got " +
                                          std::to_string(p.thickness));
  }
  if (!(p.strength >= 0.0) || !std::isfinite(p.strength)) {
    throw InputError("pml.strength", "must be >= 0, got " + std::to_string(p.strength));
  }
  if (p.power < 0 || p.power > 8) {
    throw InputError("pml.power", "profile exponent m must be in 0..8, got " + std::to_string(p.power));
  }
  if (p.shape == PmlShape::cylindrical && !(p.inner_radius > 0.0)) {
    throw InputError("pml.inner_radius", "must be positive (the radius of the physical domain)");
  }
  if (p.shape == PmlShape::cartesian && !(p.half_width > 0.0 && p.half_height > 0.0)) {
    throw InputError("pml.half_width", "half_width and half_height of the physical rectangle must "
                                       "be positive");
  }
}

double pml_strength_for_reflection(double reflection, double k_normal, double thickness,
                                   int power) {
  if (!(reflection > 0.0 && reflection < 1.0)) {
    throw InputError("pml.reflection", "target reflection must lie in (0, 1), got " +
                                           std::to_string(reflection));
  }
  if (!(k_normal > 0.0 && thickness > 0.0)) {
    throw InputError("pml.thickness", "the normal wavenumber and the thickness must be positive");
  }
  return (power + 1.0) * std::log(1.0 / reflection) / (2.0 * k_normal * thickness);
}

double pml_theoretical_reflection(const Pml& p, double k_normal) {
  return std::exp(-2.0 * k_normal * p.strength * p.thickness / (p.power + 1.0));
}

Eigen::Matrix2cd pml_stretch_jacobian(const Pml& p, const Eigen::Vector2d& x) {
  const double dx = x.x() - p.centre[0], dy = x.y() - p.centre[1];
  Eigen::Matrix2cd j = Eigen::Matrix2cd::Identity();
  if (p.shape == PmlShape::cartesian) {
    j(0, 0) = stretch(p, std::abs(dx) - p.half_width);
    j(1, 1) = stretch(p, std::abs(dy) - p.half_height);
    return j;
  }
  const double r = std::hypot(dx, dy);
  const double rho = r - p.inner_radius;
  if (rho <= 0.0) return j;
  const std::complex<double> s_r = stretch(p, rho);
  const std::complex<double> s_phi = (p.inner_radius + stretched_depth(p, rho)) / r;  // r̃/r
  const double c = dx / r, s = dy / r;
  // R diag(s_r, s_φ) Rᵀ with R = [c −s; s c]
  j(0, 0) = c * c * s_r + s * s * s_phi;
  j(1, 1) = s * s * s_r + c * c * s_phi;
  j(0, 1) = j(1, 0) = c * s * (s_r - s_phi);
  return j;
}

TensorMaterial stretched_material(const TensorMaterial& m, const Eigen::Matrix2cd& j_t) {
  const std::complex<double> det = j_t.determinant();
  const Eigen::Matrix2cd j_inv = j_t.inverse();
  TensorMaterial out = m;
  out.eps_t = det * j_inv * m.eps_t * j_inv.transpose();
  out.eps_zz = det * m.eps_zz;
  out.mu_t = det * j_inv * m.mu_t * j_inv.transpose();
  out.mu_zz = det * m.mu_zz;
  return out;
}

MaterialTensors<std::complex<double>> pml_tensors(const Pml& pml, const TensorMaterial& m,
                                                  const Eigen::Vector2d& x) {
  return material_tensors(stretched_material(m, pml_stretch_jacobian(pml, x)));
}

}  // namespace cladwise
