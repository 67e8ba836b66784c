#include "io/sweep.hpp"

#include <algorithm>
#include <cmath>
#include <map>
#include <sstream>

#include "io/json_writer.hpp"
#include "mesh/error.hpp"
#include "solver/group_index.hpp"

namespace cladwise::io {
namespace {

std::optional<double> metric(const SolvedMode& m, const std::string& key) {
  for (const auto& [k, v] : m.metrics) {
    if (k == key) return v;
  }
  return std::nullopt;
}

double overlap(const CaseSolution& a, int i, const CaseSolution& b, int j) {
  const Eigen::SparseMatrix<double>& g = b.transverse_gram;
  const int ne = static_cast<int>(g.rows());
  // Complex-solver modes: |x^H G y| / sqrt(x^H G x · y^H G y), blind to the arbitrary complex
  // scale of each eigenvector.
  const Eigen::VectorXcd& xc = a.modes[i].complex_eigenvector;
  const Eigen::VectorXcd& yc = b.modes[j].complex_eigenvector;
  if (ne > 0 && xc.size() >= ne && yc.size() >= ne) {
    const Eigen::VectorXcd xt = xc.head(ne), yt = yc.head(ne);
    const Eigen::VectorXcd gx = g * xt, gy = g * yt;
    const double xy = std::abs(xt.dot(gy));  // Eigen's dot conjugates the first factor
    const double xx = std::abs(xt.dot(gx)), yy = std::abs(yt.dot(gy));
    return xy / std::sqrt(xx * yy);
  }
  const Eigen::VectorXd& x = a.modes[i].mode.eigenvector;
  const Eigen::VectorXd& y = b.modes[j].mode.eigenvector;
  if (ne == 0 || x.size() < ne || y.size() < ne) {
    // No fields to compare: nearest effective index.
    return 1.0 / (1.0 + 1e6 * std::abs(a.modes[i].mode.n_eff - b.modes[j].mode.n_eff));
  }
  const auto xt = x.head(ne), yt = y.head(ne);
  const double xy = xt.dot(g * yt), xx = xt.dot(g * xt), yy = yt.dot(g * yt);
  return std::abs(xy) / std::sqrt(std::abs(xx) * std::abs(yy));
}

}  // namespace

std::vector<std::vector<int>> track_modes(const std::vector<CaseSolution>& points) {
  std::vector<std::vector<int>> track(points.size());
  int next = 1;
  for (std::size_t p = 0; p < points.size(); ++p) {
    const int n = static_cast<int>(points[p].modes.size());
    track[p].assign(n, 0);
    if (p == 0) {
      for (int m = 0; m < n; ++m) track[p][m] = next++;
      continue;
    }
    const int n_prev = static_cast<int>(points[p - 1].modes.size());
    std::vector<std::tuple<double, int, int>> pairs;
    for (int i = 0; i < n_prev; ++i) {
      for (int j = 0; j < n; ++j) pairs.emplace_back(overlap(points[p - 1], i, points[p], j), i, j);
    }
    std::sort(pairs.begin(), pairs.end(), [](const auto& a, const auto& b) { return std::get<0>(a) > std::get<0>(b); });
    std::vector<bool> used_prev(n_prev, false);
    for (const auto& [o, i, j] : pairs) {
      if (used_prev[i] || track[p][j] != 0) continue;
      used_prev[i] = true;
      track[p][j] = track[p - 1][i];
    }
    for (int m = 0; m < n; ++m) {
      if (track[p][m] == 0) track[p][m] = next++;
    }
  }
  return track;
}

std::vector<ZeroDispersion> add_dispersion(std::vector<CaseSolution>& points,
                                           const std::vector<std::vector<int>>& tracks) {
  // Every track: its (point, mode) positions in wavelength order.
  std::map<int, std::vector<std::pair<int, int>>> members;
  for (std::size_t p = 0; p < points.size(); ++p) {
    for (std::size_t m = 0; m < points[p].modes.size(); ++m) {
      members[tracks[p][m]].push_back({static_cast<int>(p), static_cast<int>(m)});
      points[p].modes[m].metrics.push_back({"track", static_cast<double>(tracks[p][m])});
    }
  }
  std::vector<ZeroDispersion> zeros;
  for (const auto& [t, list] : members) {
    std::vector<double> lam, dval, sval;
    for (std::size_t k = 1; k + 1 < list.size(); ++k) {
      // Only consecutive sweep points form a stencil.
      if (list[k - 1].first + 1 != list[k].first || list[k].first + 1 != list[k + 1].first) continue;
      auto& mid = points[list[k].first].modes[list[k].second];
      const auto ng0 = metric(points[list[k - 1].first].modes[list[k - 1].second], "n_group");
      const auto ng1 = metric(mid, "n_group");
      const auto ng2 = metric(points[list[k + 1].first].modes[list[k + 1].second], "n_group");
      if (!ng0 || !ng1 || !ng2) continue;
      const double x0 = points[list[k - 1].first].wavelength_um, x1 = points[list[k].first].wavelength_um,
                   x2 = points[list[k + 1].first].wavelength_um;
      const double h0 = x1 - x0, h1 = x2 - x1;
      // 3-point derivatives on an uneven grid (second-order accurate for the first derivative).
      const double d1 = (h0 * h0 * *ng2 - h1 * h1 * *ng0 + (h1 * h1 - h0 * h0) * *ng1) / (h0 * h1 * (h0 + h1));
      const double d2 = 2.0 * (h0 * *ng2 - (h0 + h1) * *ng1 + h1 * *ng0) / (h0 * h1 * (h0 + h1));
      const double d = dispersion_from_group_index_slope(d1);
      const double s = dispersion_from_group_index_slope(d2) / 1000.0;  // per µm -> per nm
      mid.metrics.push_back({"dispersion_ps_per_nm_km", d});
      mid.metrics.push_back({"dispersion_slope_ps_per_nm2_km", s});
      lam.push_back(x1);
      dval.push_back(d);
      sval.push_back(s);
    }
    for (std::size_t k = 1; k < lam.size(); ++k) {
      if ((dval[k - 1] < 0) != (dval[k] < 0)) {
        const double f = dval[k - 1] / (dval[k - 1] - dval[k]);
        zeros.push_back({t, lam[k - 1] + f * (lam[k] - lam[k - 1]), sval[k - 1] + f * (sval[k] - sval[k - 1])});
      }
    }
  }
  return zeros;
}

std::string sweep_csv(const std::vector<CaseSolution>& points, const std::vector<std::vector<int>>& tracks) {
  std::ostringstream o;
  o << "wavelength_um,track,label,n_eff,n_eff_imag,loss_db_per_m,n_group,dispersion_ps_per_nm_km,"
       "dispersion_slope_ps_per_nm2_km\n";
  auto num = [](std::optional<double> v) { return v && std::isfinite(*v) ? JsonWriter::number(*v) : std::string(); };
  for (std::size_t p = 0; p < points.size(); ++p) {
    std::vector<std::size_t> order(points[p].modes.size());
    for (std::size_t m = 0; m < order.size(); ++m) order[m] = m;
    std::sort(order.begin(), order.end(), [&](auto a, auto b) { return tracks[p][a] < tracks[p][b]; });
    for (std::size_t m : order) {
      const auto& mode = points[p].modes[m];
      std::string label = mode.label;
      if (label.find_first_of(",\"") != std::string::npos) label = "\"" + label + "\"";
      o << JsonWriter::number(points[p].wavelength_um) << ',' << tracks[p][m] << ',' << label << ','
        << JsonWriter::number(mode.mode.n_eff) << ',' << JsonWriter::number(mode.n_eff_imag) << ','
        << JsonWriter::number(mode.loss_db_per_m) << ',' << num(metric(mode, "n_group")) << ','
        << num(metric(mode, "dispersion_ps_per_nm_km")) << ','
        << num(metric(mode, "dispersion_slope_ps_per_nm2_km")) << '\n';
    }
  }
  return o.str();
}

CutoffSearchResult case_cutoff(const CaseSpec& c, const Mesh& mesh, int mode_index, double start_um, double max_um) {
  if (c.import) {
    throw InputError(c.path.string(), "a cutoff search needs the background material of [domain]; an imported geometry has none");
  }
  CaseSpec at_start = c;
  at_start.wavelength_um = start_um;
  if (needs_complex_solver(at_start, mesh)) {
    throw InputError(c.path.string(), "a cutoff search needs a lossless case without PML or bend (the mode must meet the cladding index on the real axis)");
  }
  const MaterialSpec* background = c.find_material(c.geometry.background_material);
  if (!background) {
    throw InputError(c.path.string(), "[domain] material '" + c.geometry.background_material + "' is not defined");
  }
  CutoffSearchRequest r;
  r.start_wavelength_um = start_um;
  r.max_wavelength_um = max_um;
  r.mode_index = mode_index;
  r.background_index = [background](double lam) { return background->max_index(lam); };
  auto problem = [&c, &mesh](double lam) {
    CaseSpec ci = c;
    ci.wavelength_um = lam;
    return mode_problem(ci, mesh);
  };
  return find_cutoff_wavelength(problem, r);
}

}  // namespace cladwise::io
