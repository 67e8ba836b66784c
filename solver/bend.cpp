// Equivalent straight waveguide of a bend (see bend.hpp).
#include "solver/bend.hpp"

#include <cassert>
#include <cmath>
#include <numbers>
#include <string>

#include "mesh/error.hpp"

namespace cladwise {

void validate(const Bend& b) {
  if (!(b.radius_um > 0.0) || !std::isfinite(b.radius_um)) {
    throw InputError("bend.radius_um", "must be a positive length in micrometres, got " +
                                           std::to_string(b.radius_um));
  }
  if (!std::isfinite(b.direction_deg)) {
    throw InputError("bend.direction_deg", "must be a finite angle in degrees");
  }
}

double bend_coordinate(const Bend& b, const Eigen::Vector2d& x) {
  const double a = b.direction_deg * std::numbers::pi / 180.0;
  return (x.x() - b.origin[0]) * std::cos(a) + (x.y() - b.origin[1]) * std::sin(a);
}

TensorMaterial bent_material(const Bend& b, const TensorMaterial& m, const Eigen::Vector2d& x) {
  const double h = 1.0 + bend_coordinate(b, x) / b.radius_um;
  assert(h > 0.0 && "point beyond the centre of curvature");
  TensorMaterial out = m;
  if (b.model == BendModel::conformal_index) {
    out.eps_t *= h * h;
    out.eps_zz *= h * h;
    return out;
  }
  out.eps_t *= h;
  out.eps_zz /= h;
  out.mu_t *= h;
  out.mu_zz /= h;
  return out;
}

}  // namespace cladwise
