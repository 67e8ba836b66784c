// From a case and its mesh to computed modes: builds the ModeProblem (materials per region,
// walls per boundary), runs the ModeSolver, and evaluates each mode's normalised fields.
// Shared by `solve` and `verify`.
#pragma once

#include <string>
#include <utility>
#include <vector>

#include "io/case_file.hpp"
#include "io/vtk_export.hpp"
#include "mesh/mesh.hpp"
#include "solver/mode.hpp"
#include "solver/mode_fields.hpp"
#include "solver/mode_solver.hpp"

namespace cladwise::io {

class Progress;

struct SolvedMode {
  Mode mode;
  std::string label;
  std::vector<std::pair<std::string, double>> metrics;
  NodalFields fields;  ///< normalised to 1 W, at mesh nodes
};

struct CaseSolution {
  std::vector<SolvedMode> modes;  ///< descending n_eff
  SolveTiming timing;
  int n_dofs = 0;
  EigenStatus status = EigenStatus::converged;
};

/// The solver's problem for a case on a mesh. Throws InputError for what the solver cannot do
/// yet (e.g. a PML shell) or a material the mesh names but the case lacks.
ModeProblem mode_problem(const CaseSpec& c, const Mesh& mesh);

/// Solves the case; throws ComputationError (exit 1) when no mode converges or none is found.
CaseSolution solve_case(const CaseSpec& c, const Mesh& mesh, Progress* progress = nullptr);

/// Point data E_re, E_im, H_re, H_im (3 components), E_abs2, S_z and cell data index.
std::vector<VtkArray> mode_field_arrays(const CaseSpec& c, const Mesh& mesh, const SolvedMode& m);

}  // namespace cladwise::io
