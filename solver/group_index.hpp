// Group index of a lossless guided mode from one solve: the derivative of the discrete eigenvalue
// with respect to k0 = ω/c by first-order perturbation of the pencil, with the dispersion of the
// materials included.
//
// The pencil of docs/formulation.md eq. 13 depends on k0 only through the ε-mass terms:
//   A(k0) = S − k0² T_A[ε],   B(k0) = B_0 − k0² T_B[ε_zz]
// (S the curl–curl block, B_0 the k0-free part of B, T_A and T_B the ε-weighted mass matrices).
// Differentiating A x = λ B x, λ = −β², and multiplying by the (real, symmetric) eigenvector x:
//   dλ/dk0 = xᵀ (A' − λ B') x / xᵀ B x,
//   A' = −2k0 T_A[ε] − k0² T_A[dε/dk0],   B' = −2k0 T_B[ε_zz] − k0² T_B[dε_zz/dk0],
// and n_g = dβ/dk0 = −(dλ/dk0) / (2β). For a discrete eigenpair this is the exact derivative of
// the discrete eigenvalue (Hellmann–Feynman; the eigenvector's own derivative drops out because
// the pencil is symmetric). With dε/dλ of the materials, dε/dk0 = −(λ/k0) dε/dλ.
#pragma once

#include <array>
#include <vector>

#include "solver/mode.hpp"
#include "solver/mode_solver.hpp"

namespace cladwise {

/// n_g = dβ/dk0 of `mode` (solved by `solver` at its present wavelength). `deps_dk0[r]` is the
/// derivative (µm) of region r's diagonal relative permittivity (xx, yy, zz) with respect to k0;
/// empty: non-dispersive materials.
double group_index(const ModeSolver& solver, const Mode& mode,
                   const std::vector<std::array<double, 3>>& deps_dk0 = {});

/// group_index() of several modes of the same solve in one pass over the elements (the element
/// blocks are computed once and applied to every eigenvector; no global matrix is assembled).
std::vector<double> group_indices(const ModeSolver& solver, const std::vector<Mode>& modes,
                                  const std::vector<std::array<double, 3>>& deps_dk0 = {});

/// dε/dk0 (µm) of a permittivity ε = n² from n and dn/dλ at vacuum wavelength λ (µm):
/// dε/dk0 = 2n · dn/dλ · dλ/dk0 with dλ/dk0 = −λ²/(2π).
double permittivity_derivative_dk0(double n, double dn_dlambda_per_um, double wavelength_um);

/// Chromatic dispersion D = (1/c) dn_g/dλ in ps/(nm·km) from dn_g/dλ in 1/µm.
double dispersion_from_group_index_slope(double dng_dlambda_per_um);

}  // namespace cladwise
