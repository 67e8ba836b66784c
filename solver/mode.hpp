// Mode: one guided eigenmode of a waveguide cross-section as produced by the FEM mode solver.
// Units (docs/conventions.md): β in 1/µm, n_eff = β/k0 (dimensionless).
#pragma once

#include <Eigen/Core>

namespace cladwise {

struct Mode {
  double beta = 0.0;         ///< propagation constant β (1/µm), fields ∝ exp(j(ωt − βz))
  double n_eff = 0.0;        ///< effective index β/k0
  double residual = 0.0;     ///< ‖Ax − λBx‖ / (‖A‖₁ ‖x‖₂) of the eigenpair, λ = −β²
  /// Eigenvector on the free DOFs of the solver's DofMap, in the scaled unknowns of Lee, Sun &
  /// Cendes (1991): first the edge block e_t = β E_t, then the nodal block e_z = −j E_z (real for
  /// lossless guides). Its scale is arbitrary; mode_fields.hpp normalises the physical fields.
  Eigen::VectorXd eigenvector;
};

}  // namespace cladwise
