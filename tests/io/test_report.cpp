// Mode pictures and the report page on the elliptical-core case (cases/elliptical_core.toml),
// solved through the library: the PNGs decode with VTK's reader, have the size they claim and show
// the mode where the physics puts it; the page is well formed, references only files of its own
// folder, and renders in headless Chromium with every image loaded and no console message.
#include <gtest/gtest.h>
#include <sys/wait.h>
#include <unistd.h>

#include <vtkImageData.h>
#include <vtkNew.h>
#include <vtkPNGReader.h>

#include <algorithm>
#include <array>
#include <cmath>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <map>
#include <regex>
#include <set>
#include <sstream>
#include <vector>

#include "io/case_file.hpp"
#include "io/mesh_case.hpp"
#include "io/mode_pictures.hpp"
#include "io/report_html.hpp"
#include "io/solve_case.hpp"
#include "run_cli.hpp"

namespace fs = std::filesystem;
using namespace cladwise;
using namespace cladwise::io;

namespace {

/// A decoded PNG, row 0 at the top (as drawn).
struct Png {
  int w = 0, h = 0, channels = 0;
  std::vector<std::array<int, 3>> px;
  const std::array<int, 3>& at(int i, int j) const { return px[static_cast<std::size_t>(j) * w + i]; }
};

Png read_png(const fs::path& p) {
  vtkNew<vtkPNGReader> reader;
  Png out;
  if (!reader->CanReadFile(p.string().c_str())) return out;
  reader->SetFileName(p.string().c_str());
  reader->Update();
  vtkImageData* im = reader->GetOutput();
  int dims[3];
  im->GetDimensions(dims);
  out.w = dims[0];
  out.h = dims[1];
  out.channels = im->GetNumberOfScalarComponents();
  out.px.resize(static_cast<std::size_t>(out.w) * out.h);
  for (int j = 0; j < out.h; ++j) {
    for (int i = 0; i < out.w; ++i) {
      auto& c = out.px[static_cast<std::size_t>(out.h - 1 - j) * out.w + i];  // VTK rows start at the bottom
      for (int k = 0; k < 3; ++k) c[k] = static_cast<int>(im->GetScalarComponentAsDouble(i, j, 0, k));
    }
  }
  return out;
}

int colour_distance(const std::array<int, 3>& a, const std::array<unsigned char, 3>& b) {
  return std::abs(a[0] - b[0]) + std::abs(a[1] - b[1]) + std::abs(a[2] - b[2]);
}

/// Relative luminance of an 8-bit sRGB colour (IEC 61966-2-1 transfer curve, ITU-R BT.709 weights).
double luminance(const std::array<unsigned char, 3>& c) {
  auto lin = [](double v) {
    v /= 255.0;
    return v <= 0.04045 ? v / 12.92 : std::pow((v + 0.055) / 1.055, 2.4);
  };
  return 0.2126 * lin(c[0]) + 0.7152 * lin(c[1]) + 0.0722 * lin(c[2]);
}

fs::path scratch_dir() { return fs::temp_directory_path() / ("cladwise-report-" + std::to_string(::getpid())); }

/// Removes this process's scratch folder after the last test (kept when the environment sets
/// CLADWISE_KEEP_TEST_OUTPUT, to look at the pictures and the page).
class ScratchCleanup : public ::testing::Environment {
public:
  void TearDown() override {
    if (!std::getenv("CLADWISE_KEEP_TEST_OUTPUT")) fs::remove_all(scratch_dir());
  }
};
[[maybe_unused]] ::testing::Environment* const k_cleanup = ::testing::AddGlobalTestEnvironment(new ScratchCleanup);

struct Solved {
  CaseSpec c;
  Mesh mesh;
  CaseSolution sol;
  RunResult run;
  fs::path dir;
};

/// One solve of the case for every test of this file (about a second in Release).
const Solved& solved() {
  static const Solved s = [] {
    Solved r;
    r.c = read_case_file(cladwise::test::source_path("cases/elliptical_core.toml"));
    r.mesh = mesh_case(r.c);
    r.sol = solve_case(r.c, r.mesh);
    r.run.case_path = r.c.path.string();
    r.run.n_triangles = r.mesh.n_triangles();
    r.run.order = r.mesh.order;
    r.run.n_dofs = r.sol.n_dofs;
    PointResult p;
    p.wavelength_um = r.sol.wavelength_um;
    for (const auto& m : r.sol.modes) {
      p.modes.push_back({m.mode.n_eff, m.n_eff_imag, m.loss_db_per_m, m.label, m.mode.residual, m.metrics});
    }
    r.run.points.push_back(p);
    r.run.assembly_s = r.sol.timing.assembly_s;
    r.run.eigensolve_s = r.sol.timing.eigensolve_s;
    r.dir = scratch_dir();
    fs::remove_all(r.dir);
    fs::create_directories(r.dir);
    return r;
  }();
  return s;
}

double metric(const SolvedMode& m, const std::string& key) {
  for (const auto& [k, v] : m.metrics) {
    if (k == key) return v;
  }
  return std::nan("");
}

/// Pixel centre → cross-section point of a picture.
std::array<double, 2> to_um(const PictureGeometry& g, double i, double j) {
  const double s = (g.view.x_max - g.view.x_min) / g.width_px;
  return {g.view.x_min + (i + 0.5) * s, g.view.y_max - (j + 0.5) * s};
}

/// Outside the scale bar (bottom left, with its label) and the colour bar (right edge).
bool in_field_area(const Png& im, int i, int j) { return i < im.w - 70 && j < im.h - 45; }

/// Field-area pixels whose colour is within `tol` (L1, 8-bit) of viridis(t).
std::vector<std::array<int, 2>> pixels_near(const Png& im, double t, int tol) {
  std::vector<std::array<int, 2>> out;
  const auto c = viridis_colour(t);
  for (int j = 0; j < im.h; ++j)
    for (int i = 0; i < im.w; ++i)
      if (in_field_area(im, i, j))
      if (colour_distance(im.at(i, j), c) <= tol) out.push_back({i, j});
  return out;
}

/// Longest horizontal and vertical runs of white (line-field) pixels inside the central part.
std::pair<int, int> white_runs(const Png& im) {
  auto white = [&](int i, int j) {
    const auto& c = im.at(i, j);
    return c[0] > 245 && c[1] > 245 && c[2] > 245;
  };
  int best_h = 0, best_v = 0;
  const int i0 = im.w / 5, i1 = im.w - im.w / 5, j0 = im.h / 5, j1 = im.h - im.h / 5;
  for (int j = j0; j < j1; ++j) {
    int run = 0;
    for (int i = i0; i < i1; ++i) best_h = std::max(best_h, run = white(i, j) ? run + 1 : 0);
  }
  for (int i = i0; i < i1; ++i) {
    int run = 0;
    for (int j = j0; j < j1; ++j) best_v = std::max(best_v, run = white(i, j) ? run + 1 : 0);
  }
  return {best_h, best_v};
}

}  // namespace

