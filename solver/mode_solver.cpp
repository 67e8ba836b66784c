// Shift-invert Arnoldi eigen solve of the waveguide pencil (see mode_solver.hpp).
#include "solver/mode_solver.hpp"

#include <Eigen/SparseCore>
#include <Eigen/Eigenvalues>
#include <Spectra/GenEigsSolver.h>

#include <algorithm>
#include <chrono>
#include <cmath>
#include <complex>
#include <limits>
#include <numbers>
#include <random>
#include <string>

#include "mesh/error.hpp"
#include "solver/shift_invert.hpp"

namespace cladwise {

namespace {

using SpMat = Eigen::SparseMatrix<double>;
using Clock = std::chrono::steady_clock;

double seconds_since(Clock::time_point t0) {
  return std::chrono::duration<double>(Clock::now() - t0).count();
}

ModeProblem validated(ModeProblem p) {
  if (p.mesh == nullptr) throw InputError("mode problem", "no mesh given");
  if (!(p.wavelength_um > 0.0) || !std::isfinite(p.wavelength_um)) {
    throw InputError("wavelength_um", "must be a positive length in micrometres, got " +
                                          std::to_string(p.wavelength_um));
  }
  if (p.region_materials.size() != p.mesh->regions.size()) {
    throw InputError("materials", "one material is needed per mesh region (" +
                                      std::to_string(p.mesh->regions.size()) + "), got " +
                                      std::to_string(p.region_materials.size()));
  }
  return p;
}

double norm1(const SpMat& m) {
  double best = 0.0;
  for (int k = 0; k < m.outerSize(); ++k) {
    double s = 0.0;
    for (SpMat::InnerIterator it(m, k); it; ++it) s += std::abs(it.value());
    best = std::max(best, s);
  }
  return best;
}

}  // namespace

std::string_view to_string(EigenStatus s) {
  switch (s) {
    case EigenStatus::converged: return "converged";
    case EigenStatus::not_converged: return "not converged";
    case EigenStatus::residual_too_large: return "residual too large";
    case EigenStatus::factorization_failed: return "factorization failed";
    case EigenStatus::search_incomplete: return "search incomplete";
    case EigenStatus::no_modes_found: return "no modes found";
  }
  return "unknown";
}

/// The LU of K = A − σB and the operator op(x) = (A − σB)⁻¹ B x (solver/shift_invert.hpp).
struct ModeSolver::Factorization : ShiftInvert<double> {};

ModeSolver::ModeSolver(ModeProblem problem)
    : problem_(validated(std::move(problem))),
      dofs_(*problem_.mesh, problem_.order, problem_.boundary_walls),
      lu_(std::make_unique<Factorization>()) {
  if (dofs_.n_edge_dofs() == 0) {
    throw InputError("boundary walls", "every transverse unknown is eliminated: the mesh is too "
                                       "coarse or every edge lies on an electric wall");
  }
}

ModeSolver::~ModeSolver() = default;

double ModeSolver::k0() const { return 2.0 * std::numbers::pi / problem_.wavelength_um; }

double ModeSolver::max_material_index() const {
  double n = 0.0;
  for (const auto& m : problem_.region_materials) n = std::max(n, max_index(m));
  return n;
}

double ModeSolver::min_material_index() const {
  double n = max_material_index();
  for (const auto& m : problem_.region_materials) n = std::min(n, min_index(m));
  return n;
}

void ModeSolver::set_wavelength(double wavelength_um, std::optional<std::vector<Material>> materials) {
  ModeProblem p = problem_;
  p.wavelength_um = wavelength_um;
  if (materials) p.region_materials = std::move(*materials);
  problem_ = validated(std::move(p));
  assembled_ = false;
  lu_->invalidate();
}

void ModeSolver::assemble() {
  report("assembly", 0.0);
  const auto t0 = Clock::now();
  std::vector<MaterialTensors<double>> tensors;
  tensors.reserve(problem_.region_materials.size());
  for (const auto& m : problem_.region_materials) tensors.push_back(material_tensors(m));
  matrices_ = assemble_waveguide<double>(dofs_, tensors, k0());
  assembled_ = true;
  lu_->invalidate();
  assembly_s_ = seconds_since(t0);
  report("assembly", 1.0);
}

namespace {

struct Candidate {
  double lambda;       // Rayleigh-quotient eigenvalue, λ = −β²
  double distance;     // |λ − σ| from the Ritz value, for selection and the search radius
  bool real;           // passed the imaginary-part test
  Eigen::VectorXd x;
};

// Real eigenvector of a real pencil from a complex Ritz vector: rotate so that the largest
// component is real, then take the real part (exact for a simple real eigenvalue).
Eigen::VectorXd real_vector(const Eigen::VectorXcd& v) {
  Eigen::Index k;
  v.cwiseAbs().maxCoeff(&k);
  const std::complex<double> phase = std::abs(v[k]) > 0 ? std::conj(v[k]) / std::abs(v[k]) : 1.0;
  return (v * phase).real();
}

/// One Ritz pair of the final Krylov space (Spectra keeps vectors only for the nev wanted ones).
struct RitzPair {
  std::complex<double> theta;
  Eigen::VectorXcd y;  ///< eigenvector of the Hessenberg matrix H (unit 2-norm)
  bool converged = false;
};

/// Spectra's implicitly restarted Arnoldi with the whole final Krylov space exposed: after
/// compute(), V (n × ncv), H (ncv × ncv) and f satisfy op V = V H + f e_ncvᵀ, so every Ritz
/// pair (θ, V y) has the residual estimate ‖f‖ |e_ncvᵀ y|, the same test Spectra applies to the
/// nev wanted pairs (R. B. Lehoucq, D. C. Sorensen, C. Yang, "ARPACK Users' Guide", SIAM 1998,
/// §4.5). Ritz pairs past nev that pass it cost nothing more.
template <class Op>
class LookAheadArnoldi : public Spectra::GenEigsSolver<Op> {
public:
  using Spectra::GenEigsSolver<Op>::GenEigsSolver;

