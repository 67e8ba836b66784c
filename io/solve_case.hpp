// From a case and its mesh to computed modes: builds the ModeProblem (materials per region,
// walls per boundary), runs the ModeSolver, and evaluates each mode's normalised fields.
// Shared by `solve` and `verify`.
#pragma once

#include <Eigen/SparseCore>
#include <memory>
#include <optional>
#include <string>
#include <utility>
#include <vector>

#include "io/case_file.hpp"
#include "io/results.hpp"
#include "io/vtk_export.hpp"
#include "mesh/mesh.hpp"
#include "solver/mode.hpp"
#include "solver/mode_fields.hpp"
#include "solver/complex_mode_solver.hpp"
#include "solver/mode_solver.hpp"

namespace cladwise::io {

class Progress;

struct SolvedMode {
  Mode mode;                 ///< real parts: n_eff = Re n_eff, beta = Re β; eigenvector only for lossless modes
  Eigen::VectorXcd complex_eigenvector;  ///< complex-solver modes: the eigenvector (sweep tracking)
  double n_eff_imag = 0;     ///< |Im n_eff| (docs/conventions.md)
  double loss_db_per_m = 0;
  std::string label;
  std::vector<std::pair<std::string, double>> metrics;
  std::optional<NodalFields> fields;  ///< normalised to 1 W, at mesh nodes (none: not available)
  std::vector<std::string> warnings;  ///< e.g. a loss below what the PML and mesh resolve
};

struct CaseSolution {
  double wavelength_um = 0;
  std::vector<SolvedMode> modes;  ///< descending n_eff
  /// The wavelength-independent Gram matrix of the edge functions (∫ μ⁻¹ N_i·N_j on lossless
  /// points, ∫ N_i·N_j on complex-solver points), for mode tracking by transverse-field overlap.
  Eigen::SparseMatrix<double> transverse_gram;
  std::vector<CorePairRow> core_pairs;  ///< neighbouring core pairs of a multicore case
  SolveTiming timing;
  int n_dofs = 0;
  EigenStatus status = EigenStatus::converged;
};

/// True when the case needs the complex solver: a PML shell, a lossy, metallic or rotated
/// material, or a bend.
bool needs_complex_solver(const CaseSpec& c, const Mesh& mesh);

/// The real solver's problem for a lossless case on a mesh.
ModeProblem mode_problem(const CaseSpec& c, const Mesh& mesh);
/// The complex solver's problem (PML, bend, complex and tensor materials).
LeakyModeProblem leaky_mode_problem(const CaseSpec& c, const Mesh& mesh);

/// The real solver of a lossless case and its raw result (modes sorted by descending n_eff);
/// throws ComputationError when none converges or none is found.
struct LosslessSolve {
  std::unique_ptr<ModeSolver> solver;
  SolveResult result;
};
LosslessSolve run_lossless_solver(const CaseSpec& c, const Mesh& mesh, Progress* progress = nullptr);

/// Solves the case; throws ComputationError (exit 1) when no mode converges or none is found.
CaseSolution solve_case(const CaseSpec& c, const Mesh& mesh, Progress* progress = nullptr);

/// Solves the case at every wavelength of c.wavelengths_um on one mesh and one solver.
std::vector<CaseSolution> solve_sweep(const CaseSpec& c, const Mesh& mesh, Progress* progress = nullptr);

/// Cell data "material" (position of the region's material in the case's [materials], in file
/// order) and "index" (its largest refractive index at the case's wavelength).
std::vector<VtkArray> mesh_cell_arrays(const CaseSpec& c, const Mesh& mesh);

/// Point data E_re, E_im, H_re, H_im (3 components), E_abs, H_abs, E_abs2, S_z and cell data
/// material and index (last).
std::vector<VtkArray> mode_field_arrays(const CaseSpec& c, const Mesh& mesh, const SolvedMode& m);

}  // namespace cladwise::io
