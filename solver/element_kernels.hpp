// Element kernels of the Lee–Sun–Cendes waveguide formulation (docs/formulation.md, eqs. 9–12):
// pure functions of the element geometry (3 straight or 6 isoparametric nodes), the material
// tensors of the element and a quadrature rule, returning fixed-size Eigen blocks. They see no
// global numbering, no mesh and no edge signs; solver/assembly.cpp scatters them.
//
// Templated on Scalar (double for lossless media, std::complex<double> for lossy media and PML);
// the geometry is always real. All products are bilinear (no conjugation): the PML problem is
// complex symmetric.
#pragma once

#include <Eigen/Core>
#include <Eigen/LU>

#include <cassert>
#include <complex>

#include "solver/lagrange_triangle.hpp"
#include "solver/material.hpp"
#include "solver/nedelec_triangle.hpp"
#include "solver/quadrature.hpp"

namespace cladwise {

/// Node coordinates (µm) of one triangle: 3 corners (straight) or 3 corners + 3 mid-edge nodes
/// (isoparametric, order-2 geometry), in the local order of mesh/mesh.hpp.
struct ElementGeometry {
  int n_nodes = 3;
  Eigen::Matrix<double, 2, 6> x = Eigen::Matrix<double, 2, 6>::Zero();
};

/// The geometry map x(ξ) at one reference point.
struct MappedPoint {
  Eigen::Vector2d x;         ///< physical point (µm)
  Eigen::Matrix2d jacobian;  ///< J_rc = ∂x_r/∂ξ_c
  Eigen::Matrix2d inv_jt;    ///< J⁻ᵀ, maps reference gradients and covariant vectors
  double det = 0.0;          ///< det J (> 0 for counter-clockwise, non-inverted elements)
};

inline MappedPoint map_point(const ElementGeometry& g, const Eigen::Vector2d& xi) {
  MappedPoint m;
  if (g.n_nodes == 6) {
    LagrangeTriangle<2>::Values l;
    LagrangeTriangle<2>::Gradients dl;
    LagrangeTriangle<2>::evaluate(xi, l, dl);
    m.x = g.x * l;
    m.jacobian = g.x * dl.transpose();
  } else {
    LagrangeTriangle<1>::Values l;
    LagrangeTriangle<1>::Gradients dl;
    LagrangeTriangle<1>::evaluate(xi, l, dl);
    m.x = g.x.leftCols<3>() * l;
    m.jacobian = g.x.leftCols<3>() * dl.transpose();
  }
  m.det = m.jacobian.determinant();
  m.inv_jt = m.jacobian.inverse().transpose();
  return m;
}

/// Physical Nédélec functions at a reference point: N_i = J⁻ᵀ N̂_i, ∇_t×N_i = (∇̂×N̂_i) / det J
/// (covariant Piola map; P. Monk, "Finite Element Methods for Maxwell's Equations", OUP 2003, §3.9).
template <int Order>
void edge_basis(const MappedPoint& m, const Eigen::Vector2d& xi,
                typename NedelecTriangle<Order>::Values& values,
                typename NedelecTriangle<Order>::Curls& curls) {
  NedelecTriangle<Order>::evaluate(xi, values, curls);
  values = m.inv_jt * values;
  curls /= m.det;
}

/// Physical Lagrange functions and gradients ∇_t L_i = J⁻ᵀ ∇̂L_i at a reference point.
template <int Order>
void nodal_basis(const MappedPoint& m, const Eigen::Vector2d& xi,
                 typename LagrangeTriangle<Order>::Values& values,
                 typename LagrangeTriangle<Order>::Gradients& grads) {
  LagrangeTriangle<Order>::evaluate(xi, values, grads);
  grads = m.inv_jt * grads;
}

/// Material tensors in the form the kernels use (docs/formulation.md eq. 8):
///   eps_t = diag(ε_xx, ε_yy), eps_zz;  nu_zz = 1/μ_zz multiplies the axial curl;
///   nu_t = diag(1/μ_yy, 1/μ_xx) multiplies the transverse curl after the 90° rotation
///   (∇×E)_t = −ẑ × (∇_t E_z + jβ E_t).
template <typename Scalar>
struct MaterialTensors {
  using Matrix2 = Eigen::Matrix<Scalar, 2, 2>;
  Matrix2 eps_t = Matrix2::Identity();
  Scalar eps_zz{1};
  Matrix2 nu_t = Matrix2::Identity();
  Scalar nu_zz{1};
};

template <typename Scalar>
MaterialTensors<Scalar> material_tensors(const BasicMaterial<Scalar>& m) {
  MaterialTensors<Scalar> t;
  t.eps_t << m.eps_xx, Scalar(0), Scalar(0), m.eps_yy;
  t.eps_zz = m.eps_zz;
  t.nu_t << m.mu_inv_yy, Scalar(0), Scalar(0), m.mu_inv_xx;
  t.nu_zz = m.mu_inv_zz;
  return t;
}

/// Tensors of a general (complex, full in-plane) medium, docs/formulation.md §8 eq. (L4):
/// ν_t = R⁻¹ μ_t⁻¹ R with R the 90° rotation (−ẑ×u), which is μ_tᵀ / det μ_t; ν_zz = 1/μ_zz.
/// For diagonal μ this is diag(1/μ_yy, 1/μ_xx), as in eq. 8.
inline MaterialTensors<std::complex<double>> material_tensors(const TensorMaterial& m) {
  MaterialTensors<std::complex<double>> t;
  t.eps_t = m.eps_t;
  t.eps_zz = m.eps_zz;
  t.nu_t = m.mu_t.transpose() / m.mu_t.determinant();
  t.nu_zz = 1.0 / m.mu_zz;
  return t;
}

/// Element blocks of  [A_tt 0; 0 0] x = −β² [B_tt B_tz; B_zt B_zz] x  (formulation.md eq. 9–12).
template <typename Scalar, int Order>
struct WaveguideElementMatrices {
  static constexpr int n_t = NedelecTriangle<Order>::n_functions;
  static constexpr int n_z = LagrangeTriangle<Order>::n_functions;
  Eigen::Matrix<Scalar, n_t, n_t> a_tt;
  Eigen::Matrix<Scalar, n_t, n_t> b_tt;
  Eigen::Matrix<Scalar, n_t, n_z> b_tz;  // B_zt = B_tzᵀ
  Eigen::Matrix<Scalar, n_z, n_z> b_zz;
};

/// Quadrature degree the solver uses for order-p elements: 2p + 2.
constexpr int kernel_quadrature_degree(int order) { return 2 * order + 2; }

/// Integrates the four blocks on one element with position-dependent tensors: `tensors_at(x)` is
/// called at every quadrature point x (µm) and returns the MaterialTensors there (or a reference
/// to them). This is the hook for media that vary inside an element: the complex stretching of a
/// PML (solver/pml.hpp) and the (1 + x/R) factors of a bend (solver/bend.hpp).
template <typename Scalar, int Order, typename TensorsAt>
WaveguideElementMatrices<Scalar, Order> waveguide_element_matrices_at(
    const ElementGeometry& geometry, TensorsAt&& tensors_at, double k0, const QuadratureRule& rule) {
  using Ned = NedelecTriangle<Order>;
  using Lag = LagrangeTriangle<Order>;
  WaveguideElementMatrices<Scalar, Order> em;
  em.a_tt.setZero();
  em.b_tt.setZero();
  em.b_tz.setZero();
  em.b_zz.setZero();
  const double k0_sq = k0 * k0;
  typename Ned::Values n;
  typename Ned::Curls curl;
  typename Lag::Values l;
  typename Lag::Gradients grad_l;
  for (int q = 0; q < rule.n_points(); ++q) {
    const Eigen::Vector2d& xi = rule.points[q];
    const MappedPoint m = map_point(geometry, xi);
    assert(m.det > 0.0 && "inverted or clockwise element");
    const MaterialTensors<Scalar>& mat = tensors_at(m.x);
    edge_basis<Order>(m, xi, n, curl);
    nodal_basis<Order>(m, xi, l, grad_l);
    const double dx = rule.weights[q] * m.det;  // dΩ = |J| dξ dη
    const auto nc = n.template cast<Scalar>();
    const auto gc = grad_l.template cast<Scalar>();
    const auto lc = l.template cast<Scalar>();
    // ν_zz (∇_t×N_i)(∇_t×N_j) − k0² N_i·ε_t N_j      (eq. 9; ε_t full 2×2, N in physical x, y)
    em.a_tt.noalias() += (Scalar(dx) * mat.nu_zz) * (curl.transpose() * curl).template cast<Scalar>();
    em.a_tt.noalias() -= Scalar(dx * k0_sq) * (nc.transpose() * (mat.eps_t * nc));
    // N_i·ν_t N_j                                      (eq. 10)
    const Eigen::Matrix<Scalar, 2, Ned::n_functions> nu_n = mat.nu_t * nc;
    em.b_tt.noalias() += Scalar(dx) * (nc.transpose() * nu_n);
    // N_i·ν_t ∇_t L_j  (ν_t symmetric for symmetric μ_t, so B_zt = B_tzᵀ)      (eq. 11)
    em.b_tz.noalias() += Scalar(dx) * (nu_n.transpose() * gc);
    // ∇_t L_i·ν_t ∇_t L_j − k0² ε_zz L_i L_j            (eq. 12)
    em.b_zz.noalias() += Scalar(dx) * (gc.transpose() * (mat.nu_t * gc));
    em.b_zz.noalias() -= (Scalar(dx * k0_sq) * mat.eps_zz) * (lc * lc.transpose());
  }
  return em;
}

/// Integrates the four blocks on one element with constant tensors. k0 in 1/µm, geometry in µm.
template <typename Scalar, int Order>
WaveguideElementMatrices<Scalar, Order> waveguide_element_matrices(
    const ElementGeometry& geometry, const MaterialTensors<Scalar>& mat, double k0,
    const QuadratureRule& rule) {
  return waveguide_element_matrices_at<Scalar, Order>(
      geometry, [&mat](const Eigen::Vector2d&) -> const MaterialTensors<Scalar>& { return mat; },
      k0, rule);
}

/// The permittivity-weighted mass blocks alone, the part of the pencil that carries k0:
///   T_tt = ∫ N_i·ε_t N_j dΩ,  T_zz = ∫ ε_zz L_i L_j dΩ,
/// so that A_tt = S_tt − k0² T_tt and B_zz = B_zz,0 − k0² T_zz (eqs. 9, 12). Used by the
/// group-index perturbation (solver/group_index.hpp) without the curl and gradient terms.
template <int Order>
struct PermittivityMassMatrices {
  static constexpr int n_t = NedelecTriangle<Order>::n_functions;
  static constexpr int n_z = LagrangeTriangle<Order>::n_functions;
  Eigen::Matrix<double, n_t, n_t> t_tt;
  Eigen::Matrix<double, n_z, n_z> t_zz;
};

template <int Order>
PermittivityMassMatrices<Order> permittivity_mass_matrices(const ElementGeometry& geometry,
                                                           const Eigen::Matrix2d& eps_t, double eps_zz,
                                                           const QuadratureRule& rule) {
  PermittivityMassMatrices<Order> m;
  m.t_tt.setZero();
  m.t_zz.setZero();
  typename NedelecTriangle<Order>::Values n;
  typename NedelecTriangle<Order>::Curls curl;
  typename LagrangeTriangle<Order>::Values l;
  typename LagrangeTriangle<Order>::Gradients grad_l;
  for (int q = 0; q < rule.n_points(); ++q) {
    const Eigen::Vector2d& xi = rule.points[q];
    const MappedPoint mp = map_point(geometry, xi);
    edge_basis<Order>(mp, xi, n, curl);
    LagrangeTriangle<Order>::evaluate(xi, l, grad_l);
    const double dx = rule.weights[q] * mp.det;
    m.t_tt.noalias() += dx * (n.transpose() * (eps_t * n));
    m.t_zz.noalias() += (dx * eps_zz) * (l * l.transpose());
  }
  return m;
}

}  // namespace cladwise
