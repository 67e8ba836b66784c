// Physical mode fields E, H of a leaky or lossy mode (LeakyMode of a LeakyModeProblem), normalised
// to 1 W of z-directed power in the physical domain, with a fixed global phase.
//
// The complex counterpart of solver/mode_fields.hpp, with the same unknown scaling of Lee, Sun &
// Cendes (docs/formulation.md §6), now with complex β:
//   E_t = e_t / β,  E_z = j e_z,
//   (∇×E)_x = j(∂_y e_z + e_y),  (∇×E)_y = −j(∂_x e_z + e_x),  (∇×E)_z = (∇_t × e_t)/β,
// and Faraday's law −jωμ0 μ H = ∇×E with the full complex tensor of the region at the point,
//   H_t = j μ_t⁻¹ (∇×E)_t / (k0 Z0),  H_z = j (∇×E)_z / (μ_zz k0 Z0),
// where μ is the medium the solver assembled: bend factors (solver/bend.hpp, eq. L3) and, in the
// PML regions, the stretched μ' = det J J⁻¹ μ J⁻ᵀ (solver/pml.hpp, eq. L1).
//
// @warning Inside the PML the values are those of the stretched (complex-coordinate) problem: they
// are not physical fields and carry no physical power. Only the physical regions are meaningful;
// the normalisation and the phase reference use them alone.
//
// Normalisation: ½ Re ∫_physical (E × H*)·ẑ dA = 1 W, area in m² (1 µm² = 1e-12 m²), by element
// quadrature (degree 2p + 2, as the kernels) of the exact element fields over the triangles of
// RegionRole::physical regions. For a lossy mode the power decays along z as exp(2 Im β z); the
// normalisation holds in the plane z = 0.
//
// Global phase: an eigenvector is defined up to a complex factor. We take the quadrature point of
// the physical domain where S_z = ½ Re (E × H*)·ẑ is largest (the power peak) and choose the phase
// that makes the larger in magnitude of E_x, E_y there real and positive. For a lossless mode the
// whole E_t is then real and E_z imaginary, as on the real path (solver/mode_fields.hpp), up to
// the sign, which the real path leaves to the eigenvector.
//
// Bends (exact transformation, Shyroki 2008): the solver works in the coordinates (u, v, s) with
// scale factors (1, 1, h), h = 1 + u/R, and returns the fields of that frame, i.e. the covariant
// components E'_i = h_i Ê_i of the physical components Ê. So E_x, E_y, H_x, H_y are the physical
// transverse components in the cross-section plane, while E_z = h Ê_s and H_z = h Ĥ_s (divide by
// h for the physical axial components). S_z uses transverse components only, so it is the
// physical power density through the cross-section plane, and the 1 W normalisation is the
// physical power through it. As R → ∞, h → 1 and everything reduces to the straight guide.
// (For the conformal-index option there is no such relation: its fields are those of the scalar
// model's equivalent straight guide.)
//
// Nodal values: element values at the mesh node averaged over the elements sharing it, as in
// mode_fields.hpp (a mean of one-sided limits at a material interface).
#pragma once

#include <Eigen/Core>

#include <complex>
#include <optional>
#include <vector>

#include "mesh/mesh.hpp"
#include "solver/complex_mode_solver.hpp"
#include "solver/dof_map.hpp"
#include "solver/mode_fields.hpp"

namespace cladwise {

class LeakyModeFieldEvaluator {
public:
  /// Computes the 1 W normalisation over the physical regions and the phase reference. The
  /// problem, DofMap and mode must outlive the evaluator, and the DofMap must be the one the mode
  /// was solved on (InputError otherwise). Throws ComputationError if the mode carries no forward
  /// power in the physical domain.
  LeakyModeFieldEvaluator(const LeakyModeProblem& problem, const DofMap& dofs, const LeakyMode& mode);
  /// The same for a mode returned by `solver` (its validated problem and DofMap). The solver must
  /// outlive the evaluator and keep its wavelength, materials and PML while it is used.
  LeakyModeFieldEvaluator(const ComplexModeSolver& solver, const LeakyMode& mode);

  /// Normalised fields inside triangle t at reference coordinates (ξ, η).
  FieldSample at_reference(int t, const Eigen::Vector2d& xi) const;
  /// Normalised fields at a physical point (µm) of triangle t; nullopt if x is not in it.
  std::optional<FieldSample> at_point(int t, const Point2& x) const;
  /// Element-averaged values at every mesh node (PML nodes included; see the warning above).
  NodalFields at_nodes() const;

  /// ½ Re ∫_physical (E × H*)·ẑ dA of the fields before normalisation, E_t = e_t/β (W).
  double raw_power_w() const { return raw_power_w_; }
  /// ½ Re ∫ (E × H*)·ẑ dA of the normalised fields over the PML regions (W; 0 without a PML).
  /// Not a physical power: a diagnostic of how much of the stretched field the layer holds.
  double pml_power_w() const { return pml_power_w_; }
  /// Complex factor applied to the raw fields: phase / sqrt(raw_power_w()).
  std::complex<double> scale() const { return scale_; }
  /// Triangle and reference point of the power peak used as the phase reference.
  int peak_triangle() const { return peak_triangle_; }
  const Eigen::Vector2d& peak_reference_point() const { return peak_xi_; }

private:
  const LeakyModeProblem* problem_;
  const DofMap* dofs_;
  const LeakyMode* mode_;
  double k0_;
  double raw_power_w_ = 0.0;
  double pml_power_w_ = 0.0;
  std::complex<double> scale_{1.0, 0.0};
  int peak_triangle_ = -1;
  Eigen::Vector2d peak_xi_{0.0, 0.0};
  FieldSample raw_at(int t, const Eigen::Vector2d& xi) const;
};

}  // namespace cladwise
