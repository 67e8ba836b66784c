// Global assembly of the waveguide pencil (A, B) of docs/formulation.md eq. 13:
//   A = [A_tt 0; 0 0],  B = [B_tt B_tz; B_zt B_zz]
// on the free DOFs of a DofMap: element kernel -> signed triplets -> setFromTriplets.
// Eliminated (electric-wall) unknowns are skipped at scatter time, which is exact elimination of
// a homogeneous essential condition (no penalty, no patched rows).
//
// Parallel over elements with OpenMP. The result is bitwise independent of the thread count:
// elements are cut into fixed-size chunks, each chunk fills its own triplet list, and the lists
// are concatenated in chunk order before setFromTriplets (which sums duplicates in list order).
#pragma once

#include <Eigen/SparseCore>

#include <functional>
#include <vector>

#include "mesh/mesh.hpp"
#include "solver/dof_map.hpp"
#include "solver/element_kernels.hpp"

namespace cladwise {

template <typename Scalar>
struct SystemMatrices {
  Eigen::SparseMatrix<Scalar> a;  ///< curl–curl minus ε-mass, edge block only
  Eigen::SparseMatrix<Scalar> b;  ///< full coupled block matrix
};

/// Geometry of triangle t: its 3 corners, or all 6 nodes on an order-2 (isoparametric) mesh.
ElementGeometry element_geometry(const Mesh& mesh, int t);

/// Assembles A and B. `region_tensors[r]` are the tensors of mesh region r; k0 in 1/µm.
/// Throws ComputationError if an element is inverted (det J ≤ 0 at a quadrature point).
template <typename Scalar>
SystemMatrices<Scalar> assemble_waveguide(const DofMap& dofs,
                                          const std::vector<MaterialTensors<Scalar>>& region_tensors,
                                          double k0);

/// Material tensors as a function of the position x (µm) inside a region. Must be thread-safe
/// (assembly calls it from several threads).
template <typename Scalar>
using TensorField = std::function<MaterialTensors<Scalar>(const Eigen::Vector2d& x_um)>;

/// The medium of one region: constant tensors, or tensors evaluated at every quadrature point
/// when `at_point` is set (PML stretching, bend factors; the kernels' material-at-point hook).
template <typename Scalar>
struct RegionMedium {
  MaterialTensors<Scalar> tensors;  ///< used when `at_point` is empty
  TensorField<Scalar> at_point;     ///< position-dependent tensors; overrides `tensors`
};

/// Assembles A and B with per-region media, some of them position-dependent. With every
/// `at_point` empty the result is identical to the overload above.
template <typename Scalar>
SystemMatrices<Scalar> assemble_waveguide(const DofMap& dofs,
                                          const std::vector<RegionMedium<Scalar>>& region_media,
                                          double k0);

}  // namespace cladwise