  /// Every Ritz pair, by descending |θ|, with the convergence flag for tolerance `tol`.
  std::vector<RitzPair> ritz_pairs(double tol) const {
    const Eigen::MatrixXd& h = this->m_fac.matrix_H();
    Eigen::EigenSolver<Eigen::MatrixXd> es(h);
    const double f_norm = this->m_fac.f_norm();
    const double eps23 = std::pow(std::numeric_limits<double>::epsilon(), 2.0 / 3.0);
    std::vector<RitzPair> out;
    for (Eigen::Index i = 0; i < h.rows(); ++i) {
      RitzPair p;
      p.theta = es.eigenvalues()[i];
      p.y = es.eigenvectors().col(i).normalized();
      p.converged = std::abs(p.y[h.rows() - 1]) * f_norm < tol * std::max(eps23, std::abs(p.theta));
      out.push_back(std::move(p));
    }
    std::stable_sort(out.begin(), out.end(), [](const RitzPair& a, const RitzPair& b) {
      return std::abs(a.theta) > std::abs(b.theta);
    });
    return out;
  }
  Eigen::VectorXcd ritz_vector(const RitzPair& p) const { return this->m_fac.matrix_V() * p.y; }
};

constexpr int kMinKrylovExtra = 20;  // ncv ≥ nev + 20: see SolveRequest::krylov_dimension
/// The same margin after a warm start, where the start vector lies close to the wanted eigenspace.
/// The work is then set by the spectral gap to the cladding modes, not by the subspace size:
/// cases/dispersion_smf_41.toml (41 points, 2 modes) takes 891 / 959 / 1103 / 943 operator
/// applications in all for margins 4 / 8 / 12 / 20, against 43 per point cold. The smaller
/// space costs less orthogonalisation per step.
constexpr int kMinKrylovExtraWarm = 8;
/// Weight of the random part of a warm start vector (relative to the unit sum of the old modes).
constexpr double kWarmStartRandom = 1e-2;

/// A unit vector of uniform random entries from a fixed seed (reproducible runs).
Eigen::VectorXd seeded_random_unit(int n) {
  std::mt19937 gen(20261202u);
  std::uniform_real_distribution<double> u(-1.0, 1.0);
  Eigen::VectorXd v(n);
  for (int i = 0; i < n; ++i) v[i] = u(gen);
  return v.normalized();
}

}  // namespace

double ModeSolver::estimated_guided_modes(double n_lower) const {
  // Weyl's law for the vector problem: two polarisations of a scalar count A k0² Δ(n²) / (4π)
  // per region above n_lower (for a step-index fibre Σ = V²/2, the classical mode count).
  const Mesh& m = *problem_.mesh;
  std::vector<double> area(m.regions.size(), 0.0);
  for (int t = 0; t < m.n_triangles(); ++t) {
    const auto& a = m.nodes[m.triangles[t][0]];
    const auto& b = m.nodes[m.triangles[t][1]];
    const auto& c = m.nodes[m.triangles[t][2]];
    area[m.triangle_region[t]] +=
        0.5 * std::abs((b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0]));
  }
  const double k0v = k0();
  double count = 0.0;
  for (std::size_t r = 0; r < area.size(); ++r) {
    const double n_r = max_index(problem_.region_materials[r]);
    if (n_r > n_lower) count += area[r] * k0v * k0v * (n_r * n_r - n_lower * n_lower) / (2.0 * std::numbers::pi);
  }
  return count;
}

