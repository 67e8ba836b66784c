// The report page (report_html.hpp): hand-written HTML and SVG markup, escaped text, numbers in
// fixed formats. The SVG plots are drawn here too: axes with round ticks, one polyline per
// tracked mode.
#include "io/report_html.hpp"

#include <algorithm>
#include <cassert>
#include <cmath>
#include <cstdio>
#include <fstream>
#include <map>
#include <optional>
#include <regex>
#include <set>
#include <sstream>

#include "mesh/error.hpp"

namespace cladwise::io {

namespace {

std::string escape(const std::string& s) {
  std::string o;
  o.reserve(s.size());
  for (char c : s) {
    switch (c) {
      case '&': o += "&amp;"; break;
      case '<': o += "&lt;"; break;
      case '>': o += "&gt;"; break;
      case '"': o += "&quot;"; break;
      case '\'': o += "&#39;"; break;
      default: o += c;
    }
  }
  return o;
}

std::string fmt(const char* f, double v) {
  if (!std::isfinite(v)) return "–";
  char buf[64];
  std::snprintf(buf, sizeof buf, f, v);
  return buf;
}

/// A picture name the page may reference: relative, inside the folder, no scheme.
[[maybe_unused]] bool is_local_name(const std::string& name) {
  if (name.empty() || name.find("://") != std::string::npos || name.front() == '/') return false;
  return name.find("..") == std::string::npos;
}

std::optional<double> metric(const ModeRow& row, const std::string& key) {
  for (const auto& [k, v] : row.metrics) {
    if (k == key) return v;
  }
  return std::nullopt;
}

// Page style: our own plain design; system fonts, light rules, numbers in tabular figures.
constexpr const char* k_style = R"css(
body { font-family: system-ui, sans-serif; color: #222; background: #fcfcfa; margin: 0; }
main { max-width: 1180px; margin: 0 auto; padding: 1.2rem 1.5rem 3rem; }
h1 { font-size: 1.5rem; margin: 0.4rem 0 0.2rem; color: #1d3b53; }
h2 { font-size: 1.15rem; margin: 2rem 0 0.6rem; color: #1d3b53; border-bottom: 2px solid #d6dde3; padding-bottom: 0.2rem; }
p.sub { margin: 0; color: #666; font-size: 0.9rem; }
table { border-collapse: collapse; font-size: 0.86rem; }
th, td { padding: 0.25rem 0.6rem; border-bottom: 1px solid #e2e2de; text-align: right; white-space: nowrap; }
th { background: #eef2f5; font-weight: 600; vertical-align: bottom; white-space: normal; max-width: 9rem; }
td.text, th.text { text-align: left; }
td { font-variant-numeric: tabular-nums; }
table.summary th { text-align: left; background: none; font-weight: normal; color: #555; }
table.summary td { text-align: left; }
div.scroll { overflow-x: auto; }
ul.warnings { background: #fff6e0; border-left: 4px solid #d9a400; padding: 0.5rem 0.5rem 0.5rem 2rem; }
div.pictures { display: flex; flex-wrap: wrap; gap: 1rem; }
figure { margin: 0; background: #fff; border: 1px solid #e2e2de; padding: 0.5rem; flex: 0 1 500px; }
figure img { display: block; width: 100%; height: auto; }
figcaption { font-size: 0.82rem; color: #444; margin-top: 0.35rem; }
div.plots { display: flex; flex-wrap: wrap; gap: 1rem; }
svg text { font-family: system-ui, sans-serif; font-size: 11px; fill: #333; }
footer { margin-top: 2.5rem; font-size: 0.8rem; color: #777; }
)css";

// ---- SVG line plots --------------------------------------------------------------------------

struct Series {
  std::string name;
  std::vector<std::pair<double, double>> xy;
};

/// Round tick positions (1, 2 or 5 × 10^k apart) covering [lo, hi] with about `n` intervals.
std::vector<double> ticks(double lo, double hi, int n) {
  const double raw = (hi - lo) / n;
  const double decade = std::pow(10.0, std::floor(std::log10(raw)));
  double step = decade;
  for (double f : {1.0, 2.0, 5.0, 10.0}) {
    if (f * decade >= raw) {
      step = f * decade;
      break;
    }
  }
  std::vector<double> t;
  for (double v = std::ceil(lo / step - 1e-9) * step; v <= hi + 1e-9 * step; v += step) {
    t.push_back(std::abs(v) < 1e-12 * step ? 0.0 : v);
  }
  return t;
}

const char* track_colour(std::size_t k) {
  static const char* palette[] = {"#2b5c9e", "#c8553d", "#3a8f5c", "#8a5fb5", "#b08a2e", "#3b9bb0", "#b33f74", "#555555"};
  return palette[k % 8];
}

std::string svg_plot(const std::string& title, const std::string& y_label, const std::vector<Series>& series) {
  double x0 = 1e300, x1 = -1e300, y0 = 1e300, y1 = -1e300;
  for (const auto& s : series) {
    for (const auto& [x, y] : s.xy) {
      x0 = std::min(x0, x), x1 = std::max(x1, x);
      y0 = std::min(y0, y), y1 = std::max(y1, y);
    }
  }
  if (x0 > x1) return "";
  if (x1 - x0 < 1e-12) x0 -= 0.01, x1 += 0.01;
  const double pad = y1 - y0 > 1e-15 * std::max(1.0, std::abs(y1)) ? 0.06 * (y1 - y0) : 1e-3 * std::max(1.0, std::abs(y1));
  y0 -= pad, y1 += pad;
  const int w = 540, h = 320, left = 78, right = 110, top = 28, bottom = 46;
  const int pw = w - left - right, ph = h - top - bottom;
  auto sx = [&](double x) { return left + (x - x0) / (x1 - x0) * pw; };
  auto sy = [&](double y) { return top + (y1 - y) / (y1 - y0) * ph; };
  std::ostringstream o;
  o << "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"" << w << "\" height=\"" << h << "\" viewBox=\"0 0 " << w << ' '
    << h << "\" role=\"img\" aria-label=\"" << escape(title) << "\">\n";
  o << "<rect x=\"0\" y=\"0\" width=\"" << w << "\" height=\"" << h << "\" fill=\"#ffffff\"/>\n";
  o << "<text x=\"" << left << "\" y=\"17\" style=\"font-size:13px;font-weight:600\">" << escape(title) << "</text>\n";
  for (double t : ticks(y0, y1, 5)) {
    o << "<line x1=\"" << left << "\" x2=\"" << left + pw << "\" y1=\"" << sy(t) << "\" y2=\"" << sy(t)
      << "\" stroke=\"#e4e4e4\"/>\n";
    o << "<text x=\"" << left - 6 << "\" y=\"" << sy(t) + 4 << "\" text-anchor=\"end\">" << fmt("%.6g", t) << "</text>\n";
  }
  for (double t : ticks(x0, x1, 6)) {
    o << "<line x1=\"" << sx(t) << "\" x2=\"" << sx(t) << "\" y1=\"" << top + ph << "\" y2=\"" << top + ph + 5
      << "\" stroke=\"#555\"/>\n";
    o << "<text x=\"" << sx(t) << "\" y=\"" << top + ph + 18 << "\" text-anchor=\"middle\">" << fmt("%.6g", t) << "</text>\n";
  }
  o << "<rect x=\"" << left << "\" y=\"" << top << "\" width=\"" << pw << "\" height=\"" << ph
    << "\" fill=\"none\" stroke=\"#555\"/>\n";
  o << "<text x=\"" << left + pw / 2 << "\" y=\"" << h - 8 << "\" text-anchor=\"middle\">wavelength (µm)</text>\n";
  o << "<text transform=\"translate(14 " << top + ph / 2 << ") rotate(-90)\" text-anchor=\"middle\">" << escape(y_label)
    << "</text>\n";
  for (std::size_t k = 0; k < series.size(); ++k) {
    const auto& s = series[k];
    if (s.xy.empty()) continue;
    o << "<polyline fill=\"none\" stroke-width=\"1.8\" stroke=\"" << track_colour(k) << "\" points=\"";
    for (const auto& [x, y] : s.xy) o << sx(x) << ',' << sy(y) << ' ';
    o << "\"/>\n";
    for (const auto& [x, y] : s.xy) {
      o << "<circle r=\"2.6\" fill=\"" << track_colour(k) << "\" cx=\"" << sx(x) << "\" cy=\"" << sy(y) << "\"/>\n";
    }
    const int ly = top + 10 + 16 * static_cast<int>(k);
    o << "<line x1=\"" << left + pw + 12 << "\" x2=\"" << left + pw + 30 << "\" y1=\"" << ly << "\" y2=\"" << ly
      << "\" stroke-width=\"2\" stroke=\"" << track_colour(k) << "\"/>\n";
    o << "<text x=\"" << left + pw + 35 << "\" y=\"" << ly + 4 << "\">" << escape(s.name) << "</text>\n";
  }
  o << "</svg>\n";
  return o.str();
}

// ---- tables ----------------------------------------------------------------------------------

/// Every metric key of the run in order of first appearance, without those shown as own columns.
std::vector<std::string> metric_keys(const RunResult& run) {
  std::vector<std::string> keys;
  std::set<std::string> seen{"track"};
  for (const auto& p : run.points) {
    for (const auto& m : p.modes) {
      for (const auto& [k, v] : m.metrics) {
        if (seen.insert(k).second) keys.push_back(k);
      }
    }
  }
  return keys;
}

void mode_table(std::ostringstream& o, const RunResult& run) {
  const bool sweep = run.points.size() > 1;
  bool lossy = false;
  for (const auto& p : run.points) {
    for (const auto& m : p.modes) lossy = lossy || m.n_eff_imag > 0;
  }
  const auto keys = metric_keys(run);
  o << "<div class=\"scroll\"><table class=\"modes\">\n<thead><tr>";
  if (sweep) o << "<th>wavelength (µm)</th><th>track</th>";
  o << "<th>mode</th><th class=\"text\">label</th><th title=\"n_eff\">effective index</th>";
  if (lossy) o << "<th title=\"n_eff_imag\">|Im n_eff|</th><th title=\"loss_db_per_m\">loss (dB/m)</th>";
  o << "<th title=\"residual\">relative residual</th>";
  for (const auto& k : keys) o << "<th title=\"" << escape(k) << "\">" << escape(metric_heading(k)) << "</th>";
  o << "</tr></thead>\n<tbody>\n";
  for (const auto& p : run.points) {
    for (std::size_t m = 0; m < p.modes.size(); ++m) {
      const auto& row = p.modes[m];
      o << "<tr>";
      if (sweep) {
        o << "<td>" << fmt("%.4f", p.wavelength_um) << "</td><td>"
          << fmt("%.0f", metric(row, "track").value_or(static_cast<double>(m + 1))) << "</td>";
      }
      o << "<td>" << m + 1 << "</td><td class=\"text\">" << escape(row.label) << "</td><td>" << fmt("%.10f", row.n_eff)
        << "</td>";
      if (lossy) o << "<td>" << fmt("%.4e", row.n_eff_imag) << "</td><td>" << fmt("%.6g", row.loss_db_per_m) << "</td>";
      o << "<td>" << fmt("%.2e", row.residual) << "</td>";
      for (const auto& k : keys) {
        const auto v = metric(row, k);
        o << "<td>" << (v ? fmt("%.6g", *v) : std::string("")) << "</td>";
      }
      o << "</tr>\n";
    }
  }
  o << "</tbody></table></div>\n";
}

void summary_table(std::ostringstream& o, const RunResult& run) {
  auto row = [&](const std::string& k, const std::string& v) {
    o << "<tr><th>" << escape(k) << "</th><td>" << escape(v) << "</td></tr>\n";
  };
  o << "<table class=\"summary\">\n";
  row("case file", run.case_path);
  std::string wl;
  if (run.points.size() == 1) {
    wl = fmt("%.6g", run.points.front().wavelength_um) + " µm";
  } else if (!run.points.empty()) {
    wl = fmt("%.6g", run.points.front().wavelength_um) + " – " + fmt("%.6g", run.points.back().wavelength_um) +
         " µm, " + std::to_string(run.points.size()) + " points";
  }
  row("wavelength", wl);
  row("mesh", std::to_string(run.n_triangles) + " triangles, order " + std::to_string(run.order));
  row("unknowns", std::to_string(run.n_dofs));
  row("time", "mesh " + fmt("%.2f", run.mesh_s) + " s · assembly " + fmt("%.2f", run.assembly_s) +
                  " s · factorisation " + fmt("%.2f", run.factorization_s) + " s · eigensolve " +
                  fmt("%.2f", run.eigensolve_s) + " s · total " + fmt("%.2f", run.total_s) + " s");
  o << "</table>\n";
}

void sweep_plots(std::ostringstream& o, const RunResult& run) {
  // One series per track, in the order the tracks first appear.
  std::map<int, std::size_t> slot;
  std::vector<Series> n_eff, n_group, disp;
  for (const auto& p : run.points) {
    for (std::size_t m = 0; m < p.modes.size(); ++m) {
      const auto& row = p.modes[m];
      const int t = static_cast<int>(std::lround(metric(row, "track").value_or(static_cast<double>(m + 1))));
      if (!slot.count(t)) {
        slot[t] = n_eff.size();
        const std::string name = "track " + std::to_string(t) + (row.label.empty() ? "" : " " + row.label);
        n_eff.push_back({name, {}});
        n_group.push_back({name, {}});
        disp.push_back({name, {}});
      }
      const std::size_t k = slot[t];
      n_eff[k].xy.push_back({p.wavelength_um, row.n_eff});
      if (auto g = metric(row, "n_group")) n_group[k].xy.push_back({p.wavelength_um, *g});
      if (auto d = metric(row, "dispersion_ps_per_nm_km")) disp[k].xy.push_back({p.wavelength_um, *d});
    }
  }
  o << "<h2>Sweep</h2>\n<div class=\"plots\">\n";
  o << svg_plot("Effective index", "n_eff", n_eff);
  o << svg_plot("Group index", "n_g", n_group);
  o << svg_plot("Chromatic dispersion", "D (ps/(nm·km))", disp);
  o << "</div>\n";
  if (!run.zero_dispersion.empty()) {
    o << "<h2>Zero-dispersion wavelengths</h2>\n<table class=\"modes\">\n<thead><tr><th>track</th>"
         "<th>wavelength (µm)</th><th>dispersion slope (ps/(nm²·km))</th></tr></thead>\n<tbody>\n";
    for (const auto& z : run.zero_dispersion) {
      o << "<tr><td>" << z.track << "</td><td>" << fmt("%.5f", z.wavelength_um) << "</td><td>"
        << fmt("%.4g", z.slope_ps_per_nm2_km) << "</td></tr>\n";
    }
    o << "</tbody></table>\n";
  }
}

void core_pair_table(std::ostringstream& o, const RunResult& run) {
  bool any = false;
  for (const auto& p : run.points) any = any || !p.core_pairs.empty();
  if (!any) return;
  o << "<h2>Core coupling</h2>\n<table class=\"modes\">\n<thead><tr><th>wavelength (µm)</th><th>polarisation</th>"
       "<th>cores</th><th>distance (µm)</th><th>κ (1/m)</th><th>coupling length (m)</th></tr></thead>\n<tbody>\n";
  for (const auto& p : run.points) {
    for (const auto& c : p.core_pairs) {
      o << "<tr><td>" << fmt("%.4f", p.wavelength_um) << "</td><td>" << escape(std::string(1, c.polarisation))
        << "</td><td>" << c.core_a << " – " << c.core_b << "</td><td>" << fmt("%.4f", c.distance_um) << "</td><td>"
        << fmt("%.6g", c.kappa_per_m) << "</td><td>" << fmt("%.6g", c.coupling_length_m) << "</td></tr>\n";
    }
  }
  o << "</tbody></table>\n";
}

void figure(std::ostringstream& o, const std::string& file, const std::string& alt, const std::string& caption) {
  assert(is_local_name(file) && "report pictures are relative names inside the report folder");
  o << "<figure><img src=\"" << escape(file) << "\" alt=\"" << escape(alt) << "\"><figcaption>" << escape(caption)
    << "</figcaption></figure>\n";
}

void pictures(std::ostringstream& o, const RunResult& run, const ReportInputs& in) {
  const bool sweep = run.points.size() > 1;
  bool any = !in.mesh_picture.empty();
  for (const auto& p : in.pictures) {
    for (const auto& f : p) any = any || !f.intensity.empty() || !f.polarisation.empty();
  }
  if (!any) return;
  o << "<h2>Mode pictures</h2>\n<p class=\"sub\">Intensity normalised to its peak (colour bar 0–1); the "
       "polarisation pictures draw the direction and relative size of Re E<sub>t</sub> as line segments. "
       "Grey lines are the region outlines.</p>\n";
  for (std::size_t p = 0; p < run.points.size() && p < in.pictures.size(); ++p) {
    for (std::size_t m = 0; m < run.points[p].modes.size() && m < in.pictures[p].size(); ++m) {
      const auto& f = in.pictures[p][m];
      if (f.intensity.empty() && f.polarisation.empty()) continue;
      const auto& row = run.points[p].modes[m];
      std::string what = "mode " + std::to_string(m + 1) + (row.label.empty() ? "" : " (" + row.label + ")");
      if (sweep) what += " at " + fmt("%.4f", run.points[p].wavelength_um) + " µm";
      what += ", n_eff = " + fmt("%.8f", row.n_eff);
      o << "<div class=\"pictures\">\n";
      if (!f.intensity.empty()) figure(o, f.intensity, "intensity of " + what, "Intensity, " + what);
      if (!f.polarisation.empty()) figure(o, f.polarisation, "polarisation of " + what, "Polarisation, " + what);
      o << "</div>\n<p></p>\n";
    }
  }
  if (!in.mesh_picture.empty()) {
    o << "<h2>Mesh and refractive index</h2>\n<div class=\"pictures\">\n";
    figure(o, in.mesh_picture, "mesh coloured by refractive index",
           "Mesh, " + std::to_string(run.n_triangles) + " triangles, coloured by refractive index");
    o << "</div>\n";
  }
}

}  // namespace

std::string metric_heading(const std::string& key) {
  // Longest suffixes first: "_per_um" must not be read as "_um".
  static const std::pair<const char*, const char*> units[] = {
      {"_ps_per_nm2_km", "ps/(nm²·km)"}, {"_ps_per_nm_km", "ps/(nm·km)"}, {"_per_w_km", "1/(W·km)"},
      {"_db_per_90deg", "dB per 90°"},  {"_db_per_turn", "dB per turn"}, {"_db_per_m", "dB/m"},
      {"_m2_per_w", "m²/W"},             {"_per_um", "1/µm"},             {"_per_m", "1/m"},
      {"_um2", "µm²"},                   {"_um", "µm"},                   {"_mm", "mm"},
      {"_deg", "deg"},                   {"_m", "m"}};
  std::string stem = key, unit;
  for (const auto& [suffix, u] : units) {
    const std::string s = suffix;
    if (key.size() > s.size() && key.compare(key.size() - s.size(), s.size(), s) == 0) {
      stem = key.substr(0, key.size() - s.size());
      unit = u;
      break;
    }
  }
  // Words of the key as the trade writes them.
  static const std::map<std::string, std::string> words{
      {"mfd", "MFD"}, {"petermann", "Petermann"}, {"1e2", "1/e²"}, {"te", "TE"}, {"tm", "TM"}};
  std::string heading;
  std::istringstream parts(std::regex_replace(stem, std::regex("_"), " "));
  for (std::string w; parts >> w;) {
    const auto it = words.find(w);
    heading += (heading.empty() ? "" : " ") + (it == words.end() ? w : it->second);
  }
  return unit.empty() ? heading : heading + " (" + unit + ")";
}

std::string report_html(const RunResult& run, const ReportInputs& in) {
  std::string title = in.title;
  if (title.empty()) title = std::filesystem::path(run.case_path).filename().string();
  std::ostringstream o;
  o << "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n"
       "<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n<title>"
    << escape(title) << " · cladwise report</title>\n<style>" << k_style << "</style>\n</head>\n<body>\n<main>\n";
  o << "<h1>" << escape(title) << "</h1>\n<p class=\"sub\">cladwise " << escape(CLADWISE_VERSION)
    << " · full-vector finite-element modes of the cross-section</p>\n";
  o << "<h2>Case</h2>\n";
  summary_table(o, run);
  if (!in.warnings.empty()) {
    o << "<ul class=\"warnings\">\n";
    for (const auto& w : in.warnings) o << "<li>" << escape(w) << "</li>\n";
    o << "</ul>\n";
  }
  o << "<h2>Modes</h2>\n";
  mode_table(o, run);
  core_pair_table(o, run);
  if (run.points.size() > 1) sweep_plots(o, run);
  pictures(o, run, in);
  o << "<footer>Fields and metrics as in modes.json and modes.csv of this folder; units and conventions in "
       "docs/outputs.md.</footer>\n</main>\n</body>\n</html>\n";
  return o.str();
}

void write_report_html(const RunResult& run, const ReportInputs& inputs, const std::filesystem::path& path) {
  const std::string text = report_html(run, inputs);
  std::ofstream out(path, std::ios::binary);
  out << text;
  out.close();
  if (!out) throw ComputationError("could not write " + path.string() + " (is the folder writable?)");
}

}  // namespace cladwise::io