TEST(ColourMap, MatchesTheViridisTableAndRisesInLightness) {
  // Ends and middle of matplotlib's viridis, #440154, #21918c, #fde725 (van der Walt & Smith 2015).
  EXPECT_EQ(viridis_colour(0.0), (std::array<unsigned char, 3>{0x44, 0x01, 0x54}));
  EXPECT_EQ(viridis_colour(1.0), (std::array<unsigned char, 3>{0xfd, 0xe7, 0x25}));
  EXPECT_LE(colour_distance({0x21, 0x91, 0x8c}, viridis_colour(0.5)), 4);
  // Perceptually uniform maps rise monotonically in lightness (the design goal of viridis).
  double last = -1;
  for (int k = 0; k <= 100; ++k) {
    const double y = luminance(viridis_colour(k / 100.0));
    EXPECT_GT(y, last) << "t = " << k / 100.0;
    last = y;
  }
}

TEST(ModePictures, IntensityPeaksAtTheCoreCentreAndIsElongatedAlongTheMajorAxis) {
  const Solved& s = solved();
  ASSERT_EQ(s.sol.modes.size(), 2u);
  for (std::size_t m = 0; m < 2; ++m) {
    const SolvedMode& mode = s.sol.modes[m];
    ASSERT_TRUE(mode.fields);
    const fs::path file = s.dir / ("intensity_" + std::to_string(m) + ".png");
    PictureOptions o;
    o.width_px = 400;
    const PictureGeometry g = write_intensity_png(s.mesh, *mode.fields, o, file);
    const Png im = read_png(file);
    ASSERT_EQ(im.w, 400);
    ASSERT_EQ(im.w, g.width_px);
    ASSERT_EQ(im.h, g.height_px);
    EXPECT_EQ(im.channels, 3);
    // Zoomed on the mode: much smaller than the 40 µm domain, larger than the 4 x 2 µm core.
    EXPECT_LT(g.view.x_max - g.view.x_min, 30.0);
    EXPECT_GT(g.view.x_max - g.view.x_min, 4.0);

    // Brightest pixels (the top colour of the map) around the power centroid of the mode, which
    // sits at the centre of the core by symmetry.
    const auto peak = pixels_near(im, 1.0, 6);
    ASSERT_FALSE(peak.empty());
    double ci = 0, cj = 0;
    for (const auto& p : peak) ci += p[0], cj += p[1];
    const auto c = to_um(g, ci / peak.size(), cj / peak.size());
    EXPECT_NEAR(c[0], metric(mode, "centroid_x_um"), 0.1);
    EXPECT_NEAR(c[1], metric(mode, "centroid_y_um"), 0.1);
    EXPECT_NEAR(c[0], 0.0, 0.1);
    EXPECT_NEAR(c[1], 0.0, 0.1);

    // Above half of the peak the fundamental modes of a 2:1 elliptical core are wider along the
    // major axis x than along y (a transposed or flipped raster fails this).
    double x_lo = 1e9, x_hi = -1e9, y_lo = 1e9, y_hi = -1e9;
    int n_half = 0;
    for (int j = 0; j < im.h; ++j) {
      for (int i = 0; i < im.w; ++i) {
        if (!in_field_area(im, i, j)) continue;
        int best = 1 << 30;
        double t_best = 0;
        for (int k = 0; k <= 64; ++k) {
          const int d = colour_distance(im.at(i, j), viridis_colour(k / 64.0));
          if (d < best) best = d, t_best = k / 64.0;
        }
        if (best > 6 || t_best < 0.5) continue;
        const auto p = to_um(g, i, j);
        x_lo = std::min(x_lo, p[0]), x_hi = std::max(x_hi, p[0]);
        y_lo = std::min(y_lo, p[1]), y_hi = std::max(y_hi, p[1]);
        ++n_half;
      }
    }
    ASSERT_GT(n_half, 100);
    EXPECT_GT(x_hi - x_lo, 1.2 * (y_hi - y_lo)) << "mode " << m + 1;
    // The width at half maximum follows the mode's own 1/e² widths: FWHM = 1.18/2 of the 1/e²
    // full width for a Gaussian (w_{1/e²} = 2w, FWHM = √(2 ln 2)·w); loose, the mode is not Gaussian.
    const double w_x = metric(mode, "width_1e2_x_um");
    EXPECT_NEAR(x_hi - x_lo, 0.5887 * w_x, 0.25 * w_x);

    // Region outlines: neutral grey pixels along the core boundary (perimeter ≈ 9.7 µm).
    int grey = 0;
    for (const auto& px : im.px) {
      const int lo = std::min({px[0], px[1], px[2]}), hi = std::max({px[0], px[1], px[2]});
      if (hi - lo <= 12 && lo >= 150 && hi <= 235) ++grey;
    }
    const double um_per_px = (g.view.x_max - g.view.x_min) / g.width_px;
    EXPECT_GT(grey, 0.8 * 9.69 / um_per_px);
  }
}