SolveResult ModeSolver::solve(const SolveRequest& request) {
  SolveResult result;
  result.n_dofs = dofs_.n_dofs();
  if (request.n_modes < 1 && !request.all_guided) {
    throw InputError("n_modes", "must be at least 1, got " + std::to_string(request.n_modes));
  }
  if (!assembled_) assemble();
  result.timing.assembly_s = assembly_s_;

  const double k0v = k0();
  const double n_max = max_material_index();
  const double n_target = request.n_target.value_or(n_max);
  if (!(n_target > 0.0) || !std::isfinite(n_target)) {
    throw InputError("n_target", "must be a positive effective index, got " + std::to_string(n_target));
  }
  if (n_target > n_max * (1.0 + 1e-12)) {
    throw InputError("n_target", "is above every material index (largest " + std::to_string(n_max) +
                                     ", target " + std::to_string(n_target) +
                                     "); no mode has an effective index there: lower the target");
  }
  const double n_min = min_material_index();
  const double n_lower = request.n_lower_bound.value_or(n_min < n_max ? n_min : 0.0);
  const double sigma = -(k0v * n_target) * (k0v * n_target);

  // ---- factorisation of K = A − σB (pattern analysed once per mesh) ----------------------------
  const auto t_fact = Clock::now();
  report("factorization", 0.0);
  Factorization& f = *lu_;
  const bool factorized = f.factorize(matrices_.a, matrices_.b, sigma);
  result.timing.factorization_s = seconds_since(t_fact);
  report("factorization", 1.0);
  if (!factorized) {
    result.status = EigenStatus::factorization_failed;
    return result;
  }

  // ---- Arnoldi, widening nev until the request is met -------------------------------------------
  const auto t_eig = Clock::now();
  const int n = dofs_.n_dofs();
  const double norm_a = norm1(matrices_.a), norm_b = norm1(matrices_.b);
  // Distance from σ beyond which no guided mode can lie: the far end of [n_lower, n_max].
  const double lambda_upper = -(k0v * n_max) * (k0v * n_max);
  const double lambda_lower = -(k0v * n_lower) * (k0v * n_lower);
  const double radius_needed = std::max(std::abs(lambda_upper - sigma), std::abs(lambda_lower - sigma));
  const int nev_cap = std::max(1, std::min(request.max_eigenvalues, n - 3));
  // nev is what Arnoldi must converge; the rest of the Krylov space is read as look-ahead. For a
  // count of modes that is the count itself (the degenerate partner of the last one converges
  // with it and is found in the look-ahead); asking for more would force the convergence of
  // cladding modes crowding just below n_clad, the slowest part of the spectrum (measured on the
  // weakly guiding fibre, 21.7k unknowns: nev = n + 2 took 109 operator applications for 2
  // modes at tolerance 1e-10, nev = n takes 42).
  // For every guided mode the first guess is the Weyl estimate of their number.
  // The Weyl count underestimates a fibre's modes by about V (10 against V²/2 = 8.9 on the
  // silica rod of checks.md §8), hence the factor 1.2; one mode past n_lower proves coverage.
  int nev = std::min(nev_cap, request.all_guided
                                  ? std::max(3, static_cast<int>(std::ceil(
                                                    1.2 * estimated_guided_modes(n_lower))) + 1)
                                  : request.n_modes);
  Eigen::VectorXd start;  // empty: Spectra's own random start
  for (const auto& v : request.start_vectors) {
    if (v.size() != n || !(v.norm() > 0.0)) continue;
    if (start.size() != n) start = Eigen::VectorXd::Zero(n);
    start += v.normalized();
  }
  const bool warm = start.size() == n;  // only the first Arnoldi run; widening starts afresh
  if (warm) {
    // The random part keeps every direction in the Krylov space, so that a mode that has come
    // nearer the target since the previous solve is still found (and Arnoldi cannot break down
    // on an exactly invariant start). Seeded: results do not depend on the run.
    start = start.normalized() + kWarmStartRandom * seeded_random_unit(n);
  }

  std::vector<Candidate> accepted;
  bool arnoldi_ok = true;
  const long ops_before = f.n_operator_applications();
  // Keeps the progress line (and its elapsed time) alive through a long Arnoldi run; the total
  // number of applications is not known in advance, so no fraction.
  f.set_after_op([this](long) { report("eigensolve", -1.0); });
  for (;;) {
    report("eigensolve", 0.0);
    // A wide subspace: fewer restarts for the same number of operator applications.
    const int ncv = request.krylov_dimension > nev + 1
                        ? std::min(n, request.krylov_dimension)
                        : std::min(n, std::max(2 * nev + 1, nev + (warm && result.n_arnoldi_runs == 0 ? kMinKrylovExtraWarm : kMinKrylovExtra)));
    LookAheadArnoldi<Factorization> eigs(f, nev, ncv);
    if (start.size() == n) {
      eigs.init(start.data());
    } else {
      eigs.init();
    }
    eigs.compute(Spectra::SortRule::LargestMagn, request.max_restarts, request.arnoldi_tolerance,
                 Spectra::SortRule::LargestMagn);
    arnoldi_ok = eigs.info() == Spectra::CompInfo::Successful;
    ++result.n_arnoldi_runs;
    result.n_eigenvalues = nev;
    const std::vector<RitzPair> ritz = eigs.ritz_pairs(request.arnoldi_tolerance);

    // Candidates: the leading run of converged Ritz pairs (nothing nearer σ is missing from it).
    std::vector<Candidate> cands;
    result.beta_sq_found.clear();
    double radius_found = 0.0;
    std::size_t n_conv = 0;
    while (n_conv < ritz.size() && ritz[n_conv].converged) ++n_conv;
    for (std::size_t i = 0; i < n_conv; ++i) {
      const std::complex<double> th = ritz[i].theta;
      radius_found = std::max(radius_found, 1.0 / std::abs(th));
      Candidate c;
      c.distance = 1.0 / std::abs(th);
      c.real = std::abs(th.imag()) <= request.imag_tolerance * std::abs(th);
      if (!c.real) continue;
      const Eigen::VectorXcd v = eigs.ritz_vector(ritz[i]);
      if (th.imag() == 0.0) {
        c.x = real_vector(v);
      } else {
        // A nearly real conjugate pair θ, θ̄ (a degenerate pair split by rounding): Re v and Im v
        // span the real two-dimensional eigenspace; give one to each member of the pair.
        c.x = th.imag() > 0 ? Eigen::VectorXd(v.real()) : Eigen::VectorXd(v.imag());
      }
      c.x.normalize();
      const double xbx = c.x.dot(matrices_.b * c.x);
      const double lambda_ritz = sigma + 1.0 / th.real();
      // Rayleigh quotient of the symmetric pencil: second-order accurate in the vector error.
      c.lambda = std::abs(xbx) > 1e-14 * norm_b ? c.x.dot(matrices_.a * c.x) / xbx : lambda_ritz;
      if (static_cast<int>(i) < nev) result.beta_sq_found.push_back(-c.lambda);
      cands.push_back(std::move(c));
    }

    accepted.clear();
    for (auto& c : cands) {
      const double beta_sq = -c.lambda;
      if (!(beta_sq > 1e-10 * k0v * k0v)) continue;                      // evanescent or null space
      const double n_eff = std::sqrt(beta_sq) / k0v;
      if (n_eff > n_max * (1.0 + 1e-10)) continue;                        // above every index
      if ((request.all_guided || request.n_lower_bound) && n_eff <= n_lower) continue;
      accepted.push_back(c);
    }
    const bool range_covered = radius_found >= radius_needed;
    bool enough = false;
    if (!request.all_guided && static_cast<int>(accepted.size()) >= request.n_modes) {
      // Complete unless the first Ritz value after the converged run may be the partner of the
      // last mode kept (same |θ| within the degeneracy tolerance) and is not converged yet.
      enough = true;
      if (n_conv < ritz.size() && n_conv > 0) {
        const double d_last = 1.0 / std::abs(ritz[n_conv - 1].theta);
        const double d_next = 1.0 / std::abs(ritz[n_conv].theta);
        // |Δλ| ≈ 2 β² |Δn_eff| / n_eff
        const double gap = 2.0 * std::abs(sigma) * request.degeneracy_tolerance;
        if (std::abs(d_next - d_last) <= gap) enough = false;
      }
    }
    report("eigensolve", 1.0);
    if (range_covered || enough || nev >= nev_cap || !arnoldi_ok) {
      if (request.all_guided && !range_covered && arnoldi_ok) {
        result.status = EigenStatus::search_incomplete;
      }
      break;
    }
    // Widen and start again (Spectra has no warm restart with a larger nev), from the sum of
    // the modes found plus a random part, so that the new Krylov space begins rich in the known
    // modes. Widening is what the Weyl first guess avoids: on the silica rod an underestimate
    // (nev 10 for 10 modes), then a cold restart at nev 20, cost 979 operator applications
    // against 352 for nev 12 at once.
    nev = std::min(nev_cap, nev + std::max(4, nev / 2));
    start = Eigen::VectorXd::Random(n).normalized();
    for (const auto& c : cands) start += c.x.normalized();
  }

  // ---- selection: nearest the target, keeping degenerate partners together ----------------------
  std::sort(accepted.begin(), accepted.end(),
            [](const Candidate& a, const Candidate& b) { return a.distance < b.distance; });
  std::size_t keep = accepted.size();
  if (!request.all_guided && keep > static_cast<std::size_t>(request.n_modes)) {
    keep = request.n_modes;
    auto n_eff_of = [&](const Candidate& c) { return std::sqrt(-c.lambda) / k0v; };
    while (keep < accepted.size() &&
           std::abs(n_eff_of(accepted[keep]) - n_eff_of(accepted[keep - 1])) <=
               request.degeneracy_tolerance * n_eff_of(accepted[keep - 1])) {
      ++keep;
    }
  }
  accepted.resize(keep);

  bool residual_failed = false;
  for (auto& c : accepted) {
    const Eigen::VectorXd r = matrices_.a * c.x - c.lambda * (matrices_.b * c.x);
    // Normwise backward error of the pencil (N. J. Higham, "Accuracy and Stability of Numerical
    // Algorithms", 2nd ed., SIAM 2002, §7.1 generalised to A x = λ B x).
    const double residual = r.norm() / ((norm_a + std::abs(c.lambda) * norm_b) * c.x.norm());
    if (!(residual <= request.residual_tolerance)) {
      residual_failed = true;
      continue;
    }
    Mode m;
    m.beta = std::sqrt(-c.lambda);
    m.n_eff = m.beta / k0v;
    m.residual = residual;
    Eigen::Index k;
    c.x.cwiseAbs().maxCoeff(&k);
    m.eigenvector = c.x[k] < 0 ? Eigen::VectorXd(-c.x) : c.x;  // deterministic sign
    result.modes.push_back(std::move(m));
  }
  std::sort(result.modes.begin(), result.modes.end(),
            [](const Mode& a, const Mode& b) { return a.n_eff > b.n_eff; });
  result.timing.eigensolve_s = seconds_since(t_eig);
  result.n_operator_applications = f.n_operator_applications() - ops_before;

  if (!arnoldi_ok) result.status = EigenStatus::not_converged;
  else if (residual_failed) result.status = EigenStatus::residual_too_large;
  else if (result.modes.empty()) result.status = EigenStatus::no_modes_found;
  return result;
}

}  // namespace cladwise
