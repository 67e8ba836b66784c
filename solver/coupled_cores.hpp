// Coupled cores of a multicore fibre: per-core power of each supermode, the coupling coefficient
// of a core pair from the supermode splitting, and the coupling matrix of a core array.
//
// Two identical cores: the even and odd supermodes split by β_e − β_o = 2κ, and the power of one
// core transfers fully to the other over the coupling length L_c = π/(2κ) (A. W. Snyder &
// J. D. Love, "Optical Waveguide Theory", 1983, ch. 18 and 29).
// A core array in coupled-mode theory: the supermodes of one polarisation are the eigenvectors a_s
// of β0 I + K (K symmetric, K_ij the coupling of cores i, j), with eigenvalues β_s. From computed
// supermodes, K + β0 I = A diag(β_s) Aᵀ with A the (orthonormalised) per-core amplitude vectors.
// This is basis-free inside degenerate groups of supermodes, so a 7-core hexagonal fibre needs no
// special pairing. Per-core amplitude of a supermode: the integral of its principal transverse
// field component over the core's cell (the points nearer that core centre than any other) — the
// projection on the isolated-core mode up to a common factor when the cores are identical.
#pragma once

#include <Eigen/Core>

#include <vector>

#include "mesh/mesh.hpp"
#include "solver/dof_map.hpp"
#include "solver/mode.hpp"
#include "solver/mode_fields.hpp"
#include "solver/mode_solver.hpp"

namespace cladwise {

struct PairCoupling {
  double kappa_per_m = 0.0;        ///< κ (1/m)
  double coupling_length_m = 0.0;  ///< π/(2κ) (m); +inf when κ = 0
};

/// κ = (β_even − β_odd)/2 from the two supermodes' β (1/µm), and L_c = π/(2|κ|).
PairCoupling coupling_from_splitting(double beta_even_per_um, double beta_odd_per_um);

/// One supermode seen core by core.
struct SupermodeCores {
  std::vector<double> power_fraction;  ///< ∫_cell S_z / ∫ S_z per core (sum 1)
  Eigen::VectorXd amplitude;           ///< signed ∫_cell E_p dA, unit norm
  char polarisation = 'x';             ///< principal axis of E_t nearer x or y
};

/// Per-core power and amplitude of a mode; `centres` are the core centres (µm).
SupermodeCores supermode_cores(const ModeFieldEvaluator& fields, const Mesh& mesh, int order,
                               const std::vector<Point2>& centres);

struct CoreCoupling {
  int core_a = 0, core_b = 0;
  double distance_um = 0.0;
  PairCoupling coupling;
};

struct CoreArrayCoupling {
  char polarisation = 'x';
  Eigen::MatrixXd coupling_matrix_per_m;  ///< K (1/m), diagonal relative to the mean β
  std::vector<CoreCoupling> pairs;        ///< core pairs whose distance is within the tolerance of the smallest
};

/// Coupling matrices of a core array, one per polarisation present with exactly n_cores
/// supermodes, from supermodes (β in 1/µm) and their per-core views. Pairs listed are the
/// neighbours: centre distance ≤ (1 + neighbour_tolerance) × the smallest distance.
std::vector<CoreArrayCoupling> core_array_coupling(const std::vector<Mode>& supermodes,
                                                   const std::vector<SupermodeCores>& cores,
                                                   const std::vector<Point2>& centres,
                                                   double neighbour_tolerance = 0.05);

}  // namespace cladwise