TEST(ModePictures, PolarisationLinesFollowTheDominantFieldComponent) {
  const Solved& s = solved();
  for (std::size_t m = 0; m < s.sol.modes.size(); ++m) {
    const SolvedMode& mode = s.sol.modes[m];
    const fs::path file = s.dir / ("polarisation_" + std::to_string(m) + ".png");
    PictureOptions o;
    o.width_px = 420;
    const PictureGeometry g = write_polarisation_png(s.mesh, *mode.fields, o, file);
    const Png im = read_png(file);
    ASSERT_EQ(im.w, g.width_px);
    ASSERT_EQ(im.h, g.height_px);
    const auto [run_h, run_v] = white_runs(im);
    const double x_fraction = metric(mode, "x_fraction");
    ASSERT_TRUE(std::isfinite(x_fraction));
    if (x_fraction > 0.9) {
      EXPECT_GT(run_h, 8) << "mode " << m + 1;
      EXPECT_GT(run_h, 3 * run_v) << "mode " << m + 1 << " (x-polarised): lines should be horizontal";
    } else {
      ASSERT_LT(x_fraction, 0.1);
      EXPECT_GT(run_v, 8) << "mode " << m + 1;
      EXPECT_GT(run_v, 3 * run_h) << "mode " << m + 1 << " (y-polarised): lines should be vertical";
    }
  }
}

