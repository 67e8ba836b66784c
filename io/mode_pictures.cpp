// Mode pictures: a software rasteriser over the mesh triangles, drawing helpers (lines, a 5×7
// bitmap font of our own for the bar labels) and VTK's PNG writer. See mode_pictures.hpp.
#include "io/mode_pictures.hpp"

#include <vtkImageData.h>
#include <vtkNew.h>
#include <vtkPNGWriter.h>

#include <algorithm>
#include <cassert>
#include <cmath>
#include <cstdio>
#include <limits>
#include <map>

#include "mesh/error.hpp"

namespace cladwise::io {

namespace {

using Rgb = std::array<unsigned char, 3>;

constexpr Rgb k_background{255, 255, 255};  // outside the mesh
constexpr Rgb k_pml{200, 200, 200};         // PML shell: no physical field
constexpr Rgb k_outline{190, 190, 190};     // region outlines: a neutral grey on every colour
constexpr Rgb k_ink{255, 255, 255};         // bars and labels ...
constexpr Rgb k_halo{20, 20, 20};           // ... on a dark halo, legible on light and dark

/// An 8-bit RGB picture, row 0 at the top.
struct Image {
  int w = 0, h = 0;
  std::vector<unsigned char> rgb;
  Image(int width, int height) : w(width), h(height), rgb(static_cast<std::size_t>(3 * width * height), 255) {}
  bool inside(int i, int j) const { return i >= 0 && j >= 0 && i < w && j < h; }
  void set(int i, int j, const Rgb& c) {
    if (!inside(i, j)) return;
    std::copy(c.begin(), c.end(), rgb.begin() + 3 * (static_cast<std::ptrdiff_t>(j) * w + i));
  }
  /// Alpha blend of colour c over the pixel.
  void blend(int i, int j, const Rgb& c, double alpha) {
    if (!inside(i, j)) return;
    unsigned char* p = &rgb[3 * (static_cast<std::size_t>(j) * w + i)];
    for (int k = 0; k < 3; ++k) p[k] = static_cast<unsigned char>(std::lround((1 - alpha) * p[k] + alpha * c[k]));
  }
  void fill_rect(int i0, int j0, int i1, int j1, const Rgb& c) {
    for (int j = j0; j < j1; ++j)
      for (int i = i0; i < i1; ++i) set(i, j, c);
  }
};

/// Pixel ↔ cross-section coordinates of a view.
struct Raster {
  ViewBox v;
  int w = 0, h = 0;
  double um_per_px = 1;
  double px(double x) const { return (x - v.x_min) / um_per_px; }  // continuous pixel column
  double py(double y) const { return (v.y_max - y) / um_per_px; }  // continuous pixel row
};

Raster make_raster(const ViewBox& v, int width_px) {
  if (width_px < 16 || !(v.x_max > v.x_min) || !(v.y_max > v.y_min)) {
    throw ComputationError("mode pictures: empty view or width below 16 pixels (give a view with x_max > x_min and y_max > y_min)");
  }
  Raster r;
  r.v = v;
  r.w = width_px;
  r.um_per_px = (v.x_max - v.x_min) / width_px;
  r.h = std::max(16, static_cast<int>(std::lround((v.y_max - v.y_min) / r.um_per_px)));
  r.v.y_min = r.v.y_max - r.h * r.um_per_px;  // keep pixels square
  return r;
}

ViewBox mesh_bounds(const Mesh& mesh) {
  ViewBox b{std::numeric_limits<double>::max(), std::numeric_limits<double>::lowest(),
            std::numeric_limits<double>::max(), std::numeric_limits<double>::lowest()};
  for (const auto& p : mesh.nodes) {
    b.x_min = std::min(b.x_min, p[0]);
    b.x_max = std::max(b.x_max, p[0]);
    b.y_min = std::min(b.y_min, p[1]);
    b.y_max = std::max(b.y_max, p[1]);
  }
  return b;
}

/// The linear sub-triangles of triangle t (node numbers): itself for order 1; for order 2 the
/// corner triangles (0,3,5), (3,1,4), (5,4,2) and the middle one (3,4,5) of the 6-node element.
std::vector<std::array<int, 3>> sub_triangles(const Mesh& mesh, int t) {
  const auto& n = mesh.triangles[t];
  if (mesh.order != 2) return {{n[0], n[1], n[2]}};
  return {{n[0], n[3], n[5]}, {n[3], n[1], n[4]}, {n[5], n[4], n[2]}, {n[3], n[4], n[5]}};
}

/// Visits every pixel whose centre lies in a (linear sub-)triangle with its barycentric weights:
/// visit(i, j, triangle, node ids, weights).
template <class Visit>
void rasterise(const Mesh& mesh, const Raster& r, Visit&& visit) {
  for (int t = 0; t < mesh.n_triangles(); ++t) {
    for (const auto& s : sub_triangles(mesh, t)) {
      const double x0 = r.px(mesh.nodes[s[0]][0]), y0 = r.py(mesh.nodes[s[0]][1]);
      const double x1 = r.px(mesh.nodes[s[1]][0]), y1 = r.py(mesh.nodes[s[1]][1]);
      const double x2 = r.px(mesh.nodes[s[2]][0]), y2 = r.py(mesh.nodes[s[2]][1]);
      const double det = (x1 - x0) * (y2 - y0) - (x2 - x0) * (y1 - y0);
      if (std::abs(det) < 1e-300) continue;
      const int i0 = std::max(0, static_cast<int>(std::floor(std::min({x0, x1, x2}))));
      const int i1 = std::min(r.w - 1, static_cast<int>(std::ceil(std::max({x0, x1, x2}))));
      const int j0 = std::max(0, static_cast<int>(std::floor(std::min({y0, y1, y2}))));
      const int j1 = std::min(r.h - 1, static_cast<int>(std::ceil(std::max({y0, y1, y2}))));
      for (int j = j0; j <= j1; ++j) {
        for (int i = i0; i <= i1; ++i) {
          const double cx = i + 0.5, cy = j + 0.5;
          const double l1 = ((cx - x0) * (y2 - y0) - (x2 - x0) * (cy - y0)) / det;
          const double l2 = ((x1 - x0) * (cy - y0) - (cx - x0) * (y1 - y0)) / det;
          const double l0 = 1 - l1 - l2;
          // Half-open tolerance so that pixels on a shared edge are visited once or twice, never 0.
          constexpr double tol = -1e-12;
          if (l0 < tol || l1 < tol || l2 < tol) continue;
          visit(i, j, t, s, std::array<double, 3>{l0, l1, l2});
        }
      }
    }
  }
}

bool is_pml(const Mesh& mesh, int t) { return mesh.regions[mesh.triangle_region[t]].role == RegionRole::pml; }

// ---- drawing -------------------------------------------------------------------------------

/// A disc of radius rad (pixels) stamped along the segment: anti-aliasing is not needed at
/// these widths, and the round caps join polyline pieces cleanly.
void draw_segment(Image& im, double xa, double ya, double xb, double yb, double rad, const Rgb& c, double alpha = 1) {
  const double len = std::hypot(xb - xa, yb - ya);
  const int steps = std::max(1, static_cast<int>(std::ceil(len * 3)));
  const int ir = static_cast<int>(std::ceil(rad));
  std::vector<char> done;  // one blend per pixel per segment when alpha < 1
  const int bx0 = static_cast<int>(std::floor(std::min(xa, xb))) - ir - 1;
  const int by0 = static_cast<int>(std::floor(std::min(ya, yb))) - ir - 1;
  const int bw = static_cast<int>(std::ceil(std::abs(xb - xa))) + 2 * ir + 3;
  const int bh = static_cast<int>(std::ceil(std::abs(yb - ya))) + 2 * ir + 3;
  done.assign(static_cast<std::size_t>(bw) * bh, 0);
  for (int s = 0; s <= steps; ++s) {
    const double f = static_cast<double>(s) / steps;
    const double x = xa + f * (xb - xa), y = ya + f * (yb - ya);
    for (int dj = -ir; dj <= ir; ++dj) {
      for (int di = -ir; di <= ir; ++di) {
        const int i = static_cast<int>(std::floor(x)) + di, j = static_cast<int>(std::floor(y)) + dj;
        if (std::hypot(i + 0.5 - x, j + 0.5 - y) > rad + 1e-9) continue;
        const std::size_t k = static_cast<std::size_t>(j - by0) * bw + (i - bx0);
        if (k >= done.size() || done[k]) continue;
        done[k] = 1;
        im.blend(i, j, c, alpha);
      }
    }
  }
}

/// Our own 5×7 glyphs for the bar labels (rows top to bottom, bit 4 = leftmost column).
const std::map<char, std::array<unsigned char, 7>>& glyphs() {
  static const std::map<char, std::array<unsigned char, 7>> g{
      {'0', {0x0E, 0x11, 0x13, 0x15, 0x19, 0x11, 0x0E}}, {'1', {0x04, 0x0C, 0x04, 0x04, 0x04, 0x04, 0x0E}},
      {'2', {0x0E, 0x11, 0x01, 0x02, 0x04, 0x08, 0x1F}}, {'3', {0x1E, 0x01, 0x01, 0x0E, 0x01, 0x01, 0x1E}},
      {'4', {0x02, 0x06, 0x0A, 0x12, 0x1F, 0x02, 0x02}}, {'5', {0x1F, 0x10, 0x1E, 0x01, 0x01, 0x11, 0x0E}},
      {'6', {0x06, 0x08, 0x10, 0x1E, 0x11, 0x11, 0x0E}}, {'7', {0x1F, 0x01, 0x02, 0x04, 0x08, 0x08, 0x08}},
      {'8', {0x0E, 0x11, 0x11, 0x0E, 0x11, 0x11, 0x0E}}, {'9', {0x0E, 0x11, 0x11, 0x0F, 0x01, 0x02, 0x0C}},
      {'.', {0x00, 0x00, 0x00, 0x00, 0x00, 0x0C, 0x0C}}, {'-', {0x00, 0x00, 0x00, 0x1F, 0x00, 0x00, 0x00}},
      {'+', {0x00, 0x04, 0x04, 0x1F, 0x04, 0x04, 0x00}},
      {'u', {0x00, 0x12, 0x12, 0x12, 0x16, 0x1A, 0x10}},  // µ, with its descender
      {'m', {0x00, 0x00, 0x1A, 0x15, 0x15, 0x15, 0x15}}, {'n', {0x00, 0x00, 0x16, 0x19, 0x11, 0x11, 0x11}},
      {'e', {0x00, 0x00, 0x0E, 0x11, 0x1F, 0x10, 0x0E}}, {' ', {0, 0, 0, 0, 0, 0, 0}}};
  return g;
}

constexpr int k_font_scale = 2;
int text_width(const std::string& s) { return static_cast<int>(s.size()) * 6 * k_font_scale - k_font_scale; }
constexpr int k_text_height = 7 * k_font_scale;

/// Text with its top-left corner at (i0, j0): white glyphs over a one-pixel dark halo.
void draw_text(Image& im, int i0, int j0, const std::string& s) {
  for (int pass = 0; pass < 2; ++pass) {
    int x = i0;
    for (char ch : s) {
      const auto it = glyphs().find(ch);
      assert(it != glyphs().end() && "draw_text: no glyph for this character");
      for (int row = 0; row < 7; ++row) {
        for (int col = 0; col < 5; ++col) {
          if (!(it->second[row] & (0x10 >> col))) continue;
          const int pi = x + col * k_font_scale, pj = j0 + row * k_font_scale;
          if (pass == 0) im.fill_rect(pi - 1, pj - 1, pi + k_font_scale + 1, pj + k_font_scale + 1, k_halo);
          else im.fill_rect(pi, pj, pi + k_font_scale, pj + k_font_scale, k_ink);
        }
      }
      x += 6 * k_font_scale;
    }
  }
}

std::string format_number(double v) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.4g", v);
  std::string s = buf;
  return s;
}

/// A bar of a round length (1, 2 or 5 × 10^k µm) close to a fifth of the width, bottom left.
void draw_scale_bar(Image& im, const Raster& r) {
  const double target = 0.2 * r.w * r.um_per_px;
  const double decade = std::pow(10.0, std::floor(std::log10(target)));
  double len = decade;
  for (double f : {1.0, 2.0, 5.0, 10.0}) {
    if (f * decade <= target) len = f * decade;
  }
  const int bar_px = std::max(1, static_cast<int>(std::lround(len / r.um_per_px)));
  const int margin = 12, thick = 5;
  const int i0 = margin, j1 = im.h - margin, j0 = j1 - thick;
  im.fill_rect(i0 - 1, j0 - 1, i0 + bar_px + 1, j1 + 1, k_halo);
  im.fill_rect(i0, j0, i0 + bar_px, j1, k_ink);
  const std::string label = format_number(len) + " um";  // 'u' is drawn as µ
  draw_text(im, i0, j0 - 6 - k_text_height, label);
}

/// A vertical colour bar at the right edge with the values of its ends.
void draw_colour_bar(Image& im, const std::string& low, const std::string& high) {
  const int margin = 12, bar_w = 12;
  const int bar_h = std::max(20, im.h / 3);
  const int i1 = im.w - margin, i0 = i1 - bar_w;
  const int j0 = margin + k_text_height + 6, j1 = j0 + bar_h;
  im.fill_rect(i0 - 1, j0 - 1, i1 + 1, j1 + 1, k_halo);
  for (int j = j0; j < j1; ++j) {
    const Rgb c = viridis_colour(1.0 - static_cast<double>(j - j0) / (bar_h - 1));
    im.fill_rect(i0, j, i1, j + 1, c);
  }
  draw_text(im, std::max(0, i1 - text_width(high)), margin, high);
  draw_text(im, std::max(0, i1 - text_width(low)), j1 + 6, low);
}

/// Edges between triangles of different regions and edges of the domain boundary, each drawn as
/// its (possibly curved: corner, mid-edge node, corner) polyline.
void draw_region_outlines(Image& im, const Mesh& mesh, const Raster& r, double rad, const Rgb& c, double alpha) {
  std::vector<std::array<int, 2>> sides(mesh.edges.size(), {-1, -1});
  for (int t = 0; t < mesh.n_triangles(); ++t) {
    for (int k = 0; k < 3; ++k) {
      auto& s = sides[mesh.triangle_edges[t][k]];
      (s[0] < 0 ? s[0] : s[1]) = mesh.triangle_region[t];
    }
  }
  for (std::size_t e = 0; e < mesh.edges.size(); ++e) {
    if (sides[e][1] >= 0 && sides[e][0] == sides[e][1]) continue;
    std::vector<int> chain{mesh.edges[e][0]};
    if (mesh.order == 2 && mesh.edge_midnode[e] >= 0) chain.push_back(mesh.edge_midnode[e]);
    chain.push_back(mesh.edges[e][1]);
    for (std::size_t k = 0; k + 1 < chain.size(); ++k) {
      const auto& a = mesh.nodes[chain[k]];
      const auto& b = mesh.nodes[chain[k + 1]];
      draw_segment(im, r.px(a[0]), r.py(a[1]), r.px(b[0]), r.py(b[1]), rad, c, alpha);
    }
  }
}

void write_png(const Image& im, const std::filesystem::path& path) {
  vtkNew<vtkImageData> data;
  data->SetDimensions(im.w, im.h, 1);
  data->AllocateScalars(VTK_UNSIGNED_CHAR, 3);
  auto* dst = static_cast<unsigned char*>(data->GetScalarPointer());
  // VTK images start at the bottom row; ours at the top.
  for (int j = 0; j < im.h; ++j) {
    std::copy_n(&im.rgb[3 * static_cast<std::size_t>(im.h - 1 - j) * im.w], 3 * im.w, dst + 3 * static_cast<std::size_t>(j) * im.w);
  }
  vtkNew<vtkPNGWriter> writer;
  writer->SetFileName(path.string().c_str());
  writer->SetInputData(data);
  writer->Write();
  if (writer->GetErrorCode() != 0 || !std::filesystem::exists(path)) {
    throw ComputationError("could not write " + path.string() + " (is the folder writable?)");
  }
}

std::vector<double> intensity_at_nodes(const NodalFields& f, IntensityQuantity q) {
  std::vector<double> v(f.e.size());
  for (std::size_t i = 0; i < v.size(); ++i) v[i] = q == IntensityQuantity::s_z ? f.s_z[i] : f.e[i].squaredNorm();
  return v;
}

/// Peak of the node values over the nodes of physical (non-PML) triangles.
double physical_peak(const Mesh& mesh, const std::vector<double>& v) {
  double peak = 0;
  for (int t = 0; t < mesh.n_triangles(); ++t) {
    if (is_pml(mesh, t)) continue;
    for (int k = 0; k < mesh.nodes_per_triangle(); ++k) peak = std::max(peak, v[mesh.triangles[t][k]]);
  }
  return peak;
}

/// The intensity picture and the raster it was drawn on.
struct IntensityImage {
  Image im;
  Raster r;
  std::vector<float> ex, ey;  ///< Re E_x, Re E_y per pixel (NaN outside the physical regions)
  std::vector<float> level;   ///< intensity / peak per pixel (NaN outside)
};

IntensityImage draw_intensity(const Mesh& mesh, const NodalFields& fields, const PictureOptions& o) {
  assert(fields.e.size() == mesh.nodes.size() && fields.s_z.size() == mesh.nodes.size());
  const Raster r = make_raster(o.view.value_or(intensity_view(mesh, fields, o.quantity)), o.width_px);
  const std::vector<double> v = intensity_at_nodes(fields, o.quantity);
  const double peak = physical_peak(mesh, v);
  IntensityImage out{Image(r.w, r.h), r, {}, {}, {}};
  const std::size_t n_px = static_cast<std::size_t>(r.w) * r.h;
  const float nan = std::numeric_limits<float>::quiet_NaN();
  out.ex.assign(n_px, nan);
  out.ey.assign(n_px, nan);
  out.level.assign(n_px, nan);
  rasterise(mesh, r, [&](int i, int j, int t, const std::array<int, 3>& s, const std::array<double, 3>& l) {
    const std::size_t p = static_cast<std::size_t>(j) * r.w + i;
    if (is_pml(mesh, t)) {
      out.im.set(i, j, k_pml);
      return;
    }
    double value = 0, ex = 0, ey = 0;
    for (int k = 0; k < 3; ++k) {
      value += l[k] * v[s[k]];
      ex += l[k] * fields.e[s[k]][0].real();
      ey += l[k] * fields.e[s[k]][1].real();
    }
    const double t01 = peak > 0 ? std::clamp(value / peak, 0.0, 1.0) : 0.0;
    out.level[p] = static_cast<float>(t01);
    out.ex[p] = static_cast<float>(ex);
    out.ey[p] = static_cast<float>(ey);
    out.im.set(i, j, viridis_colour(t01));
  });
  draw_region_outlines(out.im, mesh, r, 0.8, k_outline, 0.9);
  return out;
}

void finish_intensity(Image& im, const Raster& r) {
  draw_scale_bar(im, r);
  draw_colour_bar(im, "0", "1");
}

}  // namespace

