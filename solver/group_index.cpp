#include "solver/group_index.hpp"

#include <algorithm>
#include <cassert>
#include <cmath>
#include <numbers>

#include "mesh/error.hpp"
#include "solver/assembly.hpp"
#include "solver/element_kernels.hpp"

namespace cladwise {

namespace {

constexpr int kChunk = 256;  // elements per partial sum; fixed so results do not depend on threads

/// Quadratic forms of every mode with the ε-mass blocks, element by element (no global matrix):
/// per mode, xᵀT_A[ε]x, xᵀT_A[dε/dk0]x, xᵀT_B[ε]x, xᵀT_B[dε/dk0]x. T_A is the edge block of
/// the ε-mass, T_B its nodal (zz) block; the other blocks of A and B carry no ε.
template <int Order>
std::vector<std::array<double, 4>> mass_forms(const DofMap& dofs, const std::vector<Material>& eps,
                                              const std::vector<std::array<double, 3>>& deps,
                                              const std::vector<const Eigen::VectorXd*>& x) {
  using Tm = PermittivityMassMatrices<Order>;
  constexpr int nt = Tm::n_t, nz = Tm::n_z;
  const Mesh& mesh = dofs.mesh();
  const QuadratureRule& rule = triangle_rule(kernel_quadrature_degree(Order));
  const int n_t = mesh.n_triangles(), n_chunks = (n_t + kChunk - 1) / kChunk;
  const std::size_t n_modes = x.size();
  std::vector<std::vector<std::array<double, 4>>> partial(n_chunks, std::vector<std::array<double, 4>>(n_modes));
#pragma omp parallel for schedule(dynamic)
  for (int c = 0; c < n_chunks; ++c) {
    int index[nt + nz];
    double sign[nt + nz];
    for (int t = c * kChunk; t < std::min(n_t, (c + 1) * kChunk); ++t) {
      const ElementGeometry g = element_geometry(mesh, t);
      const int r = mesh.triangle_region[t];
      const Material& e = eps[r];
      const Tm te = permittivity_mass_matrices<Order>(g, Eigen::Vector2d(e.eps_xx, e.eps_yy).asDiagonal(), e.eps_zz, rule);
      const Tm td = permittivity_mass_matrices<Order>(g, Eigen::Vector2d(deps[r][0], deps[r][1]).asDiagonal(), deps[r][2], rule);
      dofs.element_dofs(t, index, sign);
      for (std::size_t m = 0; m < n_modes; ++m) {
        Eigen::Matrix<double, nt, 1> xt;
        Eigen::Matrix<double, nz, 1> xz;
        for (int i = 0; i < nt; ++i) xt[i] = index[i] < 0 ? 0.0 : sign[i] * (*x[m])[index[i]];
        for (int i = 0; i < nz; ++i) xz[i] = index[nt + i] < 0 ? 0.0 : (*x[m])[index[nt + i]];
        auto& acc = partial[c][m];
        acc[0] += xt.dot(te.t_tt * xt);
        acc[1] += xt.dot(td.t_tt * xt);
        acc[2] += xz.dot(te.t_zz * xz);
        acc[3] += xz.dot(td.t_zz * xz);
      }
    }
  }
  std::vector<std::array<double, 4>> out(n_modes, {0.0, 0.0, 0.0, 0.0});
  for (int c = 0; c < n_chunks; ++c) {
    for (std::size_t m = 0; m < n_modes; ++m) {
      for (int k = 0; k < 4; ++k) out[m][k] += partial[c][m][k];
    }
  }
  return out;
}

}  // namespace

std::vector<double> group_indices(const ModeSolver& solver, const std::vector<Mode>& modes,
                                  const std::vector<std::array<double, 3>>& deps_dk0) {
  const ModeProblem& p = solver.problem();
  const std::size_t n_regions = p.region_materials.size();
  if (!deps_dk0.empty() && deps_dk0.size() != n_regions) {
    throw std::logic_error("group_index: one dε/dk0 per region");
  }
  std::vector<const Eigen::VectorXd*> x;
  for (const Mode& mode : modes) {
    if (mode.eigenvector.size() != solver.n_dofs()) {
      throw InputError("group_index", "the mode was not solved on this solver's unknowns");
    }
    x.push_back(&mode.eigenvector);
  }
  const double k0 = solver.k0();
  const std::vector<std::array<double, 3>> deps =
      deps_dk0.empty() ? std::vector<std::array<double, 3>>(n_regions, {0.0, 0.0, 0.0}) : deps_dk0;
  const auto forms = solver.dof_map().order() == 2 ? mass_forms<2>(solver.dof_map(), p.region_materials, deps, x)
                                                   : mass_forms<1>(solver.dof_map(), p.region_materials, deps, x);
  std::vector<double> out;
  for (std::size_t m = 0; m < modes.size(); ++m) {
    const auto [ta, tad, tb, tbd] = forms[m];
    const double lambda = -modes[m].beta * modes[m].beta;
    const double a_prime = -2.0 * k0 * ta - k0 * k0 * tad;
    const double b_prime = -2.0 * k0 * tb - k0 * k0 * tbd;
    const double xbx = x[m]->dot(solver.matrices().b * *x[m]);
    const double dlambda_dk0 = (a_prime - lambda * b_prime) / xbx;
    out.push_back(-dlambda_dk0 / (2.0 * modes[m].beta));
  }
  return out;
}

double group_index(const ModeSolver& solver, const Mode& mode,
                   const std::vector<std::array<double, 3>>& deps_dk0) {
  return group_indices(solver, {mode}, deps_dk0).front();
}

double permittivity_derivative_dk0(double n, double dn_dlambda_per_um, double wavelength_um) {
  const double dlambda_dk0 = -wavelength_um * wavelength_um / (2.0 * std::numbers::pi);
  return 2.0 * n * dn_dlambda_per_um * dlambda_dk0;
}

double dispersion_from_group_index_slope(double dng_dlambda_per_um) {
  // (1/c) dn_g/dλ: 1/c in s/m, dλ in µm → s/m² ×1e6; 1 s/m² = 1e6 ps/(nm·km).
  constexpr double c = 299792458.0;
  return dng_dlambda_per_um * 1e6 / c * 1e6;
}

}  // namespace cladwise
