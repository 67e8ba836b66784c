// Shift-invert Arnoldi eigen solve of the waveguide pencil (see mode_solver.hpp).
#include "solver/mode_solver.hpp"

#include <Eigen/SparseCore>
#include <Eigen/UmfPackSupport>
#include <Spectra/GenEigsSolver.h>

#include <algorithm>
#include <chrono>
#include <cmath>
#include <complex>
#include <numbers>
#include <string>

#include "mesh/error.hpp"

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
  }
  return "unknown";
}

/// One LU of K = A − σB, and the shift-invert operator in Spectra's concept:
///   op(x) = (A − σB)⁻¹ B x,  θ = 1/(λ − σ)  ⇔  λ = σ + 1/θ   (spectral transformation)
/// Largest |θ| are the eigenvalues λ nearest the shift σ.
struct ModeSolver::Factorization {
  Eigen::UmfPackLU<SpMat> lu;
  SpMat k;
  bool analysed = false;
  bool valid = false;
  double sigma = 0.0;
  const SpMat* b = nullptr;
  mutable Eigen::VectorXd bx;

  using Scalar = double;  // Spectra operator concept
  Eigen::Index rows() const { return k.rows(); }
  Eigen::Index cols() const { return k.cols(); }
  void perform_op(const double* x_in, double* y_out) const {
    Eigen::Map<const Eigen::VectorXd> x(x_in, k.cols());
    Eigen::Map<Eigen::VectorXd> y(y_out, k.rows());
    bx.noalias() = (*b) * x;
    y = lu.solve(bx);
  }
};

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
  lu_->valid = false;
}

void ModeSolver::assemble() {
  report("assembly", 0.0);
  const auto t0 = Clock::now();
  std::vector<MaterialTensors<double>> tensors;
  tensors.reserve(problem_.region_materials.size());
  for (const auto& m : problem_.region_materials) tensors.push_back(material_tensors(m));
  matrices_ = assemble_waveguide<double>(dofs_, tensors, k0());
  assembled_ = true;
  lu_->valid = false;
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

}  // namespace

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
  if (!(n_target > 0.0)) {
    throw InputError("n_target", "must be positive, got " + std::to_string(n_target));
  }
  const double n_min = min_material_index();
  const double n_lower = request.n_lower_bound.value_or(n_min < n_max ? n_min : 0.0);
  const double sigma = -(k0v * n_target) * (k0v * n_target);

  // ---- factorisation of K = A − σB (pattern analysed once per mesh) ----------------------------
  const auto t_fact = Clock::now();
  report("factorization", 0.0);
  Factorization& f = *lu_;
  if (!f.valid || f.sigma != sigma) {
    f.k = matrices_.a - sigma * matrices_.b;
    f.k.makeCompressed();
    if (!f.analysed) {
      // No iterative refinement in the solves: it doubles or triples the cost of every Arnoldi
      // step (measured: eigensolve 3.5 s -> 0.39 s on a 12k-unknown fibre), and the Krylov space
      // needs no more than the LU's own backward stability; the eigenvalues are then polished by
      // Rayleigh quotients and checked by their residuals against A and B themselves.
      f.lu.umfpackControl()(UMFPACK_IRSTEP) = 0;
      f.lu.analyzePattern(f.k);
      f.analysed = true;
    }
    f.lu.factorize(f.k);
    f.sigma = sigma;
    f.b = &matrices_.b;
    f.valid = f.lu.info() == Eigen::Success;
  }
  result.timing.factorization_s = seconds_since(t_fact);
  report("factorization", 1.0);
  if (!f.valid) {
    result.status = EigenStatus::factorization_failed;
    return result;
  }

  // ---- Arnoldi, widening nev until the guided range is covered ----------------------------------
  const auto t_eig = Clock::now();
  const int n = dofs_.n_dofs();
  const double norm_a = norm1(matrices_.a), norm_b = norm1(matrices_.b);
  // Distance from σ beyond which no guided mode can lie: the far end of [n_lower, n_max].
  const double lambda_upper = -(k0v * n_max) * (k0v * n_max);
  const double lambda_lower = -(k0v * n_lower) * (k0v * n_lower);
  const double radius_needed = std::max(std::abs(lambda_upper - sigma), std::abs(lambda_lower - sigma));
  const int nev_cap = std::max(1, std::min(request.max_eigenvalues, n - 3));
  int nev = std::min(nev_cap, request.all_guided ? std::max(request.n_modes, 8) : request.n_modes + 2);

  std::vector<Candidate> accepted;
  bool arnoldi_ok = true;
  for (int round = 0;; ++round) {
    report("eigensolve", 0.0);
    // A wide subspace: fewer restarts for the same number of operator applications (measured on
    // the elliptical-core case: ncv 20 -> 13 restarts, 0.69 s; ncv 40 -> 5 restarts, 0.39 s).
    const int ncv = std::min(n, std::max(2 * nev + 1, 40));
    Spectra::GenEigsSolver<Factorization> eigs(f, nev, ncv);
    eigs.init();
    eigs.compute(Spectra::SortRule::LargestMagn, 1000, request.arnoldi_tolerance,
                 Spectra::SortRule::LargestMagn);
    arnoldi_ok = eigs.info() == Spectra::CompInfo::Successful;
    const Eigen::VectorXcd theta = eigs.eigenvalues();
    const Eigen::MatrixXcd vecs = eigs.eigenvectors(theta.size());
    result.n_eigenvalues = nev;

    std::vector<Candidate> cands;
    double radius_found = 0.0;
    for (Eigen::Index i = 0; i < theta.size(); ++i) {
      const std::complex<double> th = theta[i];
      radius_found = std::max(radius_found, 1.0 / std::abs(th));
      Candidate c;
      c.distance = 1.0 / std::abs(th);
      c.real = std::abs(th.imag()) <= request.imag_tolerance * std::abs(th);
      if (!c.real) continue;
      if (th.imag() == 0.0) {
        c.x = real_vector(vecs.col(i));
      } else {
        // A nearly real conjugate pair θ, θ̄ (a degenerate pair split by rounding): Re v and Im v
        // span the real two-dimensional eigenspace; give one to each member of the pair.
        c.x = th.imag() > 0 ? Eigen::VectorXd(vecs.col(i).real())
                            : Eigen::VectorXd(vecs.col(i).imag());
      }
      c.x.normalize();
      const double xbx = c.x.dot(matrices_.b * c.x);
      const double lambda_ritz = sigma + 1.0 / th.real();
      // Rayleigh quotient of the symmetric pencil: second-order accurate in the vector error.
      c.lambda = std::abs(xbx) > 1e-14 * norm_b ? c.x.dot(matrices_.a * c.x) / xbx : lambda_ritz;
      result.beta_sq_found.push_back(-c.lambda);
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
    const bool enough = !request.all_guided && static_cast<int>(accepted.size()) > request.n_modes;
    report("eigensolve", 1.0);
    if (range_covered || enough || nev >= nev_cap || !arnoldi_ok) {
      if (request.all_guided && !range_covered && arnoldi_ok) {
        result.status = EigenStatus::search_incomplete;
      }
      break;
    }
    nev = std::min(nev_cap, 2 * nev);
    result.beta_sq_found.clear();
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

  if (!arnoldi_ok) result.status = EigenStatus::not_converged;
  else if (residual_failed) result.status = EigenStatus::residual_too_large;
  return result;
}

}  // namespace cladwise
