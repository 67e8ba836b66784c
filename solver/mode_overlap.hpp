// Overlap of two guided modes of two cross-sections (two meshes): the butt-coupling (splice)
// efficiency of a mode 1 launched into a mode 2 across a junction, with mode 2 offset laterally
// by (dx, dy) and tilted by a small angle.
//
// Symmetric overlap of modes normalised to power P_i = ½ Re ∫ (E_i × H_i*)·ẑ dA:
//   c = ¼ ∫ (E1 × H2* + E2* × H1)·ẑ dA / sqrt(P1 P2),   η = |c|²,   loss = −10 log10 η (dB)
// (mode-matching at a junction of weakly reflecting guides; A. W. Snyder & J. D. Love, "Optical
// Waveguide Theory", ch. 31 and D. Marcuse, "Theory of Dielectric Optical Waveguides", 2nd ed.,
// ch. 3 — from memory). c = 1 for a mode with itself. Reflection at the junction is neglected.
//
// Offset and tilt: mode 2 is centred at (dx, dy) in the frame of mode 1, E2(x) → E2(x − d), and a
// tilt θ of guide 2 about the y axis (in the x–z plane) multiplies its field by the linear phase
// exp(−j k0 n sinθ x) (paraxial, small θ; n the index of the medium at the junction). The
// integral runs over the quadrature points of mesh 1; mode 2 is evaluated there by point
// location on mesh 2 (MeshLocator) and is zero outside mesh 2.
#pragma once

#include "solver/dof_map.hpp"
#include "solver/mesh_locator.hpp"
#include "solver/mode.hpp"
#include "solver/mode_fields.hpp"
#include "solver/mode_solver.hpp"

namespace cladwise {

/// One side of a junction: the mode, where it was solved, and a locator on its mesh.
struct JunctionSide {
  const ModeProblem* problem = nullptr;
  const DofMap* dofs = nullptr;
  const Mode* mode = nullptr;
};

struct JunctionAlignment {
  double offset_x_um = 0.0;  ///< lateral offset of guide 2 relative to guide 1 (µm)
  double offset_y_um = 0.0;
  double tilt_deg = 0.0;     ///< tilt of guide 2 about the y axis (deg)
  double medium_index = 1.0; ///< index n of the tilt phase exp(−j k0 n sinθ x) (e.g. the cladding)
};

struct CouplingResult {
  std::complex<double> amplitude{0.0};  ///< c
  double efficiency = 0.0;              ///< η = |c|²
  double loss_db = 0.0;                 ///< −10 log10 η (dB)
};

/// Butt-coupling efficiency from mode 1 into mode 2. Both must be at the same wavelength
/// (InputError otherwise). `locator2` must be a locator on side 2's mesh.
CouplingResult butt_coupling(const JunctionSide& side1, const JunctionSide& side2,
                             const MeshLocator& locator2, const JunctionAlignment& alignment = {});

/// Same with ready-made evaluators (e.g. when sweeping offsets).
CouplingResult butt_coupling(const ModeFieldEvaluator& fields1, const Mesh& mesh1, int order1,
                             const ModeFieldEvaluator& fields2, const Mesh& mesh2, int order2,
                             const MeshLocator& locator2, double wavelength_um,
                             const JunctionAlignment& alignment = {});

}  // namespace cladwise