std::array<unsigned char, 3> viridis_colour(double t) {
  // Every 16th entry (0, 16, ..., 240) and the last (255) of the 256-entry "viridis" table of
  // S. van der Walt and N. Smith, matplotlib colormaps (2015), released under CC0 (public
  // domain), interpolated linearly in sRGB between these 17 control points.
  static constexpr double k_points[17][3] = {
      {0.267004, 0.004874, 0.329415}, {0.282327, 0.094955, 0.417331}, {0.278826, 0.175490, 0.483397},
      {0.258965, 0.251537, 0.524736}, {0.229739, 0.322361, 0.545706}, {0.199430, 0.387607, 0.554642},
      {0.172719, 0.448791, 0.557885}, {0.149039, 0.508051, 0.557250}, {0.127568, 0.566949, 0.550556},
      {0.120638, 0.625828, 0.533488}, {0.157851, 0.683765, 0.501686}, {0.246070, 0.738910, 0.452024},
      {0.369214, 0.788888, 0.382914}, {0.515992, 0.831158, 0.294279}, {0.678489, 0.863742, 0.189503},
      {0.845561, 0.887322, 0.099702}, {0.993248, 0.906157, 0.143936}};
  // Control point k sits at table index 16k (k < 16) or 255 (k = 16).
  const double x = std::clamp(std::isfinite(t) ? t : 0.0, 0.0, 1.0) * 255.0;
  int k = std::min(15, static_cast<int>(x / 16.0));
  const double a = 16.0 * k, b = k == 15 ? 255.0 : 16.0 * (k + 1);
  const double f = (x - a) / (b - a);
  std::array<unsigned char, 3> c{};
  for (int ch = 0; ch < 3; ++ch) {
    const double v = (1 - f) * k_points[k][ch] + f * k_points[k + 1][ch];
    c[ch] = static_cast<unsigned char>(std::lround(255.0 * v));
  }
  return c;
}

