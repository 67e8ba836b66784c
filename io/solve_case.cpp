#include "io/solve_case.hpp"

#include <cmath>
#include <string>

#include "io/progress.hpp"
#include "mesh/error.hpp"
#include "solver/material.hpp"

namespace cladwise::io {

ModeProblem mode_problem(const CaseSpec& c, const Mesh& mesh) {
  ModeProblem p;
  p.mesh = &mesh;
  p.wavelength_um = c.wavelength_um;
  p.order = mesh.order;
  for (const auto& region : mesh.regions) {
    if (region.role == RegionRole::pml) {
      throw InputError(c.geometry.outer.where + " key 'pml_thickness_um'",
                       "leaky-mode solving with a perfectly matched layer is not available in "
                       "this version; set pml_thickness_um = 0 (the outer wall then closes the "
                       "domain) to compute the real part of the effective indices");
    }
    const MaterialSpec* m = c.find_material(region.material);
    if (!m) throw InputError(c.path.string(), "region '" + region.name + "' names material '" + region.material + "', which the case does not define");
    const PermittivityTensor eps = m->permittivity(c.wavelength_um);
    if (!eps.is_real() || !eps.is_diagonal()) {
      throw InputError(m->where + " [materials] '" + m->name + "'",
                       "absorbing, metallic and rotated-crystal materials need the complex solver, "
                       "which is not available in this version");
    }
    p.region_materials.push_back(diagonal_material(eps.xx.real(), eps.yy.real(), eps.zz.real(), m->name));
  }
  for (const auto& b : mesh.boundaries) {
    WallKind w = c.walls.outer;
    if (b.kind == BoundaryKind::symmetry_x) w = c.walls.x_axis;
    if (b.kind == BoundaryKind::symmetry_y) w = c.walls.y_axis;
    p.boundary_walls.push_back(w == WallKind::electric ? WallType::electric : WallType::magnetic);
  }
  return p;
}

CaseSolution solve_case(const CaseSpec& c, const Mesh& mesh, Progress* progress) {
  ModeSolver solver(mode_problem(c, mesh));
  if (progress) {
    solver.set_progress([progress](std::string_view stage, double f) { progress->update(stage, f); });
  }
  SolveRequest request;
  request.n_modes = c.solve.n_modes;
  request.n_target = c.solve.target_index;
  request.all_guided = c.solve.all_guided;
  if (c.solve.all_guided && !c.import) {
    // Guided modes lie above the background (cladding) index.
    request.n_lower_bound = c.find_material(c.geometry.background_material)->max_index(c.wavelength_um);
  }
  if (c.solve.target_index && *c.solve.target_index > solver.max_material_index()) {
    throw InputError(c.path.string() + " [solve] key 'target_index'",
                     "is above every material index (" + std::to_string(solver.max_material_index()) +
                         "); no mode can have an effective index there");
  }
  const SolveResult result = solver.solve(request);
  switch (result.status) {
    case EigenStatus::converged:
      break;
    case EigenStatus::search_incomplete:
      if (progress) progress->note("warning: the search for every guided mode stopped at its cap; modes below the last one found may be missing");
      break;
    case EigenStatus::factorization_failed:
      throw ComputationError("the shifted matrix is singular at the target index; move [solve] target_index slightly");
    case EigenStatus::not_converged:
      throw ComputationError("the eigensolver did not converge; try a target_index nearer the expected modes or fewer modes");
    case EigenStatus::residual_too_large:
      throw ComputationError("an eigenpair failed the residual check (" + std::string(to_string(result.status)) + "); refine the mesh or change target_index");
  }
  if (result.modes.empty()) {
    throw ComputationError("no guided mode found near the target index; check the materials (is the core index above the cladding?) or set [solve] target_index");
  }
  CaseSolution out;
  out.timing = result.timing;
  out.n_dofs = result.n_dofs;
  out.status = result.status;
  for (std::size_t i = 0; i < result.modes.size(); ++i) {
    SolvedMode sm;
    sm.mode = result.modes[i];
    sm.label = "mode" + std::to_string(i + 1);
    const ModeFieldEvaluator fields(solver.problem(), solver.dof_map(), sm.mode);
    sm.fields = fields.at_nodes();
    sm.metrics.push_back({"beta_per_um", sm.mode.beta});
    out.modes.push_back(std::move(sm));
  }
  return out;
}

std::vector<VtkArray> mode_field_arrays(const CaseSpec& c, const Mesh& mesh, const SolvedMode& m) {
  const std::size_t n = mesh.nodes.size();
  VtkArray e_re{"E_re", 3, {}, false}, e_im{"E_im", 3, {}, false};
  VtkArray h_re{"H_re", 3, {}, false}, h_im{"H_im", 3, {}, false};
  VtkArray e2{"E_abs2", 1, {}, false}, sz{"S_z", 1, {}, false};
  for (std::size_t i = 0; i < n; ++i) {
    const auto& e = m.fields.e[i];
    const auto& h = m.fields.h[i];
    for (int k = 0; k < 3; ++k) {
      e_re.values.push_back(e[k].real());
      e_im.values.push_back(e[k].imag());
      h_re.values.push_back(h[k].real());
      h_im.values.push_back(h[k].imag());
    }
    e2.values.push_back(e.squaredNorm());
    sz.values.push_back(m.fields.s_z[i]);
  }
  VtkArray index{"index", 1, {}, true};
  for (int t = 0; t < mesh.n_triangles(); ++t) {
    const MaterialSpec* mat = c.find_material(mesh.regions[mesh.triangle_region[t]].material);
    index.values.push_back(mat ? mat->max_index(c.wavelength_um) : std::nan(""));
  }
  return {e_re, e_im, h_re, h_im, e2, sz, index};
}

}  // namespace cladwise::io
