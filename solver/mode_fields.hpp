// Physical mode fields E, H of a computed Mode, normalised to 1 W of z-directed power.
//
// From the scaled unknowns of Lee, Sun & Cendes (docs/formulation.md §6):
//   E_t = e_t / β,  E_z = j e_z,  and Faraday's law with ∂/∂z → −jβ:
//   −jωμ0 μ_r H = ∇×E,  (∇×E)_x = j(∂_y e_z + e_y),  (∇×E)_y = −j(∂_x e_z + e_x),
//   (∇×E)_z = (∇_t × e_t)/β.
// ωμ0 = k0 Z0, and the ratio ∇/k0 is the same in 1/µm or 1/m, so H = j μ_r⁻¹(∇×E)/(k0 Z0) holds
// with both in 1/µm. The power ½ Re ∫ (E × H*)·ẑ dA uses dA in m² (1 µm² = 1e-12 m²), so the
// normalised fields depend on the physical size of the cross-section (docs/conventions.md).
//
// Nodal values: each element evaluates its own fields at the mesh node, and the node takes the
// arithmetic mean over the elements that share it. E_t is tangentially but not normally
// continuous, so at a material interface the nodal value is the mean of the two one-sided
// limits; use at_reference()/at_point() inside one element for one-sided values.
#pragma once

#include <Eigen/Core>

#include <complex>
#include <optional>
#include <vector>

#include "mesh/mesh.hpp"
#include "solver/dof_map.hpp"
#include "solver/element_kernels.hpp"
#include "solver/mode.hpp"
#include "solver/mode_solver.hpp"

namespace cladwise {

/// Characteristic impedance of vacuum Z0 = μ0 c (CODATA 2018: 376.730 313 668 Ω).
inline constexpr double vacuum_impedance_ohm = 376.730313668;

struct FieldSample {
  Eigen::Vector3cd e;  ///< E (V/m), components x, y, z
  Eigen::Vector3cd h;  ///< H (A/m)
  /// ½ Re (E × H*)·ẑ (W/m²)
  double s_z() const { return 0.5 * (e.x() * std::conj(h.y()) - e.y() * std::conj(h.x())).real(); }
};

struct NodalFields {
  std::vector<Eigen::Vector3cd> e;  ///< per mesh node (V/m)
  std::vector<Eigen::Vector3cd> h;  ///< per mesh node (A/m)
  std::vector<double> s_z;          ///< ½ Re (E × H*)·ẑ at each node (W/m²)
};

class ModeFieldEvaluator {
public:
  /// Computes the 1 W normalisation by quadrature of the exact element fields. Throws
  /// ComputationError if the mode carries no forward power (not a guided forward mode).
  ModeFieldEvaluator(const ModeProblem& problem, const DofMap& dofs, const Mode& mode);

  /// Normalised fields inside triangle t at reference coordinates (ξ, η).
  FieldSample at_reference(int t, const Eigen::Vector2d& xi) const;
  /// at_reference() at n points of one triangle: the element's geometry and coefficients are
  /// gathered once (the way to sample many points per element, e.g. quadrature rules).
  void at_reference(int t, const Eigen::Vector2d* xi, int n, FieldSample* out) const;
  /// The transverse electric field alone (E_x, E_y) at n points of one triangle: the cheap
  /// evaluation for difference stencils of ∇E_t.
  void transverse_e_at(int t, const Eigen::Vector2d* xi, int n, Eigen::Vector2cd* out) const;
  /// Normalised fields at a physical point (µm) of triangle t; nullopt if x is not in it.
  std::optional<FieldSample> at_point(int t, const Point2& x) const;
  /// Element-averaged values at every mesh node.
  NodalFields at_nodes() const;

  /// ½ Re ∫ (E × H*)·ẑ dA of the fields before normalisation, with E_t = e_t/β (W).
  double raw_power_w() const { return raw_power_w_; }
  /// Factor applied to the raw fields (V/m per raw unit).
  double scale() const { return scale_; }

private:
  const ModeProblem* problem_;
  const DofMap* dofs_;
  const Mode* mode_;
  double k0_;
  double raw_power_w_ = 0.0;
  double scale_ = 1.0;
  FieldSample raw_at(int t, const Eigen::Vector2d& xi) const;
  /// Fields at points of triangle t from its geometry g and local coefficients c; m: the map at xi.
  FieldSample raw_from(int t, const MappedPoint& m, const Eigen::Vector2d& xi, const double* c) const;
};

}  // namespace cladwise