ViewBox intensity_view(const Mesh& mesh, const NodalFields& fields, IntensityQuantity quantity) {
  const std::vector<double> v = intensity_at_nodes(fields, quantity);
  const double peak = physical_peak(mesh, v);
  const ViewBox all = mesh_bounds(mesh);
  if (!(peak > 0)) return all;
  ViewBox b{std::numeric_limits<double>::max(), std::numeric_limits<double>::lowest(),
            std::numeric_limits<double>::max(), std::numeric_limits<double>::lowest()};
  for (int t = 0; t < mesh.n_triangles(); ++t) {
    if (is_pml(mesh, t)) continue;
    for (int k = 0; k < mesh.nodes_per_triangle(); ++k) {
      const int n = mesh.triangles[t][k];
      if (v[n] < 1e-2 * peak) continue;
      b.x_min = std::min(b.x_min, mesh.nodes[n][0]);
      b.x_max = std::max(b.x_max, mesh.nodes[n][0]);
      b.y_min = std::min(b.y_min, mesh.nodes[n][1]);
      b.y_max = std::max(b.y_max, mesh.nodes[n][1]);
    }
  }
  // Where the intensity exceeds 1 % of the peak (−20 dB), padded by 30 % of the larger side and make the box at least 4:3-ish, so that thin modes keep
  // room for the bars; then clip to the mesh.
  const double side = std::max(b.x_max - b.x_min, b.y_max - b.y_min);
  const double cx = 0.5 * (b.x_min + b.x_max), cy = 0.5 * (b.y_min + b.y_max);
  const double hw = 0.5 * std::max(b.x_max - b.x_min, 0.75 * side) + 0.3 * side;
  const double hh = 0.5 * std::max(b.y_max - b.y_min, 0.75 * side) + 0.3 * side;
  return {std::max(all.x_min, cx - hw), std::min(all.x_max, cx + hw), std::max(all.y_min, cy - hh),
          std::min(all.y_max, cy + hh)};
}

