// ComplexModeSolver: leaky and lossy modes of a waveguide cross-section (docs/formulation.md §8).
//
// Same Lee–Sun–Cendes pencil as the real solver, A x = λ B x with λ = −β² (formulation.md eq. 13),
// but with complex tensors: lossy and metallic media, full in-plane ε_t (rotated crystals), the
// stretched-coordinate media of a PML (solver/pml.hpp) on the mesh's RegionRole::pml regions,
// and the equivalent straight medium of a bend (solver/bend.hpp). A and B are complex symmetric
// (bilinear forms, no conjugation), not Hermitian.
//
// Eigen solve: arpack-ng's complex Arnoldi (znaupd/zneupd through arpack.hpp) in reverse
// communication on our own shift-invert operator
//   op(x) = (A − σB)⁻¹ B x,  θ = 1/(λ − σ),  λ = σ + 1/θ,  σ = −(k0 n_target)²,
// with one complex UMFPACK LU of A − σB per shift (pattern analysed once per mesh). Each Ritz
// vector is refined by the complex-symmetric Rayleigh quotient λ = xᵀAx / xᵀBx (unconjugated:
// the left eigenvector of a complex symmetric pencil is x itself, so this is second-order
// accurate).
//
// Results: β with Re β > 0, n_eff = β/k0; under exp(j(ωt − βz)) a lossy mode has Im n_eff < 0 and
// is reported as n_eff_imag = |Im n_eff|, loss_db_per_m = 20 log10(e) k0 |Im n_eff| 1e6
// (docs/conventions.md). Modes whose field lives in the PML (fraction of ∫|E|² in the physical
// regions below a threshold) are dropped and counted. An optional CoreSelection keeps only modes
// with a given fraction of |E|² in the core and widens the search until enough are found (tight
// bends, where the shift lands among whispering-gallery modes on the outside of the bend).
// Fields of the modes: solver/leaky_mode_fields.hpp.
#pragma once

#include <Eigen/SparseCore>

#include <complex>
#include <limits>
#include <memory>
#include <optional>
#include <vector>

#include "mesh/mesh.hpp"
#include "solver/assembly.hpp"
#include "solver/bend.hpp"
#include "solver/dof_map.hpp"
#include "solver/material.hpp"
#include "solver/mode_solver.hpp"
#include "solver/pml.hpp"

namespace cladwise {

struct LeakyModeProblem {
  const Mesh* mesh = nullptr;                    ///< must outlive the solver; build_topology() done
  std::vector<TensorMaterial> region_materials;  ///< index = mesh region (PML regions: unstretched)
  double wavelength_um = 0.0;                    ///< vacuum wavelength (µm)
  int order = 2;                                 ///< element order p: 1 or 2
  std::vector<WallType> boundary_walls;          ///< index = mesh boundary
  /// Stretching of the RegionRole::pml regions; required when the mesh has such regions.
  std::optional<Pml> pml;
  /// Bend of the whole cross-section (applied before the PML stretching).
  std::optional<Bend> bend;
};

/// The core of a guide, for selecting core-guided modes among the many modes near a shift (the
/// whispering-gallery modes on the outside of a tight bend, cladding and PML modes). The core is
/// the union of the listed mesh regions, or, when `regions` is empty, the disk of `radius_um`
/// about `centre` (tested at every quadrature point, so it needs no matching mesh region).
struct CoreSelection {
  std::vector<int> regions;     ///< mesh region indices of the core
  Point2 centre{0.0, 0.0};      ///< disk centre (µm), used when `regions` is empty
  double radius_um = 0.0;       ///< disk radius (µm), used when `regions` is empty
  /// Keep a mode only if ∫_core |E|² dA / ∫_physical |E|² dA is at least this.
  double min_fraction = 0.5;
};

struct LeakySolveRequest {
  int n_modes = 2;                     ///< modes wanted nearest the target
  std::optional<double> n_target;      ///< real shift n_eff; default: largest physical index
  /// A mode with less than this fraction of ∫|E|² dA in the physical regions is a PML mode.
  double min_physical_fraction = 0.5;
  double residual_tolerance = 1e-8;    ///< a mode above it makes the status residual_too_large
  double arnoldi_tolerance = 1e-12;    ///< ARPACK relative tolerance on θ
  int max_eigenvalues = 200;           ///< cap of the widening search (nev)
  int max_iterations = 2000;           ///< ARPACK restart cap
  /// Loss floor: n_eff_imag below it is flagged loss_unresolved (rounding level of a double
  /// eigen solve with ~1e-14 backward error, common practice).
  double n_eff_imag_floor = 1e-12;
  /// > 0: re-solve with the PML strength multiplied by this factor and flag modes whose loss
  /// changes by more than `pml_check_tolerance` (relative): the loss is then set by the PML or
  /// the mesh, not by the guide. Costs one more factorisation and eigen solve.
  double pml_check_factor = 0.0;
  double pml_check_tolerance = 0.05;
  /// When set, modes below `core->min_fraction` of |E|² in the core are rejected (counted in
  /// n_core_rejected), and nev widens (×2, up to max_eigenvalues) until n_modes core-guided modes
  /// are found; the kept ones are still those nearest the shift.
  std::optional<CoreSelection> core;
};

struct LeakyMode {
  std::complex<double> beta;     ///< propagation constant (1/µm): Re > 0, Im < 0 for loss
  std::complex<double> n_eff;    ///< β/k0
  double n_eff_imag = 0.0;       ///< |Im n_eff|
  double loss_db_per_m = 0.0;    ///< 20 log10(e) k0 |Im n_eff| 1e6
  double residual = 0.0;         ///< ‖Ax − λBx‖ / ((‖A‖₁ + |λ|‖B‖₁) ‖x‖₂)
  double physical_fraction = 1;  ///< ∫_physical |E|² / ∫_all |E|² (1 without a PML)
  /// ∫_core |E|² / ∫_physical |E|² when a CoreSelection was requested (NaN otherwise).
  double core_fraction = std::numeric_limits<double>::quiet_NaN();
  bool gain = false;             ///< Im n_eff > 0 beyond the floor: not a passive mode
  bool loss_unresolved = false;  ///< below the floor, or changed by the PML check
  /// Relative change of n_eff_imag under the PML check (NaN when not checked / no partner found).
  double pml_loss_change = std::numeric_limits<double>::quiet_NaN();
  /// Eigenvector on the free DOFs in the scaled unknowns e_t = β E_t, e_z = −j E_z.
  Eigen::VectorXcd eigenvector;
};

struct LeakySolveResult {
  EigenStatus status = EigenStatus::converged;
  std::vector<LeakyMode> modes;  ///< sorted by descending Re n_eff
  SolveTiming timing;
  int n_dofs = 0;
  int n_eigenvalues = 0;         ///< nev of the last ARPACK run
  int n_pml_modes_dropped = 0;   ///< converged eigenpairs rejected as living in the PML
  int n_core_rejected = 0;       ///< eigenpairs rejected by the CoreSelection (last nev)
  std::vector<std::complex<double>> n_eff_found;  ///< every converged eigenvalue as n_eff
};

class ComplexModeSolver {
public:
  /// Validates the problem (InputError naming the field) and builds the DofMap.
  explicit ComplexModeSolver(LeakyModeProblem problem);
  ~ComplexModeSolver();
  ComplexModeSolver(const ComplexModeSolver&) = delete;
  ComplexModeSolver& operator=(const ComplexModeSolver&) = delete;

