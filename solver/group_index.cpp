#include "solver/group_index.hpp"

#include <cassert>
#include <cmath>
#include <numbers>

#include "mesh/error.hpp"
#include "solver/assembly.hpp"
#include "solver/element_kernels.hpp"

namespace cladwise {

double group_index(const ModeSolver& solver, const Mode& mode,
                   const std::vector<std::array<double, 3>>& deps_dk0) {
  const ModeProblem& p = solver.problem();
  const std::size_t n_regions = p.region_materials.size();
  if (!deps_dk0.empty() && deps_dk0.size() != n_regions) {
    throw std::logic_error("group_index: one dε/dk0 per region");
  }
  if (mode.eigenvector.size() != solver.n_dofs()) {
    throw InputError("group_index", "the mode was not solved on this solver's unknowns");
  }
  const double k0 = solver.k0();
  std::vector<MaterialTensors<double>> eps, deps;
  for (std::size_t r = 0; r < n_regions; ++r) {
    eps.push_back(material_tensors(p.region_materials[r]));
    MaterialTensors<double> d = eps.back();  // same 1/μ, ε replaced by dε/dk0
    const std::array<double, 3> de = deps_dk0.empty() ? std::array<double, 3>{0, 0, 0} : deps_dk0[r];
    d.eps_t << de[0], 0.0, 0.0, de[1];
    d.eps_zz = de[2];
    deps.push_back(d);
  }
  // T[ε] from the pencil at k0 = 0 and k0 = 1: A(1) = S − T_A[ε], so T_A[ε] = A(0) − A(1).
  const auto m0 = assemble_waveguide<double>(solver.dof_map(), eps, 0.0);
  const auto m1 = assemble_waveguide<double>(solver.dof_map(), eps, 1.0);
  const auto md = assemble_waveguide<double>(solver.dof_map(), deps, 1.0);
  const Eigen::VectorXd& x = mode.eigenvector;
  const double lambda = -mode.beta * mode.beta;
  auto quad = [&x](const Eigen::SparseMatrix<double>& m) { return x.dot(m * x); };
  const double ta = quad(m0.a) - quad(m1.a), tad = quad(m0.a) - quad(md.a);
  const double tb = quad(m0.b) - quad(m1.b), tbd = quad(m0.b) - quad(md.b);
  const double a_prime = -2.0 * k0 * ta - k0 * k0 * tad;
  const double b_prime = -2.0 * k0 * tb - k0 * k0 * tbd;
  const double xbx = quad(solver.matrices().b);
  const double dlambda_dk0 = (a_prime - lambda * b_prime) / xbx;
  return -dlambda_dk0 / (2.0 * mode.beta);
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
