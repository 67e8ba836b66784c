// Rib (ridge) and strip waveguides of integrated optics as cross-section regions.
//
// Frame: x across the guide, y up; the substrate's top face is y = 0. The slab of width
// slab_width and thickness slab_thickness sits on it (y in [0, t_slab]); the rib of top width
// rib_width and height rib_height stands on the slab (y in [t_slab, t_slab + h]), centred at x = 0.
// slab_thickness = 0 gives a strip (channel) waveguide. A sidewall angle below 90° makes the rib a
// trapezoid, wider at its foot by 2 h / tan(angle). The cover (air, oxide) is the cross-section's
// background; an optional substrate region of substrate_thickness lies under y = 0.
#pragma once

#include <string>
#include <vector>

#include "mesh/cross_section.hpp"

namespace cladwise {

struct RibWaveguide {
  double slab_width = 0;           ///< µm; ignored when slab_thickness = 0
  double slab_thickness = 0;       ///< µm; 0: strip waveguide
  double rib_width = 0;            ///< µm, at the top of the rib
  double rib_height = 0;           ///< µm, above the slab
  double sidewall_angle_deg = 90;  ///< (0, 90]; 90: vertical sidewalls
  std::string material;            ///< guiding film
  std::string name = "rib";
  double substrate_thickness = 0;  ///< > 0: add a substrate region below y = 0
  double substrate_width = 0;      ///< 0: the slab width (or 4 rib widths for a strip)
  std::string substrate_material;
  double mesh_size = 0;            ///< inside the guiding film; 0: automatic
  std::string where;               ///< for error messages
};

/// The regions of a rib waveguide in painting order: [substrate (if any), guiding film (slab ∪ rib,
/// RegionSpec::guiding = true)]. Throws InputError naming `where` for non-positive sizes, an angle
/// outside (0, 90] or a rib whose foot is wider than the slab.
std::vector<RegionSpec> rib_waveguide_regions(const RibWaveguide& rib);

}  // namespace cladwise