TEST(ModePictures, IndexMapShowsTheCoreAsTheHighestIndex) {
  const Solved& s = solved();
  std::vector<double> index;
  for (int t = 0; t < s.mesh.n_triangles(); ++t) {
    index.push_back(s.c.find_material(s.mesh.regions[s.mesh.triangle_region[t]].material)->max_index(s.c.wavelength_um));
  }
  const fs::path file = s.dir / "index.png";
  PictureOptions o;
  o.width_px = 500;
  const PictureGeometry g = write_index_png(s.mesh, index, o, file);
  const Png im = read_png(file);
  ASSERT_EQ(im.w, 500);
  ASSERT_EQ(im.h, g.height_px);
  // Whole mesh: the disk of radius 20 µm, with room for the colour bar on the right.
  EXPECT_NEAR(g.view.x_min, -20.0, 0.01);
  EXPECT_NEAR(g.view.y_max - g.view.y_min, 40.0, 0.1);
  EXPECT_GT(g.view.x_max, 20.0);
  auto pixel_of = [&](double x, double y) {
    const double s_ = (g.view.x_max - g.view.x_min) / g.width_px;
    return std::array<int, 2>{static_cast<int>((x - g.view.x_min) / s_), static_cast<int>((g.view.y_max - y) / s_)};
  };
  // Mean colour of a small box: the core (1.470) at the top of the map, the cladding (1.444) at
  // the bottom; the faint triangle edges lighten some pixels.
  auto mean = [&](double x, double y) {
    const auto c = pixel_of(x, y);
    std::array<int, 3> sum{0, 0, 0};
    for (int dj = -4; dj <= 4; ++dj)
      for (int di = -4; di <= 4; ++di)
        for (int k = 0; k < 3; ++k) sum[k] += im.at(c[0] + di, c[1] + dj)[k];
    for (int k = 0; k < 3; ++k) sum[k] /= 81;
    return sum;
  };
  const auto core = mean(0.0, 0.0), cladding = mean(-9.0, 9.0);
  // (Viridis reaches red above 230 only at its top end, t > 0.93.)
  EXPECT_GT(core[0], 230) << core[0] << ' ' << core[1] << ' ' << core[2];
  EXPECT_LT(colour_distance(core, viridis_colour(1.0)), colour_distance(core, viridis_colour(0.0)));
  EXPECT_LT(colour_distance(cladding, viridis_colour(0.0)), 60) << cladding[0] << ' ' << cladding[1] << ' ' << cladding[2];
  // Outside the disk (corner of the square view): the white page background.
  EXPECT_EQ(im.at(2, 2), (std::array<int, 3>{255, 255, 255}));
}

// ---- the report page ------------------------------------------------------------------------

