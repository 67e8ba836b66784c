// Cutoff wavelength by a bracketing search on n_eff(λ) − n_clad(λ) of a tracked mode
// (solver/cutoff_search.hpp).
#include "solver/cutoff_search.hpp"

#include <algorithm>
#include <cmath>
#include <optional>

#include "mesh/error.hpp"
#include "solver/scalar_root.hpp"

namespace cladwise {

std::string_view to_string(CutoffStatus s) {
  switch (s) {
    case CutoffStatus::found: return "found";
    case CutoffStatus::not_guided_at_start: return "not_guided_at_start";
    case CutoffStatus::not_bracketed: return "not_bracketed";
    case CutoffStatus::lost_track: return "lost_track";
    case CutoffStatus::solve_failed: return "solve_failed";
    case CutoffStatus::max_solves_reached: return "max_solves_reached";
  }
  return "?";
}

namespace {

// Ends the search from inside the Brent iteration with a status.
struct SearchStopped {
  CutoffStatus status;
};

class TrackedSearch {
public:
  TrackedSearch(const ModeProblemAtWavelength& problem, const CutoffSearchRequest& r, CutoffSearchResult& out)
      : problem_(problem), request_(r), out_(out) {}

  // f(λ) = n_eff − n_clad of the followed mode; one eigensolve.
  double f(double lambda) {
    if (out_.n_solves >= request_.max_solves) throw SearchStopped{CutoffStatus::max_solves_reached};
    ModeProblem p = problem_(lambda);
    if (!solver_) {
      solver_ = std::make_unique<ModeSolver>(std::move(p));
    } else {
      solver_->set_wavelength(lambda, std::move(p.region_materials));
    }
    SolveRequest q;
    q.n_modes = request_.n_modes > 0 ? request_.n_modes : request_.mode_index + 6;
    const SolveResult res = solver_->solve(q);
    ++out_.n_solves;
    if (res.status != EigenStatus::converged) throw SearchStopped{CutoffStatus::solve_failed};
    const int ne = solver_->dof_map().n_edge_dofs();
    if (gram_.rows() == 0) gram_ = solver_->matrices().b.topLeftCorner(ne, ne);

    CutoffSample s;
    s.wavelength_um = lambda;
    s.background_index = request_.background_index(lambda);
    int pick = -1;
    if (tracked_.empty()) {
      if (request_.mode_index >= static_cast<int>(res.modes.size())) {
        throw SearchStopped{CutoffStatus::not_guided_at_start};
      }
      pick = request_.mode_index;
    } else {
      // Reference: the followed mode at the nearest wavelength solved so far.
      std::size_t ref = 0;
      for (std::size_t k = 1; k < tracked_.size(); ++k) {
        if (std::fabs(tracked_[k].first - lambda) < std::fabs(tracked_[ref].first - lambda)) ref = k;
      }
      const Eigen::VectorXd& x = tracked_[ref].second;
      const double xx = x.dot(gram_ * x);
      double best = -1.0;
      for (std::size_t j = 0; j < res.modes.size(); ++j) {
        const auto y = res.modes[j].eigenvector.head(ne);
        const double o = std::fabs(x.dot(gram_ * y)) / std::sqrt(xx * y.dot(gram_ * y));
        if (o > best) {
          best = o;
          pick = static_cast<int>(j);
        }
      }
      s.overlap = best;
      if (best < request_.min_overlap) {
        out_.samples.push_back(s);
        throw SearchStopped{CutoffStatus::lost_track};
      }
    }
    s.mode_position = pick;
    s.n_eff = res.modes[pick].n_eff;
    tracked_.push_back({lambda, res.modes[pick].eigenvector.head(ne)});
    out_.samples.push_back(s);
    return s.n_eff - s.background_index;
  }

private:
  const ModeProblemAtWavelength& problem_;
  const CutoffSearchRequest& request_;
  CutoffSearchResult& out_;
  std::unique_ptr<ModeSolver> solver_;
  Eigen::SparseMatrix<double> gram_;
  std::vector<std::pair<double, Eigen::VectorXd>> tracked_;
};

}  // namespace

CutoffSearchResult find_cutoff_wavelength(const ModeProblemAtWavelength& problem,
                                          const CutoffSearchRequest& r) {
  if (!problem || !r.background_index) {
    throw InputError("find_cutoff_wavelength", "needs a problem factory and the background index n_clad(λ)");
  }
  if (!(r.start_wavelength_um > 0 && r.max_wavelength_um > r.start_wavelength_um)) {
    throw InputError("find_cutoff_wavelength", "needs 0 < start_wavelength_um < max_wavelength_um");
  }
  if (r.mode_index < 0 || !(r.wavelength_tolerance_um > 0) || r.first_step_um < 0) {
    throw InputError("find_cutoff_wavelength", "mode_index and first_step_um must be >= 0, the tolerance > 0");
  }
  CutoffSearchResult out;
  TrackedSearch search(problem, r, out);
  try {
    double a = r.start_wavelength_um, fa = search.f(a);
    if (!(fa > 0)) {
      out.status = CutoffStatus::not_guided_at_start;
      return out;
    }
    double step = r.first_step_um > 0 ? r.first_step_um : 0.25 * (r.max_wavelength_um - a);
    double b = std::min(a + step, r.max_wavelength_um), fb = search.f(b);
    while (fb > 0) {
      if (b >= r.max_wavelength_um) {
        out.status = CutoffStatus::not_bracketed;
        return out;
      }
      // Aim 20 % past the secant's zero (n_eff − n_clad is close to linear in 1/λ near cutoff, so
      // the secant from the guided side lands near the zero); at least one more step, at most
      // four times the last.
      double next = b + 2.0 * (b - a);
      const double slope = (fb - fa) / (b - a);
      if (slope < 0) next = b + std::clamp(1.2 * (-fb / slope), b - a, 4.0 * (b - a));
      a = b;
      fa = fb;
      b = std::min(next, r.max_wavelength_um);
      fb = search.f(b);
    }
    out.cutoff_wavelength_um = brent_root([&](double x) { return search.f(x); }, a, b, fa, fb, r.wavelength_tolerance_um);
    out.status = CutoffStatus::found;
  } catch (const SearchStopped& s) {
    out.status = s.status;
  }
  return out;
}

}  // namespace cladwise
