// Coupled cores: per-core views of supermodes and the coupling matrix (see coupled_cores.hpp).
#include "solver/coupled_cores.hpp"

#include <Eigen/Eigenvalues>

#include <cmath>
#include <limits>
#include <numbers>

#include "solver/mode_metrics.hpp"

namespace cladwise {

PairCoupling coupling_from_splitting(double beta_even_per_um, double beta_odd_per_um) {
  PairCoupling c;
  c.kappa_per_m = 0.5 * (beta_even_per_um - beta_odd_per_um) * 1e6;  // 1/µm → 1/m
  c.coupling_length_m = c.kappa_per_m == 0.0 ? std::numeric_limits<double>::infinity()
                                             : std::numbers::pi / (2.0 * std::abs(c.kappa_per_m));
  return c;
}

SupermodeCores supermode_cores(const ModeFieldEvaluator& fields, const Mesh& mesh, int order,
                               const std::vector<Point2>& centres) {
  const auto s = sample_mode(fields, mesh, order, false);
  const int n = static_cast<int>(centres.size());
  Eigen::Matrix2d cov = Eigen::Matrix2d::Zero();
  for (const auto& q : s) {
    const auto& e = q.field.e;
    cov(0, 0) += q.weight_um2 * std::norm(e.x());
    cov(1, 1) += q.weight_um2 * std::norm(e.y());
    cov(0, 1) += q.weight_um2 * (e.x() * std::conj(e.y())).real();
  }
  cov(1, 0) = cov(0, 1);
  const Eigen::Vector2d axis = Eigen::SelfAdjointEigenSolver<Eigen::Matrix2d>(cov).eigenvectors().col(1);
  SupermodeCores out;
  out.polarisation = std::abs(axis.x()) >= std::abs(axis.y()) ? 'x' : 'y';
  // Project on the coordinate axis of that polarisation, so that all supermodes of one
  // polarisation share the sign convention of their amplitudes.
  const Eigen::Vector2d p = out.polarisation == 'x' ? Eigen::Vector2d(1, 0) : Eigen::Vector2d(0, 1);
  std::vector<double> power(n, 0.0);
  Eigen::VectorXcd amp = Eigen::VectorXcd::Zero(n);
  double total = 0.0;
  for (const auto& q : s) {
    int best = 0;
    double d_best = 1e300;
    for (int i = 0; i < n; ++i) {
      const double d = std::hypot(q.x.x() - centres[i][0], q.x.y() - centres[i][1]);
      if (d < d_best) d_best = d, best = i;
    }
    const double sz = q.weight_um2 * q.field.s_z();
    power[best] += sz;
    total += sz;
    amp[best] += q.weight_um2 * (p.x() * q.field.e.x() + p.y() * q.field.e.y());
  }
  for (double& v : power) v /= total;
  out.power_fraction = power;
  // Remove the mode's global phase: make the largest amplitude real.
  int k = 0;
  amp.cwiseAbs().maxCoeff(&k);
  const std::complex<double> phase = std::abs(amp[k]) > 0 ? std::conj(amp[k]) / std::abs(amp[k]) : 1.0;
  out.amplitude = (amp * phase).real();
  if (out.amplitude.norm() > 0) out.amplitude.normalize();
  return out;
}

std::vector<CoreArrayCoupling> core_array_coupling(const std::vector<Mode>& supermodes,
                                                   const std::vector<SupermodeCores>& cores,
                                                   const std::vector<Point2>& centres,
                                                   double neighbour_tolerance) {
  const int n = static_cast<int>(centres.size());
  double d_min = 1e300;
  for (int i = 0; i < n; ++i)
    for (int j = i + 1; j < n; ++j)
      d_min = std::min(d_min, std::hypot(centres[i][0] - centres[j][0], centres[i][1] - centres[j][1]));
  std::vector<CoreArrayCoupling> out;
  for (char pol : {'x', 'y'}) {
    std::vector<int> idx;
    for (int s = 0; s < static_cast<int>(cores.size()); ++s) {
      if (cores[s].polarisation == pol) idx.push_back(s);
    }
    if (static_cast<int>(idx.size()) != n) continue;
    Eigen::MatrixXd a(n, n);
    Eigen::VectorXd beta(n);
    double mean = 0.0;
    for (int k = 0; k < n; ++k) mean += supermodes[idx[k]].beta / n;
    for (int k = 0; k < n; ++k) {
      a.col(k) = cores[idx[k]].amplitude;
      beta[k] = (supermodes[idx[k]].beta - mean) * 1e6;  // 1/m, relative to the mean
    }
    // Symmetric (Löwdin) orthonormalisation A (AᵀA)^{-1/2}: the nearest orthogonal matrix, so that
    // K = A diag(β) Aᵀ is symmetric as coupled-mode theory requires.
    Eigen::SelfAdjointEigenSolver<Eigen::MatrixXd> g(a.transpose() * a);
    const Eigen::MatrixXd inv_sqrt =
        g.eigenvectors() * g.eigenvalues().cwiseSqrt().cwiseInverse().asDiagonal() * g.eigenvectors().transpose();
    const Eigen::MatrixXd q = a * inv_sqrt;
    CoreArrayCoupling c;
    c.polarisation = pol;
    c.coupling_matrix_per_m = q * beta.asDiagonal() * q.transpose();
    for (int i = 0; i < n; ++i) {
      for (int j = i + 1; j < n; ++j) {
        const double d = std::hypot(centres[i][0] - centres[j][0], centres[i][1] - centres[j][1]);
        if (d > (1.0 + neighbour_tolerance) * d_min) continue;
        CoreCoupling p;
        p.core_a = i, p.core_b = j, p.distance_um = d;
        // K_ij = κ: the splitting form with β_e − β_o = 2 K_ij
        p.coupling = coupling_from_splitting(c.coupling_matrix_per_m(i, j) * 1e-6, -c.coupling_matrix_per_m(i, j) * 1e-6);
        c.pairs.push_back(p);
      }
    }
    out.push_back(c);
  }
  return out;
}

}  // namespace cladwise
