// ModeSolver: guided modes of a waveguide cross-section from the Lee–Sun–Cendes pencil
//   A x = λ B x,  λ = −β²   (docs/formulation.md eq. 13)
// by shift-invert Arnoldi (Spectra::GenEigsSolver) on our own operator op(x) = (A − σB)⁻¹ B x,
// σ = −(k0 n_target)², with one sparse LU (UMFPACK) of A − σB per shift and wavelength.
//
// Why not Spectra's symmetric generalised shift-invert: A and B are symmetric but both indefinite
// (B_zz carries −k0² ε_zz), and that mode needs B positive definite. The non-symmetric Arnoldi
// solver makes no such assumption; for lossless media the Ritz values come out real up to
// rounding, and eigenvalues are refined by the Rayleigh quotient of the (real) Ritz vector.
//
// Lifecycle: ModeSolver(problem) builds the DofMap; assemble() builds A, B (called by solve() if
// needed); solve(request) factorises (analyzePattern once per mesh, factorize per shift or
// wavelength) and runs Arnoldi. set_wavelength() reassembles on the same pattern.
#pragma once

#include <Eigen/SparseCore>

#include <functional>
#include <memory>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "mesh/mesh.hpp"
#include "solver/assembly.hpp"
#include "solver/dof_map.hpp"
#include "solver/material.hpp"
#include "solver/mode.hpp"

namespace cladwise {

struct ModeProblem {
  const Mesh* mesh = nullptr;              ///< must outlive the solver; build_topology() done
  std::vector<Material> region_materials;  ///< index = mesh region
  double wavelength_um = 0.0;              ///< vacuum wavelength (µm)
  int order = 1;                           ///< element order p: 1 or 2 (docs/conventions.md)
  std::vector<WallType> boundary_walls;    ///< index = mesh boundary
};

struct SolveRequest {
  int n_modes = 2;                      ///< modes wanted nearest the target (ignored if all_guided)
  std::optional<double> n_target;       ///< shift n_eff; default: largest material index
  bool all_guided = false;              ///< every mode with n_lower_bound < n_eff ≤ n_max
  std::optional<double> n_lower_bound;  ///< default: smallest material index, or 0 if uniform
  double residual_tolerance = 1e-8;     ///< a mode above it makes the status residual_too_large
  double imag_tolerance = 1e-6;         ///< |Im θ|/|θ| above it: complex pair, not a guided mode
  double degeneracy_tolerance = 1e-6;   ///< relative n_eff gap under which two modes form a pair
  int max_eigenvalues = 400;            ///< cap of the widening search
  /// Spectra's convergence test on θ (relative Ritz residual estimate). 1e-9 suffices: the
  /// eigenvalue is then polished by the Rayleigh quotient (error ~ square of the vector error)
  /// and every mode is checked against A and B by its residual.
  double arnoldi_tolerance = 1e-9;
  /// Arnoldi subspace size ncv; 0: automatic, max(2 nev + 1, nev + 20).
  int krylov_dimension = 0;
  int max_restarts = 1000;              ///< implicit restarts before not_converged
  /// Warm start: eigenvectors of a nearby solve on the same unknowns (e.g. the previous point of
  /// a wavelength sweep). Arnoldi then starts from their sum plus a small random part instead of
  /// a random vector. Vectors of another size are ignored. Which modes are returned does not
  /// change (still the n_modes nearest the target); only the work to converge them.
  std::vector<Eigen::VectorXd> start_vectors;
};

enum class EigenStatus {
  converged,             ///< every returned mode converged with residual below tolerance
  not_converged,         ///< Arnoldi did not converge all requested Ritz pairs
  residual_too_large,    ///< some eigenpair failed the residual check (left out of `modes`)
  factorization_failed,  ///< A − σB is singular (σ is an eigenvalue); move n_target slightly
  search_incomplete,     ///< all_guided: the cap max_eigenvalues was reached before n_lower_bound
  no_modes_found,        ///< the search converged but no eigenpair is a guided forward mode
};

std::string_view to_string(EigenStatus s);

struct SolveTiming {
  double assembly_s = 0.0;
  double factorization_s = 0.0;
  double eigensolve_s = 0.0;
};

struct SolveResult {
  EigenStatus status = EigenStatus::converged;
  std::vector<Mode> modes;         ///< sorted by descending n_eff
  SolveTiming timing;
  int n_dofs = 0;
  int n_eigenvalues = 0;           ///< eigenvalues computed in the last Arnoldi run (nev)
  int n_arnoldi_runs = 0;          ///< Arnoldi runs (1, or more when all_guided widened nev)
  /// Applications of op(x) = (A − σB)⁻¹ B x over all runs: one pair of triangular solves each.
  long n_operator_applications = 0;
  /// β² = −λ of every real converged eigenvalue among the nev nearest σ of the last run,
  /// accepted or not (1/µm²): diagnostics for spurious-mode checks.
  std::vector<double> beta_sq_found;
};

/// Progress report: stage name ("assembly", "factorization", "eigensolve") and fraction in [0, 1].
using ProgressCallback = std::function<void(std::string_view stage, double fraction)>;

class ModeSolver {
public:
  /// Validates the problem (InputError naming the field) and builds the DofMap.
  /// solve() throws InputError for n_modes < 1 (without all_guided) and for an n_target that is
  /// not positive or lies above every material index (no mode can have n_eff there); numerical
  /// outcomes (singular A − σB, no convergence, no mode, residual) are EigenStatus values.
  explicit ModeSolver(ModeProblem problem);
  ~ModeSolver();
  ModeSolver(const ModeSolver&) = delete;
  ModeSolver& operator=(const ModeSolver&) = delete;

  void set_progress(ProgressCallback cb) { progress_ = std::move(cb); }
  /// New wavelength on the same mesh: the next solve reassembles and refactorises (no new
  /// pattern analysis). Materials may be replaced for dispersion (same size).
  void set_wavelength(double wavelength_um, std::optional<std::vector<Material>> materials = {});

  void assemble();
  SolveResult solve(const SolveRequest& request);

  const ModeProblem& problem() const { return problem_; }
  const DofMap& dof_map() const { return dofs_; }
  const SystemMatrices<double>& matrices() const { return matrices_; }
  double k0() const;                  ///< 2π/λ in 1/µm
  double max_material_index() const;  ///< sqrt(max ε_ii) over regions
  double min_material_index() const;  ///< sqrt(min ε_ii) over regions
  int n_dofs() const { return dofs_.n_dofs(); }
  /// Weyl estimate of the number of modes with n_lower < n_eff (both polarisations counted):
  /// Σ_regions A k0² (n² − n_lower²) / (2π); V²/2 for a step-index fibre. Sizes the first
  /// Arnoldi run of an all_guided request.
  double estimated_guided_modes(double n_lower) const;

private:
  struct Factorization;
  ModeProblem problem_;
  DofMap dofs_;
  SystemMatrices<double> matrices_;
  bool assembled_ = false;
  double assembly_s_ = 0.0;
  std::unique_ptr<Factorization> lu_;
  ProgressCallback progress_;
  void report(std::string_view stage, double f) const {
    if (progress_) progress_(stage, f);
  }
};

}  // namespace cladwise
