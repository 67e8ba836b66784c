// Cutoff wavelength of a chosen guided mode: the vacuum wavelength λ_c at which its effective
// index meets the background (cladding) index, n_eff(λ_c) = n_clad(λ_c), found by a bracketing
// search on f(λ) = n_eff(λ) − n_clad(λ) of the tracked mode, not by a fine sweep:
//   1. solve at the start wavelength, where the mode (chosen by its index in descending n_eff)
//      is guided, f > 0;
//   2. step towards longer wavelengths, each new step aimed past the secant prediction of the
//      zero of f, until f < 0 (a bracket);
//   3. Brent's method on the bracket (solver/scalar_root.hpp; Brent 1973, ch. 4).
// Every solve reuses one ModeSolver (mesh, DOF map and sparsity analysis made once; the materials
// are replaced at each wavelength). The mode is followed from solve to solve by the overlap of its
// transverse unknowns, |x_iᵀ G y_j| / (‖x_i‖_G ‖y_j‖_G), G = the transverse block of B
// (∫ μ⁻¹ N_i·N_j dA, independent of the wavelength), against the mode at the nearest wavelength
// solved so far, as io/sweep.cpp tracks modes along a sweep.
//
// @warning The cross-section is closed by a wall, so it has no continuum: past cutoff the mode
// continues smoothly below the cladding index as a mode of the walled structure, which is what
// makes f a smooth function with a simple zero. The λ_c found is therefore the cutoff of the
// WALLED structure. It tends to the open-cladding cutoff as the wall recedes, slowly for modes whose
// field at cutoff decays only algebraically: for TE0m of a step-index fibre in an electric wall of
// radius R, V_c ≈ j_{0,m}(1 + 2(a/R)²/j_{0,m}²) (solver/step_index.hpp,
// te_cutoff_v_with_electric_wall; docs/step-index.md).
#pragma once

#include <functional>
#include <limits>
#include <string_view>
#include <vector>

#include "solver/mode_solver.hpp"

namespace cladwise {

/// The problem at one vacuum wavelength (µm): same mesh, order, walls and region order at every
/// wavelength; only the wavelength and the (dispersive) materials change.
using ModeProblemAtWavelength = std::function<ModeProblem(double wavelength_um)>;

struct CutoffSearchRequest {
  double start_wavelength_um = 0.0;  ///< the mode is guided here (n_eff above the background)
  double max_wavelength_um = 0.0;    ///< search no further (> start)
  int mode_index = 1;                ///< 0-based position in descending n_eff at the start
  std::function<double(double)> background_index;  ///< n_clad(λ), the index the mode meets
  double first_step_um = 0.0;        ///< first step from the start; 0: (max − start)/4
  double wavelength_tolerance_um = 1e-5;  ///< Brent's x tolerance on λ_c
  int n_modes = 0;                   ///< modes per solve (from the top); 0: mode_index + 6
  int max_solves = 30;               ///< give up (status max_solves_reached) beyond this
  double min_overlap = 0.5;          ///< a match below it is a lost track
};

enum class CutoffStatus {
  found,                 ///< λ_c bracketed and refined to the tolerance
  not_guided_at_start,   ///< f(start) <= 0, or fewer modes than mode_index + 1
  not_bracketed,         ///< f > 0 up to max_wavelength_um: the cutoff lies further out
  lost_track,            ///< no mode at a new wavelength overlaps the followed one enough
  solve_failed,          ///< an eigensolve did not converge (status of the ModeSolver)
  max_solves_reached,
};

std::string_view to_string(CutoffStatus s);

/// One solve of the search, in the order made.
struct CutoffSample {
  double wavelength_um = 0.0;
  double n_eff = 0.0;           ///< of the followed mode
  double background_index = 0.0;
  double overlap = 1.0;         ///< with the mode at the nearest wavelength solved before
  int mode_position = 0;        ///< its 0-based position among the modes of this solve
};

struct CutoffSearchResult {
  CutoffStatus status = CutoffStatus::found;
  double cutoff_wavelength_um = std::numeric_limits<double>::quiet_NaN();
  int n_solves = 0;
  std::vector<CutoffSample> samples;
};

/// Searches the cutoff wavelength of request.mode_index (see the file header). Throws InputError
/// for an invalid request (no background index, max <= start, negative index or tolerance);
/// numerical outcomes are CutoffStatus values.
CutoffSearchResult find_cutoff_wavelength(const ModeProblemAtWavelength& problem,
                                          const CutoffSearchRequest& request);

}  // namespace cladwise
