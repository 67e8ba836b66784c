// Mode pictures without a display: fields at mesh nodes rasterised onto an image grid by linear
// interpolation over the triangles (order-2 triangles split into their four corner/mid-edge
// sub-triangles), coloured with a perceptually uniform map and written with VTK's PNG writer. No
// window, no OpenGL context and no GPU are involved: every pixel is computed here.
//
// Each picture carries the outlines of the regions (edges between triangles of different regions,
// and the domain boundary) in a neutral grey, a scale bar in micrometres and a colour bar.
//   * intensity:    S_z (or |E|²) normalised to its peak over the physical regions;
//   * polarisation: the intensity with a line field of Re E_t on a coarse grid (line segments, not
//                   arrows: a phasor's sign flips every half period);
//   * index:        the mesh, each triangle filled with its refractive index (cell data).
// PML shells are drawn in flat grey: their fields belong to the stretched problem
// (docs/outputs.md) and carry no physical meaning.
#pragma once

#include <array>
#include <filesystem>
#include <optional>
#include <string>
#include <vector>

#include "mesh/mesh.hpp"
#include "solver/mode_fields.hpp"

namespace cladwise::io {

/// A rectangle of the cross-section in micrometres.
struct ViewBox {
  double x_min = 0, x_max = 0, y_min = 0, y_max = 0;
};

enum class IntensityQuantity { s_z, e_abs2 };

struct PictureOptions {
  int width_px = 480;  ///< the height follows the aspect ratio of the view
  /// What to show. Default: intensity pictures zoom to where the intensity exceeds 1 % of its
  /// peak (padded, within the mesh); the index picture shows the whole mesh
  /// (with room on the right for the colour bar).
  std::optional<ViewBox> view;
  IntensityQuantity quantity = IntensityQuantity::s_z;
  int line_spacing_px = 22;  ///< polarisation picture: grid step of the line field
};

/// Where a written picture lies: pixel (i, j), j counted from the top row, covers
/// x ∈ x_min + [i, i+1)·(x_max − x_min)/width_px, y ∈ y_max − [j, j+1)·(y_max − y_min)/height_px.
struct PictureGeometry {
  ViewBox view;
  int width_px = 0, height_px = 0;
};

/// The intensity of one mode. Throws ComputationError if the file cannot be written.
PictureGeometry write_intensity_png(const Mesh& mesh, const NodalFields& fields,
                                    const PictureOptions& options, const std::filesystem::path& path);

/// The intensity with a line field of the transverse electric field Re E_t over it.
PictureGeometry write_polarisation_png(const Mesh& mesh, const NodalFields& fields,
                                       const PictureOptions& options, const std::filesystem::path& path);

/// The mesh (triangle edges) with each triangle coloured by `index_per_triangle` (one value per
/// triangle, e.g. the `index` cell array of mode_field_arrays). NaN values are drawn grey.
PictureGeometry write_index_png(const Mesh& mesh, const std::vector<double>& index_per_triangle,
                                const PictureOptions& options, const std::filesystem::path& path);

/// File names (relative to their folder) of the pictures of one mode; empty: not written.
struct ModePictureFiles {
  std::string intensity;
  std::string polarisation;
};

/// Writes `<stem>_intensity.png` and `<stem>_polarisation.png` into `dir` with the same view.
ModePictureFiles write_mode_pictures(const Mesh& mesh, const NodalFields& fields, const PictureOptions& options,
                                     const std::filesystem::path& dir, const std::string& stem);

/// The view write_intensity_png chooses by default for these fields.
ViewBox intensity_view(const Mesh& mesh, const NodalFields& fields, IntensityQuantity quantity);

/// The perceptually uniform colour map of all pictures, t ∈ [0, 1] → 8-bit sRGB.
std::array<unsigned char, 3> viridis_colour(double t);

}  // namespace cladwise::io
