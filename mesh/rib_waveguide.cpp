// Rib/strip waveguide regions; see rib_waveguide.hpp for the frame.
#include "mesh/rib_waveguide.hpp"

#include <cmath>
#include <numbers>

#include "mesh/error.hpp"

namespace cladwise {
namespace {

void require_positive(double v, const std::string& where, const std::string& key) {
  if (!(v > 0) || !std::isfinite(v)) {
    throw InputError(where, key + " must be a positive length in µm (got " + std::to_string(v) + ")");
  }
}

Shape centred_rectangle(double width, double y0, double y1) {
  return Shape{Rectangle{width, y1 - y0, 0.0}, Placement{{0.0, 0.5 * (y0 + y1)}, 0.0}};
}

}  // namespace

std::vector<RegionSpec> rib_waveguide_regions(const RibWaveguide& rib) {
  const std::string where = rib.where.empty() ? "rib waveguide '" + rib.name + "'" : rib.where;
  require_positive(rib.rib_width, where, "rib_width");
  require_positive(rib.rib_height, where, "rib_height");
  if (rib.slab_thickness < 0) throw InputError(where, "slab_thickness must be >= 0");
  if (!(rib.sidewall_angle_deg > 0 && rib.sidewall_angle_deg <= 90)) {
    throw InputError(where, "sidewall_angle_deg must be in (0, 90]");
  }
  if (rib.material.empty()) throw InputError(where, "material of the guiding film is empty");
  const double t = rib.slab_thickness, h = rib.rib_height, w = rib.rib_width;
  const double foot = rib.sidewall_angle_deg == 90
                          ? w
                          : w + 2.0 * h / std::tan(rib.sidewall_angle_deg * std::numbers::pi / 180);
  if (t > 0) {
    require_positive(rib.slab_width, where, "slab_width");
    if (foot > rib.slab_width) {
      throw InputError(where, "the rib's foot (" + std::to_string(foot) +
                                  " µm wide) is wider than the slab (slab_width " +
                                  std::to_string(rib.slab_width) + " µm)");
    }
  }

  std::vector<RegionSpec> regions;
  if (rib.substrate_thickness > 0) {
    if (rib.substrate_material.empty()) {
      throw InputError(where, "substrate_thickness is set but substrate_material is empty");
    }
    const double width = rib.substrate_width > 0 ? rib.substrate_width
                         : t > 0                 ? rib.slab_width
                                                 : 4 * foot;
    regions.push_back(RegionSpec{"substrate", rib.substrate_material,
                                 {centred_rectangle(width, -rib.substrate_thickness, 0.0)}, 0.0,
                                 false, where});
  } else if (rib.substrate_thickness < 0) {
    throw InputError(where, "substrate_thickness must be >= 0");
  }

  RegionSpec film{rib.name, rib.material, {}, rib.mesh_size, true, where};
  if (t > 0) film.shapes.push_back(centred_rectangle(rib.slab_width, 0.0, t));
  if (foot == w) {
    film.shapes.push_back(centred_rectangle(w, t, t + h));
  } else {
    film.shapes.push_back(Shape{Polygon{{{-0.5 * foot, t}, {0.5 * foot, t}, {0.5 * w, t + h},
                                         {-0.5 * w, t + h}}},
                                Placement{}});
  }
  regions.push_back(film);
  return regions;
}

}  // namespace cladwise
