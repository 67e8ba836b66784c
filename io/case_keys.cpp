#include "io/case_keys.hpp"

#include <array>
#include <sstream>

namespace cladwise::io {
namespace {

using K = KeyType;
using B = KeyBound;

// Order matters only for the documentation.
constexpr std::array kKeys = {
    // ---- top level ----
    CaseKey{"", "title", K::text, "", "file name", "", B::any, "Free text shown in reports."},
    CaseKey{"", "wavelength_um", K::number_list, "µm", "required (or [sweep])", "", B::positive,
            "Vacuum wavelength, or a list of wavelengths for a sweep (e.g. [1.50, 1.55, 1.60])."},
    CaseKey{"sweep", "from_um", K::number, "µm", "required", "", B::positive,
            "First wavelength of an evenly spaced sweep."},
    CaseKey{"sweep", "to_um", K::number, "µm", "required", "", B::positive,
            "Last wavelength of the sweep."},
    CaseKey{"cutoff", "mode", K::integer, "", "required", "", B::positive,
            "Mode whose cutoff wavelength is searched (bracketing search, not a sweep): its position "
            "(1 = highest n_eff) at from_um, where it must be guided."},
    CaseKey{"cutoff", "from_um", K::number, "µm", "first wavelength", "", B::positive,
            "Start of the search."},
    CaseKey{"cutoff", "to_um", K::number, "µm", "required", "", B::positive,
            "Search no further than this wavelength."},
    CaseKey{"sweep", "points", K::integer, "", "required", "", B::positive,
            "Number of wavelengths, ends included (at least 3 for dispersion, 4 for its slope)."},

    // ---- materials: [materials] NAME = index, or NAME = { ... } (docs/materials.md) ----
    CaseKey{"materials.NAME", "index", K::number, "", "one model key is required", "", B::positive,
            "Constant refractive index. `NAME = 1.444` is short for `NAME = { index = 1.444 }`."},
    CaseKey{"materials.NAME", "extinction", K::number, "", "0", "", B::non_negative,
            "Extinction coefficient κ of a constant index: n − jκ, κ > 0 absorbs."},
    CaseKey{"materials.NAME", "permittivity", K::number_or_triple, "", "", "", B::any,
            "Constant relative permittivity ε' (may be negative for a metal), or the diagonal "
            "[ε_xx, ε_yy, ε_zz] of an anisotropic region (principal axes along x, y, z)."},
    CaseKey{"materials.NAME", "permittivity_loss", K::number_or_triple, "", "0", "", B::non_negative,
            "Imaginary part ε'' >= 0 of the permittivity, ε = ε' − jε'' (same shape as permittivity)."},
    CaseKey{"materials.NAME", "model", K::text, "", "", "", B::any,
            "A built-in dispersion model by name (silica, germania, germania_silica, "
            "fluorine_silica, silicon, silicon_nitride, lithium_niobate_o, lithium_niobate_e, air, "
            "...; docs/materials.md)."},
    CaseKey{"materials.NAME", "mole_fraction", K::number, "", "", "", B::non_negative,
            "Dopant mole fraction 0–1 of a mixture model (germania_silica)."},
    CaseKey{"materials.NAME", "sellmeier_b", K::number_list, "", "", "", B::any,
            "Sellmeier strengths B_i: n² − 1 = Σ B_i λ²/(λ² − C_i) (C_i in µm² or C_i² in µm)."},
    CaseKey{"materials.NAME", "sellmeier_c_um", K::number_list, "µm", "", "", B::any,
            "Sellmeier resonance wavelengths C_i (n² − 1 = Σ B_i λ²/(λ² − C_i²))."},
    CaseKey{"materials.NAME", "sellmeier_c_um2", K::number_list, "µm²", "", "", B::any,
            "Sellmeier constants C_i in µm² (n² − 1 = Σ B_i λ²/(λ² − C_i))."},
    CaseKey{"materials.NAME", "cauchy", K::number_list, "", "", "", B::any,
            "Cauchy coefficients [A, B, C, ...]: n = A + B/λ² + C/λ⁴ + ... (λ in µm)."},
    CaseKey{"materials.NAME", "table", K::text, "", "", "", B::any,
            "CSV file (relative to the case) with columns wavelength_um, n and optionally k; "
            "interpolated by a cubic spline."},
    CaseKey{"materials.NAME", "valid_from_um", K::number, "µm", "required for sellmeier/cauchy", "",
            B::positive, "Shortest wavelength at which a user fit may be evaluated."},
    CaseKey{"materials.NAME", "valid_to_um", K::number, "µm", "required for sellmeier/cauchy", "",
            B::positive, "Longest wavelength at which a user fit may be evaluated."},
    CaseKey{"materials.NAME", "allow_extrapolation", K::boolean, "", "false", "", B::any,
            "Evaluate a model or table outside its validity range instead of stopping."},
    CaseKey{"materials.NAME", "ordinary", K::text, "", "", "", B::any,
            "Uniaxial crystal: name of the material giving the ordinary index."},
    CaseKey{"materials.NAME", "extraordinary", K::text, "", "", "", B::any,
            "Uniaxial crystal: name of the material giving the extraordinary index."},
    CaseKey{"materials.NAME", "optic_axis_deg", K::number, "deg", "0", "", B::any,
            "Uniaxial crystal: angle of the optic axis in the cross-section, from x."},
    CaseKey{"materials.NAME", "optic_axis_along_z", K::boolean, "", "false", "", B::any,
            "Uniaxial crystal: the optic axis lies along the guide (z) instead."},

    // ---- domain: the outer boundary and what fills it ----
    CaseKey{"domain", "shape", K::text, "", "\"disk\"", "", B::any,
            "Outer boundary of the computational domain: \"disk\" or \"rectangle\"."},
    CaseKey{"domain", "radius_um", K::number, "µm", "required for a disk", "", B::positive,
            "Radius of a disk domain."},
    CaseKey{"domain", "width_um", K::number, "µm", "required for a rectangle", "", B::positive,
            "Full width of a rectangular domain."},
    CaseKey{"domain", "height_um", K::number, "µm", "required for a rectangle", "", B::positive,
            "Full height of a rectangular domain."},
    CaseKey{"domain", "centre_um", K::number_pair, "µm", "[0, 0]", "", B::any,
            "Centre of the domain."},
    CaseKey{"domain", "material", K::text, "", "required", "", B::any,
            "Background material filling the domain under every region (usually the cladding)."},
    CaseKey{"domain", "pml_thickness_um", K::number, "µm", "0", "", B::non_negative,
            "Thickness of an absorbing shell (perfectly matched layer) outside the domain; 0: none."},
    CaseKey{"domain", "pml_strength", K::number, "", "8", "", B::non_negative,
            "Absorption strength σ_max of the layer: coordinates stretch by 1 − jσ_max(ρ/t)^m. "
            "Leaky modes meet the layer at grazing incidence and need several units."},
    CaseKey{"domain", "pml_power", K::integer, "", "2", "", B::non_negative,
            "Grading exponent m of the absorption profile σ_max(ρ/t)^m."},
    CaseKey{"domain", "symmetry", K::text, "", "\"none\"", "", B::any,
            "Mirror-symmetry cut: \"none\", \"half-upper\" (keep y >= 0), \"half-right\" "
            "(keep x >= 0) or \"quarter\" (keep x, y >= 0)."},
    CaseKey{"domain", "outer_wall", K::text, "", "\"electric\"", "", B::any,
            "Condition on the outer boundary: \"electric\" (tangential E = 0) or \"magnetic\" "
            "(tangential H = 0)."},
    CaseKey{"domain", "x_axis_wall", K::text, "", "\"electric\"", "", B::any,
            "Condition on a symmetry cut along the x axis (y = 0); selects the symmetry class."},
    CaseKey{"domain", "y_axis_wall", K::text, "", "\"magnetic\"", "", B::any,
            "Condition on a symmetry cut along the y axis (x = 0)."},

    // ---- regions: [[region]], painted in order; later regions win ----
    CaseKey{"region", "name", K::text, "", "region<N>", "all", B::any, "Unique region name."},
    CaseKey{"region", "material", K::text, "", "required", "all", B::any,
            "Material name from [materials]."},
    CaseKey{"region", "shape", K::text, "", "required", "all", B::any,
            "One of the shapes below."},
    CaseKey{"region", "centre_um", K::number_pair, "µm", "[0, 0]", "all", B::any,
            "Translation of the shape (or of the whole generated group)."},
    CaseKey{"region", "rotation_deg", K::number, "deg", "0", "all", B::any,
            "Counter-clockwise rotation about the shape's own centre, applied before translation."},
    CaseKey{"region", "mesh_size_um", K::number, "µm", "automatic", "all", B::positive,
            "Target element size inside the region."},
    CaseKey{"region", "guiding", K::boolean, "", "false", "all", B::any,
            "Refine inside and along the interfaces (set it for cores and ribs)."},
    CaseKey{"region", "radius_um", K::number, "µm", "required", "disk", B::positive, "Radius."},
    CaseKey{"region", "semi_axes_um", K::number_pair, "µm", "required", "ellipse", B::positive,
            "Semi-axes [a, b] along the local x and y axes."},
    CaseKey{"region", "width_um", K::number, "µm", "required", "rectangle", B::positive,
            "Width along the local x axis."},
    CaseKey{"region", "height_um", K::number, "µm", "required", "rectangle", B::positive,
            "Height along the local y axis."},
    CaseKey{"region", "corner_radius_um", K::number, "µm", "0", "rectangle", B::non_negative,
            "Radius of rounded corners; at most half the smaller side."},
    CaseKey{"region", "vertices_um", K::point_list, "µm", "required", "polygon", B::any,
            "Vertices [[x, y], ...] of a simple polygon, at least three."},
    CaseKey{"region", "inner_radius_um", K::number, "µm", "required", "ring", B::positive,
            "Inner radius (e.g. of a depressed trench)."},
    CaseKey{"region", "outer_radius_um", K::number, "µm", "required", "ring", B::positive,
            "Outer radius."},
    CaseKey{"region", "pitch_um", K::number, "µm", "required", "hole-lattice, core-ring, core-grid",
            B::positive, "Centre-to-centre spacing of neighbouring holes or cores."},
    CaseKey{"region", "hole_diameter_um", K::number, "µm", "required", "hole-lattice", B::positive,
            "Hole diameter."},
    CaseKey{"region", "rings", K::integer, "", "required", "hole-lattice", B::positive,
            "Rings of holes around the centre: 1 + 3R(R+1) lattice sites."},
    CaseKey{"region", "skip_centre", K::boolean, "", "true", "hole-lattice", B::any,
            "Leave the centre site solid (the core of a microstructured fibre)."},
    CaseKey{"region", "count", K::integer, "", "required", "core-ring", B::positive,
            "Number of cores on the ring."},
    CaseKey{"region", "centre_core", K::boolean, "", "false", "core-ring", B::any,
            "Add one more core at the centre (e.g. 6 + 1 = 7 cores)."},
    CaseKey{"region", "core_radius_um", K::number, "µm", "required", "core-ring, core-grid",
            B::positive, "Radius of each core."},
    CaseKey{"region", "columns", K::integer, "", "required", "core-grid", B::positive,
            "Cores along x."},
    CaseKey{"region", "rows", K::integer, "", "required", "core-grid", B::positive,
            "Cores along y."},
    CaseKey{"region", "offset_um", K::number, "µm", "required", "stress-rods", B::positive,
            "Distance from the centre to each rod's centre (rods at ±offset on the local x axis)."},
    CaseKey{"region", "rod_radius_um", K::number, "µm", "required", "stress-rods", B::positive,
            "Radius of each stress rod."},
    CaseKey{"region", "slab_width_um", K::number, "µm", "required", "rib", B::positive,
            "Width of the slab under the rib (the slab lies on 0 <= y <= slab thickness)."},
    CaseKey{"region", "slab_thickness_um", K::number, "µm", "required", "rib", B::positive,
            "Thickness of the slab left beside the rib."},
    CaseKey{"region", "rib_width_um", K::number, "µm", "required", "rib", B::positive,
            "Width of the rib."},
    CaseKey{"region", "rib_height_um", K::number, "µm", "required", "rib", B::positive,
            "Height of the rib above the slab."},

    // ---- mesh controls ----
    CaseKey{"mesh", "order", K::integer, "", "2", "", B::positive,
            "Element order: 1 (straight triangles, Whitney edges + linear nodes) or 2 (curved "
            "6-node triangles, second-order edges + quadratic nodes)."},
    CaseKey{"mesh", "size_um", K::number, "µm", "automatic", "", B::positive,
            "Element size where no region sets one."},
    CaseKey{"mesh", "max_size_um", K::number, "µm", "none", "", B::positive,
            "Global cap on the element size."},
    CaseKey{"mesh", "interface_size_um", K::number, "µm", "region size", "", B::positive,
            "Element size along the interfaces of guiding regions."},
    CaseKey{"mesh", "growth", K::number, "", "1.3", "", B::positive,
            "Largest ratio between neighbouring element sizes away from interfaces (> 1)."},

    // ---- what to solve for ----
    CaseKey{"solve", "modes", K::integer, "", "2", "", B::positive,
            "Number of modes to compute nearest the target index."},
    CaseKey{"solve", "all_guided", K::boolean, "", "false", "", B::any,
            "Compute every guided mode (effective index between the background index and the "
            "highest index), widening the search as needed; `modes` is then a first guess."},
    CaseKey{"solve", "target_index", K::number, "", "highest index in the case", "", B::positive,
            "Effective index around which modes are sought (the shift of the eigensolver)."},

    CaseKey{"solve", "check_pml", K::boolean, "", "false", "", B::any,
            "Solve again with a doubled PML strength and flag every loss that changes by more than "
            "5 % (the loss is then set by the PML or the mesh, not by the guide)."},

    CaseKey{"solve", "core_region", K::text, "", "none", "", B::any,
            "Leaky and bent guides: keep only modes with at least half of ∫|E|² in this region "
            "(e.g. the core of a tight bend, whose outer side also holds whispering-gallery modes)."},
    CaseKey{"solve", "nonlinear_index_m2_per_w", K::number, "m²/W", "2.6e-20", "", B::non_negative,
            "Nonlinear index n2 of the glass that carries the mode, for the nonlinear coefficient "
            "γ = 2π n2/(λ A_eff) (2.6e-20 m²/W: fused silica, common practice)."},

    // ---- a bend of the whole cross-section ----
    CaseKey{"bend", "radius_um", K::number, "µm", "required", "", B::positive,
            "Bend radius, measured to the centre of the domain."},
    CaseKey{"bend", "direction_deg", K::number, "deg", "0", "", B::any,
            "Direction from the centre of curvature towards the outside of the bend (0: +x)."},
    CaseKey{"bend", "model", K::text, "", "\"exact\"", "", B::any,
            "\"exact\": the equivalent straight guide of a coordinate transformation (ε and μ "
            "scaled by 1 + u/R; Shyroki 2008); \"conformal\": the scalar index n(1 + u/R) "
            "(Heiblum & Harris 1975), for comparison."},

    // ---- geometry from a file instead of [domain] shapes and [[region]] ----
    CaseKey{"import", "path", K::text, "", "required", "", B::any,
            "A Gmsh .geo, a STEP (.step/.stp) or BREP (.brep) file, or a ready mesh (.msh), "
            "relative to the case file."},
    CaseKey{"import", "materials", K::table, "", "required", "", B::any,
            "Table mapping each 2-D physical-group name of the file to a material name; 1-D "
            "groups named \"outer\", \"cut_x0\", \"cut_y0\" become boundaries."},
};

constexpr std::array<std::string_view, 10> kShapes = {
    "disk", "ellipse", "rectangle", "polygon", "ring",
    "hole-lattice", "core-ring", "core-grid", "stress-rods", "rib"};

}  // namespace

std::span<const CaseKey> case_keys() { return kKeys; }
std::span<const std::string_view> region_shapes() { return kShapes; }

const CaseKey* find_case_key(std::string_view section, std::string_view name) {
  for (const auto& k : kKeys) {
    if (k.section == section && k.name == name) return &k;
  }
  return nullptr;
}

std::string_view key_type_name(KeyType t) {
  switch (t) {
    case K::number: return "number";
    case K::integer: return "integer";
    case K::boolean: return "true/false";
    case K::text: return "string";
    case K::number_pair: return "[number, number]";
    case K::number_triple: return "[number, number, number]";
    case K::point_list: return "[[x, y], ...]";
    case K::number_list: return "[number, ...]";
    case K::number_or_triple: return "number or [number, number, number]";
    case K::table: return "table";
  }
  return "?";
}

std::string case_key_reference_markdown() {
  std::ostringstream out;
  std::string_view current = "\x01";
  for (const auto& k : kKeys) {
    if (k.section != current) {
      current = k.section;
      out << "\n### ";
      if (k.section.empty()) out << "top level";
      else if (k.section == "region") out << "[[region]]";
      else out << '[' << k.section << ']';
      out << "\n\n";
      if (k.section == "region") {
        out << "| key | shapes | type | unit | default | meaning |\n|---|---|---|---|---|---|\n";
      } else {
        out << "| key | type | unit | default | meaning |\n|---|---|---|---|---|\n";
      }
    }
    out << "| `" << k.name << "` | ";
    if (k.section == "region") out << k.applies_to << " | ";
    out << key_type_name(k.type) << " | " << (k.unit.empty() ? "–" : k.unit) << " | "
        << k.default_text << " | " << k.help << " |\n";
  }
  return out.str();
}

}  // namespace cladwise::io
