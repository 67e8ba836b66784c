// Butt-coupling overlap of two modes on two meshes (see mode_overlap.hpp).
#include "solver/mode_overlap.hpp"

#include <cmath>
#include <numbers>

#include "mesh/error.hpp"
#include "solver/mode_metrics.hpp"

namespace cladwise {

namespace {

/// ½ Re ∫ (E × H*)·ẑ dA over the mode's own quadrature points (W/m² · µm²).
double power_on_own_mesh(const std::vector<FieldQuadraturePoint>& s) {
  double p = 0.0;
  for (const auto& q : s) p += q.weight_um2 * q.field.s_z();
  return p;
}

/// (a × b)·ẑ of the transverse parts.
std::complex<double> cross_z(const Eigen::Vector3cd& a, const Eigen::Vector3cd& b) {
  return a.x() * b.y() - a.y() * b.x();
}

}  // namespace

CouplingResult butt_coupling(const ModeFieldEvaluator& fields1, const Mesh& mesh1, int order1,
                             const ModeFieldEvaluator& fields2, const Mesh& mesh2, int order2,
                             const MeshLocator& locator2, double wavelength_um,
                             const JunctionAlignment& al) {
  if (&locator2.mesh() != &mesh2) {
    throw InputError("butt_coupling", "the locator does not belong to the mesh of mode 2");
  }
  const std::vector<FieldQuadraturePoint> s1 = sample_mode(fields1, mesh1, order1, false);
  const std::vector<FieldQuadraturePoint> s2 = sample_mode(fields2, mesh2, order2, false);
  // Each power on its own mesh by the same rule, so that a mode against itself gives c = 1 to
  // rounding (the evaluators normalise by a lower-degree rule).
  const double p1 = power_on_own_mesh(s1), p2 = power_on_own_mesh(s2);
  const double k0 = 2.0 * std::numbers::pi / wavelength_um;
  const double kx = k0 * al.medium_index * std::sin(al.tilt_deg * std::numbers::pi / 180.0);
  std::complex<double> sum = 0.0;
  for (const auto& q : s1) {
    const Point2 x2{q.x.x() - al.offset_x_um, q.x.y() - al.offset_y_um};
    const auto p = locator2.locate(x2);
    if (!p) continue;  // mode 2 is zero outside its mesh
    FieldSample f2 = fields2.at_reference(p->triangle, p->xi);
    if (kx != 0.0) {
      // tilt: linear phase across the junction plane, referred to the axis of guide 2
      const std::complex<double> phase = std::polar(1.0, -kx * x2[0]);
      f2.e *= phase;
      f2.h *= phase;
    }
    const auto& f1 = q.field;
    sum += q.weight_um2 * (cross_z(f1.e, f2.h.conjugate()) + cross_z(f2.e.conjugate(), f1.h));
  }
  CouplingResult r;
  r.amplitude = 0.25 * sum / std::sqrt(p1 * p2);
  r.efficiency = std::norm(r.amplitude);
  r.loss_db = -10.0 * std::log10(r.efficiency);
  return r;
}

CouplingResult butt_coupling(const JunctionSide& side1, const JunctionSide& side2,
                             const MeshLocator& locator2, const JunctionAlignment& alignment) {
  if (std::abs(side1.problem->wavelength_um - side2.problem->wavelength_um) >
      1e-12 * side1.problem->wavelength_um) {
    throw InputError("butt_coupling", "the two modes are at different wavelengths (" +
                                          std::to_string(side1.problem->wavelength_um) + " and " +
                                          std::to_string(side2.problem->wavelength_um) +
                                          " µm); solve both at the same wavelength");
  }
  const ModeFieldEvaluator f1(*side1.problem, *side1.dofs, *side1.mode);
  const ModeFieldEvaluator f2(*side2.problem, *side2.dofs, *side2.mode);
  return butt_coupling(f1, side1.dofs->mesh(), side1.dofs->order(), f2, side2.dofs->mesh(),
                       side2.dofs->order(), locator2, side1.problem->wavelength_um, alignment);
}

}  // namespace cladwise
