// Mode labels a fibre designer reads: the azimuthal order ν from a Fourier analysis of the
// transverse field on circles about the core centre, the radial order m from the sign changes of
// the matching harmonic along a radius, and the vector family.
//
// Near-circular guides (the caller gives the centre and the core radius): with cylindrical
// components E_r = A(r) cos(νφ + ψ), E_φ = B(r) sin(νφ + ψ) on circles inside the core,
//   ν = 0: TE0m if E_φ carries the uniform harmonic, TM0m if E_r does;
//   ν ≥ 1: HEνm if A·B < 0, EHνm if A·B > 0. In the exact core fields (Snyder & Love, "Optical
//          Waveguide Theory", Table 12-3) A ∝ −(a1 J_{ν−1} + a2 J_{ν+1}), B ∝ (a1 J_{ν−1} − a2 J_{ν+1})
//          and HE modes are dominated by a1 (the J_{ν−1} part), EH modes by a2, so the sign of A·B
//          is the family; in the weakly guiding limit HEν is the LP_{ν−1} field x̂cos − ŷsin and EHν
//          the LP_{ν+1} field x̂cos + ŷsin.
//   m: 1 + sign changes for 0 < r < a of A − B (∝ J_{ν−1}, HE), A + B (∝ J_{ν+1}, EH), B (TE) or A
//      (TM), i.e. the zeros of the LP radial function inside the core.
//   LP group: HEνm → LP(ν−1)m, EHνm → LP(ν+1)m, TE0m/TM0m → LP1m (Snyder & Love Table 14-1).
// Other guides: the polarisation (principal axis of E_t, nearer x or y) and the LP-like order of the
// principal component about the power centroid: "x-pol fundamental", "y-pol LP11-like", ...
#pragma once

#include <optional>
#include <string>

#include "mesh/mesh.hpp"
#include "solver/dof_map.hpp"
#include "solver/mesh_locator.hpp"
#include "solver/mode_metrics.hpp"
#include "solver/mode.hpp"
#include "solver/mode_fields.hpp"
#include "solver/mode_solver.hpp"
#include "solver/step_index.hpp"

namespace cladwise {

struct LabelOptions {
  /// Centre and core radius of a near-circular core (µm). Without them only the
  /// polarisation-plus-order label is made, about the power centroid.
  std::optional<Point2> centre;
  double core_radius_um = 0.0;
  int n_angles = 64;  ///< samples per circle (resolves harmonics up to n_angles/2)
  /// This mode's sample_mode() output (with or without gradients), reused if given.
  const std::vector<FieldQuadraturePoint>* samples = nullptr;
};

struct ModeLabel {
  std::string label;          ///< vector label ("HE11", "TE01") when circular, else generic_label
  std::string lp_label;       ///< LP group ("LP01", "LP11"); empty when not circular
  std::string generic_label;  ///< "x-pol fundamental", "y-pol LP11-like", ...
  ModeFamily family = ModeFamily::LP;  ///< TE, TM, HE, EH when circular; LP otherwise
  int azimuthal_order = 0;    ///< ν (circular) or the LP-like l (generic)
  int radial_order = 0;       ///< m
  char polarisation = 'x';    ///< principal axis of E_t nearer x or y
  /// Share of the dominant harmonic in the sampled transverse field (1 for a clean mode; low
  /// values flag mixtures of nearly degenerate modes).
  double harmonic_purity = 0.0;
};

/// Label of one mode from its fields; `locator` must be on the mode's mesh.
ModeLabel label_mode(const ModeFieldEvaluator& fields, const MeshLocator& locator,
                     const LabelOptions& options);
/// Convenience: builds the evaluator and a locator.
ModeLabel label_mode(const ModeProblem& problem, const DofMap& dofs, const Mode& mode,
                     const LabelOptions& options);

}  // namespace cladwise