namespace {

/// Open/close tags of the page balance (void elements and self-closing SVG tags excepted), and
/// every closing tag matches the innermost open one.
::testing::AssertionResult balanced_tags(const std::string& html) {
  static const std::set<std::string> void_tags{"meta", "img", "br", "hr", "link", "input", "!doctype"};
  const std::regex tag(R"(<(/?)([A-Za-z!][A-Za-z0-9]*)[^>]*?(/?)>)");
  std::vector<std::string> stack;
  for (auto it = std::sregex_iterator(html.begin(), html.end(), tag); it != std::sregex_iterator(); ++it) {
    std::string name = (*it)[2];
    std::transform(name.begin(), name.end(), name.begin(), ::tolower);
    if (void_tags.count(name) || (*it)[3] == "/") continue;
    if ((*it)[1] == "/") {
      if (stack.empty() || stack.back() != name) {
        return ::testing::AssertionFailure() << "</" << name << "> closes <" << (stack.empty() ? "" : stack.back())
                                             << "> at offset " << it->position();
      }
      stack.pop_back();
    } else {
      stack.push_back(name);
    }
  }
  if (!stack.empty()) return ::testing::AssertionFailure() << "<" << stack.back() << "> never closed";
  return ::testing::AssertionSuccess();
}

/// Every src/href of the page, and every url(...) of its style.
std::vector<std::string> references(const std::string& html) {
  std::vector<std::string> out;
  const std::regex attr(R"((?:src|href)\s*=\s*"([^"]*)\")");
  for (auto it = std::sregex_iterator(html.begin(), html.end(), attr); it != std::sregex_iterator(); ++it) out.push_back((*it)[1]);
  const std::regex url(R"(url\(([^)]*)\))");
  for (auto it = std::sregex_iterator(html.begin(), html.end(), url); it != std::sregex_iterator(); ++it) out.push_back((*it)[1]);
  return out;
}

int count(const std::string& s, const std::string& what) {
  int n = 0;
  for (auto p = s.find(what); p != std::string::npos; p = s.find(what, p + 1)) ++n;
  return n;
}

/// The report of the solved case, with pictures, in its own folder.
fs::path write_case_report(const std::string& name) {
  const Solved& s = solved();
  const fs::path dir = s.dir / name;
  fs::create_directories(dir);
  ReportInputs in;
  in.title = s.c.title;
  in.pictures.resize(1);
  for (std::size_t m = 0; m < s.sol.modes.size(); ++m) {
    char stem[32];
    std::snprintf(stem, sizeof stem, "mode_%02zu", m + 1);
    in.pictures[0].push_back(write_mode_pictures(s.mesh, *s.sol.modes[m].fields, {}, dir, stem));
  }
  std::vector<double> index;
  for (int t = 0; t < s.mesh.n_triangles(); ++t) {
    index.push_back(s.c.find_material(s.mesh.regions[s.mesh.triangle_region[t]].material)->max_index(s.c.wavelength_um));
  }
  write_index_png(s.mesh, index, {}, dir / "mesh_index.png");
  in.mesh_picture = "mesh_index.png";
  write_report_html(s.run, in, dir / "report.html");
  return dir / "report.html";
}

struct Browser {
  int status = -1;
  std::string dom, log;
};

/// Loads a local page in headless Chromium (flags as docs of the machine set: no GPU, no network
/// services) and returns the DOM after the load event and the browser's log.
Browser chromium_dump(const fs::path& page) {
  const fs::path work = page.parent_path() / ("chromium-" + page.stem().string());
  fs::create_directories(work);
  const std::string cmd =
      "timeout 60 /usr/bin/chromium --headless --no-sandbox --disable-gpu --disable-quic --no-first-run "
      "--disable-background-networking --disable-component-update --disable-sync --enable-logging=stderr --v=0 "
      "--virtual-time-budget=5000 --user-data-dir=" + (work / "profile").string() + " --dump-dom file://" +
      fs::absolute(page).string() + " >" + (work / "dom").string() + " 2>" + (work / "log").string();
  Browser b;
  const int raw = std::system(cmd.c_str());
  b.status = WIFEXITED(raw) ? WEXITSTATUS(raw) : -1;
  auto slurp = [](const fs::path& p) {
    std::ifstream f(p);
    std::stringstream ss;
    ss << f.rdbuf();
    return ss.str();
  };
  b.dom = slurp(work / "dom");
  b.log = slurp(work / "log");
  return b;
}

/// A copy of the page (same folder, so relative pictures resolve) with a probe script that puts
/// the number of decoded images and table rows into the title once the page has loaded.
fs::path with_probe(const fs::path& page) {
  std::ifstream f(page);
  std::stringstream ss;
  ss << f.rdbuf();
  std::string html = ss.str();
  const std::string probe =
      "<script>addEventListener('load', () => { const im = [...document.images]; "
      "const ok = im.filter(i => i.complete && i.naturalWidth > 0).length; "
      "document.title = 'probe images ' + ok + '/' + im.length + ' rows ' + "
      "document.querySelectorAll('table.modes tbody tr').length; });</script>\n";
  const auto at = html.rfind("</body>");
  html.insert(at == std::string::npos ? html.size() : at, probe);
  const fs::path out = page.parent_path() / (page.stem().string() + "_probe.html");
  std::ofstream(out) << html;
  return out;
}

std::vector<std::string> console_lines(const std::string& log) {
  std::vector<std::string> out;
  std::istringstream in(log);
  for (std::string line; std::getline(in, line);) {
    if (line.find("CONSOLE") != std::string::npos || line.find("Uncaught") != std::string::npos) out.push_back(line);
  }
  return out;
}

}  // namespace

TEST(ReportPage, IsWellFormedAndReferencesOnlyItsOwnFolder) {
  const fs::path page = write_case_report("static");
  std::ifstream f(page);
  std::stringstream ss;
  ss << f.rdbuf();
  const std::string html = ss.str();
  EXPECT_EQ(html.rfind("<!DOCTYPE html>", 0), 0u);
  EXPECT_TRUE(balanced_tags(html));
  const auto refs = references(html);
  EXPECT_EQ(refs.size(), 5u) << "two pictures per mode and the index map";
  for (const auto& r : refs) {
    EXPECT_EQ(r.find(':'), std::string::npos) << r << ": no scheme (http:, data:, file:)";
    EXPECT_NE(r.front(), '/') << r;
    EXPECT_TRUE(fs::is_regular_file(page.parent_path() / r)) << r;
  }
  EXPECT_EQ(count(html, "<script"), 0);
  EXPECT_EQ(count(html, "<link"), 0);
  // Summary and table: one row per mode, metric units in the column headers.
  const Solved& s = solved();
  EXPECT_NE(html.find(s.c.title), std::string::npos);
  EXPECT_NE(html.find(std::to_string(s.sol.n_dofs)), std::string::npos);
  EXPECT_NE(html.find("1.55 µm"), std::string::npos);
  const auto body = html.substr(html.find("<table class=\"modes\">"));
  EXPECT_EQ(count(body.substr(0, body.find("</table>")), "<tr>"), 1 + static_cast<int>(s.sol.modes.size()));
  EXPECT_NE(html.find("effective area (µm²)"), std::string::npos);
  EXPECT_NE(html.find("beta (1/µm)"), std::string::npos);
  char n_eff[32];
  std::snprintf(n_eff, sizeof n_eff, "%.10f", s.sol.modes[0].mode.n_eff);
  EXPECT_NE(html.find(n_eff), std::string::npos);
}

TEST(ReportPage, MetricHeadingsCarryTheirUnits) {
  EXPECT_EQ(metric_heading("effective_area_um2"), "effective area (µm²)");
  EXPECT_EQ(metric_heading("beta_per_um"), "beta (1/µm)");
  EXPECT_EQ(metric_heading("dispersion_slope_ps_per_nm2_km"), "dispersion slope (ps/(nm²·km))");
  EXPECT_EQ(metric_heading("dispersion_ps_per_nm_km"), "dispersion (ps/(nm·km))");
  EXPECT_EQ(metric_heading("bend_loss_db_per_90deg"), "bend loss (dB per 90°)");
  EXPECT_EQ(metric_heading("nonlinear_coefficient_per_w_km"), "nonlinear coefficient (1/(W·km))");
  EXPECT_EQ(metric_heading("beat_length_mm"), "beat length (mm)");
  EXPECT_EQ(metric_heading("coupling_length_m"), "coupling length (m)");
  EXPECT_EQ(metric_heading("te_fraction"), "TE fraction");
  EXPECT_EQ(metric_heading("mfd_petermann_x_um"), "MFD Petermann x (µm)");
  EXPECT_EQ(metric_heading("width_1e2_y_um"), "width 1/e² y (µm)");
}

TEST(ReportPage, SweepPlotsDrawEveryTrackAtItsValues) {
  // A sweep of our own, values of the shape of a single-mode fibre: two tracks over five points.
  RunResult run;
  run.case_path = "sweep.toml";
  for (int p = 0; p < 5; ++p) {
    PointResult pt;
    pt.wavelength_um = 1.3 + 0.1 * p;
    for (int t = 1; t <= 2; ++t) {
      ModeRow row;
      row.n_eff = 1.45 - 0.002 * p - 0.0001 * t;
      row.label = t == 1 ? "HE11x" : "HE11y";
      row.metrics = {{"track", t}, {"n_group", 1.468 + 0.0002 * p}};
      if (p > 0 && p < 4) row.metrics.push_back({"dispersion_ps_per_nm_km", -5.0 + 6.0 * p});
      pt.modes.push_back(row);
    }
    run.points.push_back(pt);
  }
  run.zero_dispersion.push_back({1, 1.383, 0.06});
  const std::string html = report_html(run, {});
  EXPECT_TRUE(balanced_tags(html));
  EXPECT_EQ(count(html, "<svg"), 3);
  EXPECT_EQ(count(html, "<polyline"), 6);
  EXPECT_EQ(count(html, "<circle"), 5 * 2 + 5 * 2 + 3 * 2);
  EXPECT_NE(html.find("1.38300"), std::string::npos);
  // The first n_eff polyline: x grows with λ and y (SVG rows grow downwards) with falling n_eff,
  // both linearly in these data.
  const auto at = html.find("<polyline");
  const auto pts = html.substr(html.find("points=\"", at) + 8);
  std::istringstream in(pts.substr(0, pts.find('"')));
  std::vector<std::pair<double, double>> xy;
  for (std::string pair; in >> pair;) xy.push_back({std::stod(pair), std::stod(pair.substr(pair.find(',') + 1))});
  ASSERT_EQ(xy.size(), 5u);
  for (std::size_t k = 1; k < xy.size(); ++k) {
    // Coordinates are written with 6 significant digits.
    EXPECT_NEAR(xy[k].first - xy[k - 1].first, xy[1].first - xy[0].first, 1e-3);
    EXPECT_NEAR(xy[k].second - xy[k - 1].second, xy[1].second - xy[0].second, 1e-3);
    EXPECT_GT(xy[k].second, xy[k - 1].second);
  }
  // A table row per (point, mode).
  const auto body = html.substr(html.find("<table class=\"modes\">"));
  EXPECT_EQ(count(body.substr(0, body.find("</table>")), "<tr>"), 1 + 10);
}

TEST(ReportPage, LoadsInHeadlessChromiumWithEveryImageAndNoConsoleMessage) {
  if (!fs::exists("/usr/bin/chromium")) GTEST_SKIP() << "Debian chromium is not installed (setup.sh installs it)";
  const fs::path page = write_case_report("browser");
  const Browser b = chromium_dump(with_probe(page));
  ASSERT_EQ(b.status, 0) << b.log;
  EXPECT_NE(b.dom.find("<title>probe images 5/5 rows 2</title>"), std::string::npos)
      << "title after load: " << b.dom.substr(b.dom.find("<title>"), 60);
  EXPECT_EQ(console_lines(b.log), std::vector<std::string>{}) << b.log;
  const Solved& s = solved();
  EXPECT_NE(b.dom.find(s.sol.modes[1].label), std::string::npos);

  // The same probe on a page with a missing picture and a script error: the checks above see both.
  const fs::path broken = page.parent_path() / "broken.html";
  std::ofstream(broken) << "<!DOCTYPE html><html><head><title>x</title></head><body><img src=\"missing.png\">"
                           "<script>undefined_function();</script></body></html>";
  const Browser bb = chromium_dump(with_probe(broken));
  ASSERT_EQ(bb.status, 0) << bb.log;
  EXPECT_NE(bb.dom.find("<title>probe images 0/1 rows 0</title>"), std::string::npos) << bb.dom;
  EXPECT_FALSE(console_lines(bb.log).empty()) << bb.log;
}