PictureGeometry write_intensity_png(const Mesh& mesh, const NodalFields& fields, const PictureOptions& options,
                                    const std::filesystem::path& path) {
  IntensityImage ii = draw_intensity(mesh, fields, options);
  finish_intensity(ii.im, ii.r);
  write_png(ii.im, path);
  return {ii.r.v, ii.r.w, ii.r.h};
}

PictureGeometry write_polarisation_png(const Mesh& mesh, const NodalFields& fields, const PictureOptions& options,
                                       const std::filesystem::path& path) {
  IntensityImage ii = draw_intensity(mesh, fields, options);
  const Raster& r = ii.r;
  const int step = std::max(6, options.line_spacing_px);
  // Grid points where the intensity is above 2 % of the peak; the longest Re E_t among them sets
  // the scale (segment length 0.85 of the grid step).
  struct Sample {
    double x, y, ex, ey;
  };
  std::vector<Sample> samples;
  double longest = 0;
  for (int j = step / 2; j < r.h; j += step) {
    for (int i = step / 2; i < r.w; i += step) {
      const std::size_t p = static_cast<std::size_t>(j) * r.w + i;
      if (!(ii.level[p] >= 0.02f)) continue;
      samples.push_back({i + 0.5, j + 0.5, ii.ex[p], ii.ey[p]});
      longest = std::max(longest, std::hypot(static_cast<double>(ii.ex[p]), static_cast<double>(ii.ey[p])));
    }
  }
  if (longest > 0) {
    for (int pass = 0; pass < 2; ++pass) {
      for (const auto& s : samples) {
        // Image rows grow downwards: y flips sign.
        const double half = 0.5 * 0.85 * step / longest;
        const double dx = half * s.ex, dy = -half * s.ey;
        if (std::hypot(dx, dy) < 0.75) continue;
        if (pass == 0) draw_segment(ii.im, s.x - dx, s.y - dy, s.x + dx, s.y + dy, 2.0, k_halo);
        else draw_segment(ii.im, s.x - dx, s.y - dy, s.x + dx, s.y + dy, 0.9, k_ink);
      }
    }
  }
  finish_intensity(ii.im, r);
  write_png(ii.im, path);
  return {r.v, r.w, r.h};
}