  /// New wavelength (and optionally materials, same size); next solve reassembles.
  void set_wavelength(double wavelength_um,
                      std::optional<std::vector<TensorMaterial>> materials = {});
  /// New PML strength (σ_max) on the same mesh; next solve reassembles.
  void set_pml_strength(double strength);

  void assemble();
  LeakySolveResult solve(const LeakySolveRequest& request);

  const LeakyModeProblem& problem() const { return problem_; }
  const DofMap& dof_map() const { return dofs_; }
  const SystemMatrices<std::complex<double>>& matrices() const { return matrices_; }
  double k0() const;                    ///< 2π/λ in 1/µm
  double max_physical_index() const;    ///< largest real index of the physical regions
  int n_dofs() const { return dofs_.n_dofs(); }

  /// ∫|E|² dA over the physical regions divided by the integral over all regions, for an
  /// eigenvector of this solver with propagation constant beta.
  double physical_fraction(const Eigen::VectorXcd& x, std::complex<double> beta) const;

  /// ∫_core |E|² dA / ∫_physical |E|² dA for an eigenvector of this solver (0 if it has no
  /// physical field). Throws InputError for a region index outside the mesh or a non-positive
  /// disk radius.
  double core_fraction(const Eigen::VectorXcd& x, std::complex<double> beta,
                       const CoreSelection& core) const;

  /// The kernel tensors of region r at x (bend and PML applied): what the assembly integrates.
  MaterialTensors<std::complex<double>> tensors_at(int region, const Eigen::Vector2d& x) const;

private:
  struct Factorization;
  LeakySolveResult solve_once(const LeakySolveRequest& request);
  LeakyModeProblem problem_;
  DofMap dofs_;
  SystemMatrices<std::complex<double>> matrices_;
  bool assembled_ = false;
  double assembly_s_ = 0.0;
  std::unique_ptr<Factorization> lu_;
};

/// The equivalent medium of mesh region `region` of `problem` at x (µm): the region's material,
/// then the bend factors (solver/bend.hpp), then in PML regions the coordinate stretching
/// (solver/pml.hpp). ComplexModeSolver assembles exactly this medium; the field evaluator
/// (solver/leaky_mode_fields.hpp) takes μ from it.
TensorMaterial leaky_medium_at(const LeakyModeProblem& problem, int region, const Eigen::Vector2d& x);

/// 20 log10(e) k0 |Im n_eff| 1e6: power loss in dB/m for k0 in 1/µm (docs/conventions.md).
double loss_db_per_m(double k0_per_um, double n_eff_imag);

}  // namespace cladwise
