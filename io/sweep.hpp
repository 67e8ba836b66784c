// Wavelength sweeps: modes tracked from point to point by the overlap of their transverse fields,
// so that "track 2" is the same physical mode across the band even where two modes cross; and the
// chromatic dispersion D = (1/c) dn_g/dλ and its slope S = dD/dλ of every tracked mode from the
// group indices of neighbouring points (3-point differences on the possibly uneven grid), with
// the zero-dispersion wavelengths where D changes sign. Also the cutoff wavelength of a chosen
// mode of a case (solver/cutoff_search.hpp on the case's own mesh, walls and dispersive materials).
#pragma once

#include <string>
#include <vector>

#include "io/solve_case.hpp"
#include "solver/cutoff_search.hpp"

namespace cladwise::io {

/// track[p][m]: the track number (from 1) of mode m at point p. Modes of consecutive points are
/// paired greedily by the largest normalised overlap |x_iᵀ G y_j| of their transverse unknowns
/// (G the wavelength-independent transverse block of B); an unpaired mode opens a new track.
/// Points without eigenvectors (complex solves) are paired by nearest n_eff.
std::vector<std::vector<int>> track_modes(const std::vector<CaseSolution>& points);

struct ZeroDispersion {
  int track = 0;
  double wavelength_um = 0;  ///< where the interpolated D crosses zero
  double slope_ps_per_nm2_km = 0;
};

/// Adds "track", "dispersion_ps_per_nm_km" and "dispersion_slope_ps_per_nm2_km" to the mode
/// metrics where a 3-point stencil exists, and returns the zero crossings of D (linear
/// interpolation of D between neighbouring points of a track).
std::vector<ZeroDispersion> add_dispersion(std::vector<CaseSolution>& points,
                                           const std::vector<std::vector<int>>& tracks);

/// The sweep table: one row per (wavelength, tracked mode).
std::string sweep_csv(const std::vector<CaseSolution>& points, const std::vector<std::vector<int>>& tracks);

/// The cutoff wavelength of mode `mode_index` (0-based, descending n_eff at `start_um`, where it
/// must be guided) of a lossless case: where its n_eff meets the index of the case's background
/// material, searched up to `max_um` (find_cutoff_wavelength: a bracketing search with the mode
/// tracked by transverse-field overlap). The result is the cutoff of the walled cross-section
/// (solver/cutoff_search.hpp). Throws InputError for a case that needs the complex solver (PML,
/// loss, bend) or takes its geometry from a file (no background material), naming the case.
CutoffSearchResult case_cutoff(const CaseSpec& c, const Mesh& mesh, int mode_index, double start_um, double max_um);

}  // namespace cladwise::io
