// Bent waveguides as equivalent straight ones (docs/formulation.md §8).
//
// A guide bent with radius R in the plane spanned by the cross-section direction d (unit vector,
// pointing away from the centre of curvature) and z is described in the coordinates
// (u = (x − o)·d, the other transverse coordinate, s = arc length at radius R). These are
// orthogonal with scale factors (1, 1, h), h = 1 + u/R, so Maxwell's equations keep their form in
// them with the equivalent medium (transformation rule for orthogonal coordinates,
// ε'_i = ε h₁h₂h₃/h_i²; D. M. Shyroki, "Exact equivalent straight waveguide model for bent and
// twisted waveguides", IEEE Trans. MTT 56, 414 (2008)):
//
//   ε'_t = h ε_t,  ε'_zz = ε_zz / h,   μ'_t = h μ_t,  μ'_zz = μ_zz / h       (exact)
//
// and β is the propagation constant along the arc at u = 0 (angular order ν = βR). The scalar
// conformal-mapping alternative (M. Heiblum & J. H. Harris, IEEE JQE 11, 75 (1975)) keeps μ = 1
// and scales the index, n' = n (1 + u/R), i.e. ε' = ε (1 + u/R)²: kept for comparison only.
#pragma once

#include <Eigen/Core>

#include "mesh/mesh.hpp"
#include "solver/material.hpp"

namespace cladwise {

enum class BendModel {
  exact_transformation,  ///< Shyroki 2008: ε, μ scaled by h = 1 + u/R (default)
  conformal_index,       ///< Heiblum & Harris 1975: n (1 + u/R), μ = 1 (comparison)
};

struct Bend {
  double radius_um = 0;        ///< R > 0, measured to the point `origin` of the cross-section
  double direction_deg = 0;    ///< direction of d (away from the centre of curvature); 0 = +x
  Point2 origin{0.0, 0.0};     ///< the point on the reference arc of radius R
  BendModel model = BendModel::exact_transformation;
};

/// Throws InputError (naming "bend.<field>") unless R > 0 and finite.
void validate(const Bend& bend);

/// u = (x − origin)·d (µm): distance outwards from the reference arc.
double bend_coordinate(const Bend& bend, const Eigen::Vector2d& x);

/// The equivalent straight medium of `m` at x (see the header comment). Requires 1 + u/R > 0.
TensorMaterial bent_material(const Bend& bend, const TensorMaterial& m, const Eigen::Vector2d& x);

/// Loss (dB) of a bend through `angle_rad` of arc: loss_db_per_m · R · angle (R in µm → m).
inline double bend_loss_db(double loss_db_per_m, double radius_um, double angle_rad) {
  return loss_db_per_m * radius_um * 1e-6 * angle_rad;
}

}  // namespace cladwise