ModePictureFiles write_mode_pictures(const Mesh& mesh, const NodalFields& fields, const PictureOptions& options,
                                     const std::filesystem::path& dir, const std::string& stem) {
  PictureOptions o = options;
  if (!o.view) o.view = intensity_view(mesh, fields, o.quantity);
  ModePictureFiles files{stem + "_intensity.png", stem + "_polarisation.png"};
  write_intensity_png(mesh, fields, o, dir / files.intensity);
  write_polarisation_png(mesh, fields, o, dir / files.polarisation);
  return files;
}

PictureGeometry write_index_png(const Mesh& mesh, const std::vector<double>& index_per_triangle,
                                const PictureOptions& options, const std::filesystem::path& path) {
  assert(index_per_triangle.size() == mesh.triangles.size());
  ViewBox all = mesh_bounds(mesh);
  all.x_max += 0.18 * (all.x_max - all.x_min);  // the colour bar and its labels beside the mesh
  const Raster r = make_raster(options.view.value_or(all), options.width_px);
  double lo = std::numeric_limits<double>::max(), hi = std::numeric_limits<double>::lowest();
  for (double n : index_per_triangle) {
    if (!std::isfinite(n)) continue;
    lo = std::min(lo, n);
    hi = std::max(hi, n);
  }
  Image im(r.w, r.h);
  rasterise(mesh, r, [&](int i, int j, int t, const std::array<int, 3>&, const std::array<double, 3>&) {
    const double n = index_per_triangle[t];
    if (!std::isfinite(n)) im.set(i, j, k_pml);
    else im.set(i, j, viridis_colour(hi > lo ? (n - lo) / (hi - lo) : 0.5));
  });
  // Triangle edges, faint so that refined regions read as a lighter texture, not a white blot.
  for (std::size_t e = 0; e < mesh.edges.size(); ++e) {
    std::vector<int> chain{mesh.edges[e][0]};
    if (mesh.order == 2 && mesh.edge_midnode[e] >= 0) chain.push_back(mesh.edge_midnode[e]);
    chain.push_back(mesh.edges[e][1]);
    for (std::size_t k = 0; k + 1 < chain.size(); ++k) {
      const auto& a = mesh.nodes[chain[k]];
      const auto& b = mesh.nodes[chain[k + 1]];
      draw_segment(im, r.px(a[0]), r.py(a[1]), r.px(b[0]), r.py(b[1]), 0.5, k_ink, 0.3);
    }
  }
  draw_region_outlines(im, mesh, r, 0.9, k_outline, 1.0);
  draw_scale_bar(im, r);
  if (hi >= lo) draw_colour_bar(im, "n " + format_number(lo), "n " + format_number(hi));
  write_png(im, path);
  return {r.v, r.w, r.h};
}

}  // namespace cladwise::io
