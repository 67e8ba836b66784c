// Complex shift-invert Arnoldi (arpack-ng) for leaky and lossy modes (see complex_mode_solver.hpp).
#include "solver/complex_mode_solver.hpp"

#include <Eigen/SparseCore>
#include <arpack/arpack.hpp>

#include <algorithm>
#include <chrono>
#include <cmath>
#include <numbers>
#include <string>
#include <utility>

#include "mesh/error.hpp"
#include "solver/element_kernels.hpp"
#include "solver/field_recovery.hpp"
#include "solver/quadrature.hpp"
#include "solver/shift_invert.hpp"

namespace cladwise {

namespace {

using Complex = std::complex<double>;
using SpMat = Eigen::SparseMatrix<Complex>;
using Clock = std::chrono::steady_clock;

double seconds_since(Clock::time_point t0) {
  return std::chrono::duration<double>(Clock::now() - t0).count();
}

bool has_pml_regions(const Mesh& mesh) {
  return std::any_of(mesh.regions.begin(), mesh.regions.end(),
                     [](const Region& r) { return r.role == RegionRole::pml; });
}

LeakyModeProblem validated(LeakyModeProblem p) {
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
  if (has_pml_regions(*p.mesh) && !p.pml) {
    throw InputError("pml", "the mesh has PML regions but no PML stretching was given; set the "
                            "PML thickness and strength");
  }
  if (p.pml) validate(*p.pml);
  if (p.bend) {
    validate(*p.bend);
    // The equivalent medium needs h = 1 + u/R > 0 everywhere on the mesh.
    for (const auto& x : p.mesh->nodes) {
      if (1.0 + bend_coordinate(*p.bend, {x[0], x[1]}) / p.bend->radius_um <= 0.0) {
        throw InputError("bend.radius_um", "the cross-section reaches beyond the centre of "
                                           "curvature; use a larger radius or a smaller domain");
      }
    }
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

// Unconjugated bilinear product xᵀ y of complex symmetric algebra.
Complex dotu(const Eigen::VectorXcd& x, const Eigen::VectorXcd& y) {
  return (x.transpose() * y)(0, 0);
}

// ∫|E|² dA over one element (first) and over the part of it where inside(x) holds (second), by
// the kernels' quadrature of the exact element field.
template <int Order, class Inside>
std::pair<double, double> element_e_squared(const ElementGeometry& g, const Complex* c_t,
                                            const Complex* c_z, Complex beta,
                                            const QuadratureRule& rule, const Inside& inside) {
  double all = 0.0, in = 0.0;
  for (int q = 0; q < rule.n_points(); ++q) {
    const Eigen::Vector2d& xi = rule.points[q];
    const MappedPoint m = map_point(g, xi);
    const ScaledFieldValues<Complex> v = interpolate_scaled_fields<Order>(m, xi, c_t, c_z);
    // E_t = e_t/β, E_z = j e_z (formulation.md eq. 5)
    const double e2 = rule.weights[q] * m.det * ((v.e_t / beta).squaredNorm() + std::norm(v.e_z));
    all += e2;
    if (inside(m.x)) in += e2;
  }
  return {all, in};
}

// The same for triangle t of the eigenvector x.
template <class Inside>
std::pair<double, double> element_e_squared(const DofMap& dofs, int t, const Eigen::VectorXcd& x,
                                            Complex beta, const QuadratureRule& rule,
                                            const Inside& inside) {
  Complex c[kMaxLocalDofs];
  element_coefficients(dofs, t, x, c);
  const ElementGeometry g = element_geometry(dofs.mesh(), t);
  const int nt = dofs.n_local_edge();
  return dofs.order() == 1 ? element_e_squared<1>(g, c, c + nt, beta, rule, inside)
                           : element_e_squared<2>(g, c, c + nt, beta, rule, inside);
}

void validate(const CoreSelection& core, const Mesh& mesh) {
  for (int r : core.regions) {
    if (r < 0 || r >= static_cast<int>(mesh.regions.size())) {
      throw InputError("core.regions", "region index " + std::to_string(r) + " is not a region of "
                                       "the mesh (it has " + std::to_string(mesh.regions.size()) +
                                       "); list the core's mesh regions");
    }
    if (mesh.regions[r].role == RegionRole::pml) {
      throw InputError("core.regions", "region '" + mesh.regions[r].name + "' is a PML region; "
                                       "the core must be physical");
    }
  }
  if (core.regions.empty() && !(core.radius_um > 0.0 && std::isfinite(core.radius_um))) {
    throw InputError("core.radius_um", "give the core as mesh regions or as a disk of positive "
                                       "radius, got radius " + std::to_string(core.radius_um));
  }
  if (!(core.min_fraction >= 0.0 && core.min_fraction <= 1.0)) {
    throw InputError("core.min_fraction", "must lie in [0, 1], got " +
                                              std::to_string(core.min_fraction));
  }
}

}  // namespace

TensorMaterial leaky_medium_at(const LeakyModeProblem& p, int region, const Eigen::Vector2d& x) {
  TensorMaterial m = p.region_materials[region];
  if (p.bend) m = bent_material(*p.bend, m, x);
  if (p.pml && p.mesh->regions[region].role == RegionRole::pml) {
    return stretched_material(m, pml_stretch_jacobian(*p.pml, x));
  }
  return m;
}

double loss_db_per_m(double k0_per_um, double n_eff_imag) {
  // 20 log10(e) = 20 / ln 10: amplitude decay exp(−k0 |Im n_eff| z) in dB of power per metre.
  return 20.0 / std::log(10.0) * k0_per_um * std::abs(n_eff_imag) * 1e6;
}

/// The complex LU of K = A − σB and the operator op(x) = (A − σB)⁻¹ B x
/// (solver/shift_invert.hpp), applied in ARPACK's reverse communication.
struct ComplexModeSolver::Factorization : ShiftInvert<Complex> {};

ComplexModeSolver::ComplexModeSolver(LeakyModeProblem problem)
    : problem_(validated(std::move(problem))),
      dofs_(*problem_.mesh, problem_.order, problem_.boundary_walls),
      lu_(std::make_unique<Factorization>()) {
  if (dofs_.n_edge_dofs() == 0) {
    throw InputError("boundary walls", "every transverse unknown is eliminated: the mesh is too "
                                       "coarse or every edge lies on an electric wall");
  }
}

ComplexModeSolver::~ComplexModeSolver() = default;

double ComplexModeSolver::k0() const { return 2.0 * std::numbers::pi / problem_.wavelength_um; }

double ComplexModeSolver::max_physical_index() const {
  double n = 0.0;
  const Mesh& mesh = *problem_.mesh;
  for (std::size_t r = 0; r < mesh.regions.size(); ++r) {
    if (mesh.regions[r].role == RegionRole::pml) continue;
    n = std::max(n, max_real_index(problem_.region_materials[r]));
  }
  return n;
}

void ComplexModeSolver::set_wavelength(double wavelength_um,
                                       std::optional<std::vector<TensorMaterial>> materials) {
  LeakyModeProblem p = problem_;
  p.wavelength_um = wavelength_um;
  if (materials) p.region_materials = std::move(*materials);
  problem_ = validated(std::move(p));
  assembled_ = false;
  lu_->invalidate();
}

void ComplexModeSolver::set_pml_strength(double strength) {
  if (!problem_.pml) throw InputError("pml.strength", "this problem has no PML");
  Pml p = *problem_.pml;
  p.strength = strength;
  validate(p);
  problem_.pml = p;
  assembled_ = false;
  lu_->invalidate();
}

MaterialTensors<Complex> ComplexModeSolver::tensors_at(int region, const Eigen::Vector2d& x) const {
  // pml_tensors(pml, m, x) is material_tensors(stretched_material(m, J(x))): the same arithmetic.
  return material_tensors(leaky_medium_at(problem_, region, x));
}

void ComplexModeSolver::assemble() {
  const auto t0 = Clock::now();
  const Mesh& mesh = *problem_.mesh;
  std::vector<RegionMedium<Complex>> media(mesh.regions.size());
  for (std::size_t r = 0; r < mesh.regions.size(); ++r) {
    const bool varies = problem_.bend || (problem_.pml && mesh.regions[r].role == RegionRole::pml);
    if (varies) {
      const int region = static_cast<int>(r);
      media[r].at_point = [this, region](const Eigen::Vector2d& x) { return tensors_at(region, x); };
    } else {
      media[r].tensors = material_tensors(problem_.region_materials[r]);
    }
  }
  matrices_ = assemble_waveguide<Complex>(dofs_, media, k0());
  assembled_ = true;
  lu_->invalidate();
  assembly_s_ = seconds_since(t0);
}

double ComplexModeSolver::physical_fraction(const Eigen::VectorXcd& x, Complex beta) const {
  const Mesh& mesh = *problem_.mesh;
  const QuadratureRule& rule = triangle_rule(kernel_quadrature_degree(dofs_.order()));
  const auto nowhere = [](const Eigen::Vector2d&) { return false; };
  double phys = 0.0, all = 0.0;
  for (int t = 0; t < mesh.n_triangles(); ++t) {
    const double e2 = element_e_squared(dofs_, t, x, beta, rule, nowhere).first;
    all += e2;
    if (mesh.regions[mesh.triangle_region[t]].role != RegionRole::pml) phys += e2;
  }
  return all > 0.0 ? phys / all : 0.0;
}

double ComplexModeSolver::core_fraction(const Eigen::VectorXcd& x, Complex beta,
                                        const CoreSelection& core) const {
  const Mesh& mesh = *problem_.mesh;
  validate(core, mesh);
  std::vector<char> in_core(mesh.regions.size(), 0);
  for (int r : core.regions) in_core[r] = 1;
  const bool by_disk = core.regions.empty();
  const Eigen::Vector2d centre(core.centre[0], core.centre[1]);
  const QuadratureRule& rule = triangle_rule(kernel_quadrature_degree(dofs_.order()));
  double phys = 0.0, inside = 0.0;
  for (int t = 0; t < mesh.n_triangles(); ++t) {
    const int region = mesh.triangle_region[t];
    if (mesh.regions[region].role == RegionRole::pml) continue;
    // A core region holds every quadrature point of its triangles; a disk is tested point by point.
    const auto in_the_core = [&](const Eigen::Vector2d& p) {
      return by_disk ? (p - centre).norm() < core.radius_um : in_core[region] != 0;
    };
    const auto [all, in] = element_e_squared(dofs_, t, x, beta, rule, in_the_core);
    phys += all;
    inside += in;
  }
  return phys > 0.0 ? inside / phys : 0.0;
}

LeakySolveResult ComplexModeSolver::solve(const LeakySolveRequest& request) {
  LeakySolveResult result = solve_once(request);
  if (!(request.pml_check_factor > 0.0) || !problem_.pml || result.modes.empty()) return result;
  // Stability of the loss under a change of PML strength: a loss set by the guide does not move;
  // one set by PML reflection or discretisation does.
  const double strength = problem_.pml->strength;
  set_pml_strength(strength * request.pml_check_factor);
  LeakySolveRequest again = request;
  again.pml_check_factor = 0.0;
  const LeakySolveResult other = solve_once(again);
  set_pml_strength(strength);
  for (auto& m : result.modes) {
    const LeakyMode* best = nullptr;
    for (const auto& o : other.modes) {
      if (!best || std::abs(o.n_eff - m.n_eff) < std::abs(best->n_eff - m.n_eff)) best = &o;
    }
    // Partner only if much closer than the gap to any other mode of the first run.
    if (best && std::abs(best->n_eff.real() - m.n_eff.real()) < 1e-6 * m.n_eff.real() + 10 * m.n_eff_imag) {
      m.pml_loss_change = std::abs(best->n_eff_imag - m.n_eff_imag) / std::max(m.n_eff_imag, 1e-300);
      if (m.pml_loss_change > request.pml_check_tolerance) m.loss_unresolved = true;
    } else {
      m.loss_unresolved = true;
    }
  }
  result.timing.factorization_s += other.timing.factorization_s;
  result.timing.eigensolve_s += other.timing.eigensolve_s;
  return result;
}

LeakySolveResult ComplexModeSolver::solve_once(const LeakySolveRequest& request) {
  LeakySolveResult result;
  result.n_dofs = dofs_.n_dofs();
  if (request.n_modes < 1) {
    throw InputError("n_modes", "must be at least 1, got " + std::to_string(request.n_modes));
  }
  if (request.core) validate(*request.core, *problem_.mesh);
  if (!assembled_) assemble();
  result.timing.assembly_s = assembly_s_;

  const double k0v = k0();
  const double n_max = max_physical_index();
  const double n_target = request.n_target.value_or(n_max);
  if (!(n_target > 0.0)) {
    throw InputError("n_target", "must be positive, got " + std::to_string(n_target));
  }
  // Metals (Re ε < 0) carry plasmons with n_eff above every dielectric index: no upper bound then.
  bool has_metal = false;
  for (const auto& m : problem_.region_materials) {
    has_metal = has_metal || m.eps_zz.real() < 0.0 || m.eps_t.trace().real() < 0.0;
  }
  const double sigma = -(k0v * n_target) * (k0v * n_target);

  // ---- factorisation of K = A − σB (pattern analysed once per mesh) ----------------------------
  const auto t_fact = Clock::now();
  Factorization& f = *lu_;
  const bool factorized = f.factorize(matrices_.a, matrices_.b, sigma);
  result.timing.factorization_s = seconds_since(t_fact);
  if (!factorized) {
    result.status = EigenStatus::factorization_failed;
    return result;
  }

  // ---- ARPACK znaupd/zneupd, reverse communication, widening nev --------------------------------
  const auto t_eig = Clock::now();
  const int n = dofs_.n_dofs();
  const double norm_a = norm1(matrices_.a), norm_b = norm1(matrices_.b);
  const int nev_cap = std::max(1, std::min(request.max_eigenvalues, n - 2));
  int nev = std::min(nev_cap, request.n_modes + 4);
  bool arnoldi_ok = true;
  bool residual_failed = false;
  std::vector<LeakyMode> accepted;
  for (;;) {
    const int ncv = std::min(n, std::max(2 * nev + 1, 40));
    a_int ido = 0, info = 0;
    a_int iparam[11] = {0}, ipntr[14] = {0};
    iparam[0] = 1;                        // exact shifts
    iparam[2] = request.max_iterations;   // restart cap
    iparam[6] = 1;                        // mode 1: OP given by us (the shift-invert operator)
    const a_int lworkl = 3 * ncv * ncv + 5 * ncv;
    std::vector<Complex> resid(n), v(static_cast<std::size_t>(n) * ncv), workd(3 * n), workl(lworkl);
    std::vector<double> rwork(ncv);
    for (;;) {
      arpack::naupd(ido, arpack::bmat::identity, n, arpack::which::largest_magnitude, nev,
                    request.arnoldi_tolerance, resid.data(), ncv, v.data(), n, iparam, ipntr,
                    workd.data(), workl.data(), lworkl, rwork.data(), info);
      if (ido != -1 && ido != 1) break;
      f.perform_op(workd.data() + ipntr[0] - 1, workd.data() + ipntr[1] - 1);
    }
    if (info < 0) {
      throw ComputationError("complex eigen solve: ARPACK znaupd failed with info = " +
                             std::to_string(info));
    }
    arnoldi_ok = info == 0;
    const int n_conv = iparam[4];
    std::vector<Complex> theta(nev + 1), z(static_cast<std::size_t>(n) * (nev + 1)), workev(2 * ncv);
    std::vector<a_int> select(ncv, 0);
    a_int info_e = 0;
    arpack::neupd(1, arpack::howmny::ritz_vectors, select.data(), theta.data(), z.data(), n,
                  Complex(0.0), workev.data(), arpack::bmat::identity, n,
                  arpack::which::largest_magnitude, nev, request.arnoldi_tolerance, resid.data(),
                  ncv, v.data(), n, iparam, ipntr, workd.data(), workl.data(), lworkl,
                  rwork.data(), info_e);
    if (info_e < 0) {
      throw ComputationError("complex eigen solve: ARPACK zneupd failed with info = " +
                             std::to_string(info_e));
    }
    result.n_eigenvalues = nev;

    struct Candidate { double distance; LeakyMode mode; };
    std::vector<Candidate> cands;
    result.n_eff_found.clear();
    result.n_pml_modes_dropped = 0;
    result.n_core_rejected = 0;
    residual_failed = false;
    for (int i = 0; i < std::min(n_conv, nev); ++i) {
      if (theta[i] == 0.0) continue;
      Eigen::VectorXcd x = Eigen::Map<Eigen::VectorXcd>(z.data() + static_cast<std::size_t>(i) * n, n);
      x.normalize();
      const Complex xbx = dotu(x, matrices_.b * x);
      const Complex lambda_ritz = sigma + 1.0 / theta[i];
      const Complex lambda =
          std::abs(xbx) > 1e-14 * norm_b ? dotu(x, matrices_.a * x) / xbx : lambda_ritz;
      const Complex beta = std::sqrt(-lambda);  // principal root: Re β ≥ 0
      const Complex n_eff = beta / k0v;
      result.n_eff_found.push_back(n_eff);
      if (!(beta.real() * beta.real() > 1e-10 * k0v * k0v)) continue;  // evanescent / null space
      if (!has_metal && n_eff.real() > n_max * (1.0 + 1e-6)) continue;  // above every index
      LeakyMode m;
      m.beta = beta;
      m.n_eff = n_eff;
      m.physical_fraction = problem_.pml ? physical_fraction(x, beta) : 1.0;
      if (m.physical_fraction < request.min_physical_fraction) {
        ++result.n_pml_modes_dropped;
        continue;
      }
      // Core selection before the residual test: a rejected mode must not fail the status.
      if (request.core) {
        m.core_fraction = core_fraction(x, beta, *request.core);
        if (!(m.core_fraction >= request.core->min_fraction)) {
          ++result.n_core_rejected;
          continue;
        }
      }
      const Eigen::VectorXcd r = matrices_.a * x - lambda * (matrices_.b * x);
      m.residual = r.norm() / ((norm_a + std::abs(lambda) * norm_b) * x.norm());
      if (!(m.residual <= request.residual_tolerance)) {
        residual_failed = true;
        continue;
      }
      m.n_eff_imag = std::abs(n_eff.imag());
      m.loss_db_per_m = loss_db_per_m(k0v, m.n_eff_imag);
      m.gain = n_eff.imag() > request.n_eff_imag_floor;
      m.loss_unresolved = m.n_eff_imag < request.n_eff_imag_floor;
      Eigen::Index k;
      x.cwiseAbs().maxCoeff(&k);
      m.eigenvector = x * (std::abs(x[k]) / x[k]);  // deterministic phase: largest entry real > 0
      cands.push_back({std::abs(lambda - sigma), std::move(m)});
    }
    std::sort(cands.begin(), cands.end(),
              [](const Candidate& a, const Candidate& b) { return a.distance < b.distance; });
    accepted.clear();
    for (auto& c : cands) {
      if (static_cast<int>(accepted.size()) >= request.n_modes) break;
      accepted.push_back(std::move(c.mode));
    }
    if (static_cast<int>(accepted.size()) >= request.n_modes || nev >= nev_cap || !arnoldi_ok) break;
    nev = std::min(nev_cap, 2 * nev);
  }
  std::sort(accepted.begin(), accepted.end(),
            [](const LeakyMode& a, const LeakyMode& b) { return a.n_eff.real() > b.n_eff.real(); });
  result.modes = std::move(accepted);
  result.timing.eigensolve_s = seconds_since(t_eig);
  if (!arnoldi_ok) result.status = EigenStatus::not_converged;
  else if (residual_failed) result.status = EigenStatus::residual_too_large;
  return result;
}

}  // namespace cladwise
