#include "io/solve_case.hpp"

#include <cassert>
#include <cmath>
#include <numbers>
#include <string>

#include "io/progress.hpp"
#include "mesh/error.hpp"
#include "solver/assembly.hpp"
#include "solver/bend.hpp"
#include "solver/coupled_cores.hpp"
#include "solver/group_index.hpp"
#include "solver/leaky_mode_fields.hpp"
#include "solver/material.hpp"
#include "solver/mesh_locator.hpp"
#include "solver/mode_labels.hpp"
#include "solver/mode_metrics.hpp"
#include "solver/pml.hpp"

namespace cladwise::io {

namespace {

constexpr double kResolvableBirefringence = 1e-7;

const MaterialSpec& region_material(const CaseSpec& c, const Region& region) {
  const MaterialSpec* m = c.find_material(region.material);
  if (!m) {
    throw InputError(c.path.string(), "region '" + region.name + "' names material '" +
                                          region.material + "', which the case does not define");
  }
  return *m;
}

std::vector<WallType> walls(const CaseSpec& c, const Mesh& mesh) {
  std::vector<WallType> out;
  for (const auto& b : mesh.boundaries) {
    WallKind w = c.walls.outer;
    if (b.kind == BoundaryKind::symmetry_x) w = c.walls.x_axis;
    if (b.kind == BoundaryKind::symmetry_y) w = c.walls.y_axis;
    out.push_back(w == WallKind::electric ? WallType::electric : WallType::magnetic);
  }
  return out;
}

void check_target(const CaseSpec& c, double max_index) {
  if (c.solve.target_index && *c.solve.target_index > max_index) {
    throw InputError(c.path.string() + " [solve] key 'target_index'",
                     "is above every material index (" + std::to_string(max_index) +
                         "); no mode can have an effective index there");
  }
}

/// Centre and radius of the case's core when it is one round disk (for vector mode labels).
std::optional<std::pair<Point2, double>> circular_core(const CaseSpec& c) {
  if (c.import) return std::nullopt;
  const RegionSpec* core = nullptr;
  for (const auto& r : c.geometry.regions) {
    if (!r.guiding) continue;
    if (core) return std::nullopt;  // several guiding regions: not one round core
    core = &r;
  }
  if (!core || core->shapes.size() != 1) return std::nullopt;
  const auto* disk = std::get_if<Disk>(&core->shapes[0].geometry);
  if (!disk) return std::nullopt;
  return std::pair{core->shapes[0].placement.offset, disk->radius};
}

void append_metrics(std::vector<std::pair<std::string, double>>& out, const ModeMetrics& m) {
  out.insert(out.end(), {{"effective_area_um2", m.effective_area_um2},
                         {"mfd_petermann_um", m.mfd_petermann_um},
                         {"mfd_petermann_x_um", m.mfd_petermann_x_um},
                         {"mfd_petermann_y_um", m.mfd_petermann_y_um},
                         {"mfd_gaussian_um", m.mfd_gaussian_um},
                         {"width_1e2_x_um", m.width_1e2_x_um},
                         {"width_1e2_y_um", m.width_1e2_y_um},
                         {"centroid_x_um", m.centroid_x_um},
                         {"centroid_y_um", m.centroid_y_um},
                         {"te_fraction", m.te_fraction},
                         {"tm_fraction", m.tm_fraction},
                         {"polarisation_angle_deg", m.polarisation_angle_deg},
                         {"x_fraction", m.x_fraction},
                         {"nonlinear_coefficient_per_w_km", m.nonlinear_coefficient_per_w_km}});
  for (const auto& rp : m.power_fraction) out.push_back({"power_fraction_" + rp.region, rp.fraction});
}

/// Core centres of a multicore case: the shapes of its one guiding region when it has several
/// round cores (core-ring, core-grid).
std::vector<Point2> core_centres(const CaseSpec& c) {
  if (c.import) return {};
  std::vector<Point2> centres;
  for (const auto& r : c.geometry.regions) {
    if (!r.guiding || r.shapes.size() < 2) continue;
    for (const auto& s : r.shapes) {
      if (!std::holds_alternative<Disk>(s.geometry)) return {};
      centres.push_back(s.placement.offset);
    }
    return centres;
  }
  return {};
}

/// Per-core power of every supermode and the coupling of neighbouring cores (supermode
/// splitting; solver/coupled_cores.hpp).
void add_core_coupling(const CaseSpec& c, const Mesh& mesh, const ModeSolver& solver,
                       const std::vector<Mode>& modes, CaseSolution& out) {
  const std::vector<Point2> centres = core_centres(c);
  if (centres.size() < 2) return;
  std::vector<SupermodeCores> per_core;
  for (std::size_t i = 0; i < modes.size(); ++i) {
    const ModeFieldEvaluator fields(solver.problem(), solver.dof_map(), modes[i]);
    per_core.push_back(supermode_cores(fields, mesh, mesh.order, centres));
    for (std::size_t k = 0; k < centres.size(); ++k) {
      out.modes[i].metrics.push_back({"core_power_fraction_" + std::to_string(k + 1), per_core.back().power_fraction[k]});
    }
  }
  for (const auto& array : core_array_coupling(modes, per_core, centres)) {
    for (const auto& p : array.pairs) {
      out.core_pairs.push_back({array.polarisation, p.core_a + 1, p.core_b + 1, p.distance_um,
                                p.coupling.kappa_per_m, p.coupling.coupling_length_m});
    }
  }
}

void check_status(EigenStatus status, Progress* progress) {
  switch (status) {
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
      throw ComputationError("an eigenpair failed the residual check; refine the mesh or change target_index");
    case EigenStatus::no_modes_found:
      break;  // reported below with the case's own advice
  }
}

}  // namespace

namespace {

SolveResult solve_lossless_point(const CaseSpec& c, ModeSolver& solver, Progress* progress,
                                 const std::vector<Mode>* previous = nullptr) {
  SolveRequest request;
  if (previous) {
    for (const Mode& m : *previous) request.start_vectors.push_back(m.eigenvector);
  }
  request.n_modes = c.solve.n_modes;
  request.n_target = c.solve.target_index;
  request.all_guided = c.solve.all_guided;
  if (c.solve.all_guided && !c.import) {
    // Guided modes lie above the background (cladding) index.
    request.n_lower_bound = c.find_material(c.geometry.background_material)->max_index(c.wavelength_um);
  }
  check_target(c, solver.max_material_index());
  SolveResult result = solver.solve(request);
  check_status(result.status, progress);
  if (result.modes.empty()) {
    throw ComputationError("no guided mode found near the target index at " + std::to_string(c.wavelength_um) +
                           " um; check the materials (is the core index above the cladding?) or set [solve] target_index");
  }
  return result;
}

/// dε/dk0 of every region's diagonal permittivity at the case's wavelength (material dispersion).
std::vector<std::array<double, 3>> permittivity_slopes(const CaseSpec& c, const Mesh& mesh) {
  std::vector<std::array<double, 3>> out;
  for (const auto& region : mesh.regions) {
    const MaterialSpec& m = region_material(c, region);
    std::array<double, 3> d{};
    for (int k = 0; k < 3; ++k) {
      const DispersionModel& model = m.models.at(m.kind == MaterialSpec::Kind::diagonal ? k : 0);
      const IndexDerivatives nd = model.derivatives(c.wavelength_um);
      d[k] = permittivity_derivative_dk0(nd.n, nd.dn_dlambda, c.wavelength_um);
    }
    out.push_back(d);
  }
  return out;
}

}  // namespace

LosslessSolve run_lossless_solver(const CaseSpec& c, const Mesh& mesh, Progress* progress) {
  LosslessSolve run;
  run.solver = std::make_unique<ModeSolver>(mode_problem(c, mesh));
  if (progress) {
    run.solver->set_progress([progress](std::string_view stage, double f) { progress->update(stage, f); });
  }
  run.result = solve_lossless_point(c, *run.solver, progress);
  return run;
}

namespace {

CaseSolution postprocess_lossless(const CaseSpec& c, const Mesh& mesh, const MeshLocator& locator,
                                  const ModeSolver& solver,
                                  const SolveResult& result, Progress* progress) {
  CaseSolution out;
  out.wavelength_um = c.wavelength_um;
  const auto deps_dk0 = permittivity_slopes(c, mesh);
  out.timing = result.timing;
  out.n_dofs = result.n_dofs;
  out.status = result.status;
  // Metrics integrate over the whole cross-section; a symmetry cut would need the mirror images.
  const bool full_section = c.import || c.geometry.symmetry == SymmetryCut::none;
  LabelOptions label_options;
  if (const auto core = circular_core(c)) {
    label_options.centre = core->first;
    label_options.core_radius_um = core->second;
  }
  MetricOptions metric_options;
  metric_options.n2_m2_per_w = c.solve.nonlinear_index_m2_per_w;
  metric_options.locator = &locator;
  std::vector<ModeMetrics> all_metrics;
  const std::vector<double> n_group = group_indices(solver, result.modes, deps_dk0);
  for (std::size_t i = 0; i < result.modes.size(); ++i) {
    if (progress) progress->update("mode metrics", static_cast<double>(i) / result.modes.size());
    SolvedMode sm;
    sm.mode = result.modes[i];
    sm.label = "mode" + std::to_string(i + 1);
    const ModeFieldEvaluator fields(solver.problem(), solver.dof_map(), sm.mode);
    sm.fields = fields.at_nodes();
    sm.metrics.push_back({"beta_per_um", sm.mode.beta});
    sm.metrics.push_back({"n_group", n_group[i]});
    if (full_section) {
      // One set of quadrature samples for the label and the metrics.
      const std::vector<FieldQuadraturePoint> samples = sample_mode(fields, mesh, mesh.order, true);
      label_options.samples = &samples;
      metric_options.samples = &samples;
      sm.label = label_mode(fields, locator, label_options).label;
      const ModeMetrics mm = mode_metrics(fields, solver.problem(), solver.dof_map(), sm.mode, metric_options);
      label_options.samples = metric_options.samples = nullptr;
      append_metrics(sm.metrics, mm);
      all_metrics.push_back(mm);
    }
    out.modes.push_back(std::move(sm));
  }
  if (full_section) {
    add_core_coupling(c, mesh, solver, result.modes, out);
    if (const auto pair = fundamental_polarisation_pair(all_metrics)) {
      const Birefringence b = birefringence(out.modes[pair->x_mode].mode.n_eff,
                                            out.modes[pair->y_mode].mode.n_eff, c.wavelength_um);
      // Below 1e-7 the two partners of a degenerate pair differ by discretisation noise (about
      // 1e-8 on the example meshes of a round fibre), so no birefringence is claimed.
      if (std::abs(b.phase) >= kResolvableBirefringence)
      for (int i : {pair->x_mode, pair->y_mode}) {
        out.modes[i].metrics.push_back({"birefringence", b.phase});
        out.modes[i].metrics.push_back({"beat_length_mm", b.beat_length_mm});
      }
    }
  }
  return out;
}

CaseSolution solve_leaky_point(const CaseSpec& c, ComplexModeSolver& solver, Progress* progress) {
  if (progress) progress->update("complex solve");
  check_target(c, solver.max_physical_index());
  if (c.solve.all_guided) {
    throw InputError(c.path.string() + " [solve] key 'all_guided'",
                     "is for lossless guides; with a PML, lossy materials or a bend ask for a number of modes");
  }
  LeakySolveRequest request;
  request.n_modes = c.solve.n_modes;
  request.n_target = c.solve.target_index;
  if (c.solve.check_pml) request.pml_check_factor = 2.0;
  if (c.solve.core_region) {
    CoreSelection core;
    const Mesh& mesh = *solver.problem().mesh;
    for (int r = 0; r < static_cast<int>(mesh.regions.size()); ++r) {
      if (mesh.regions[r].name == *c.solve.core_region) core.regions.push_back(r);
    }
    if (core.regions.empty()) {
      throw InputError(c.solve.core_region_where, "no region of the mesh is called '" + *c.solve.core_region + "'");
    }
    request.core = core;
  }
  const LeakySolveResult result = solver.solve(request);
  check_status(result.status, progress);
  if (result.modes.empty()) {
    throw ComputationError("no mode found near the target index (" + std::to_string(result.n_pml_modes_dropped) +
                           " solutions living in the PML were dropped); set [solve] target_index near the expected effective index");
  }
  CaseSolution out;
  out.wavelength_um = c.wavelength_um;
  out.timing = result.timing;
  out.n_dofs = result.n_dofs;
  out.status = result.status;
  for (std::size_t i = 0; i < result.modes.size(); ++i) {
    const LeakyMode& lm = result.modes[i];
    SolvedMode sm;
    sm.mode.beta = lm.beta.real();
    sm.mode.n_eff = lm.n_eff.real();
    sm.mode.residual = lm.residual;
    sm.n_eff_imag = lm.n_eff_imag;
    sm.loss_db_per_m = lm.loss_db_per_m;
    sm.label = "mode" + std::to_string(i + 1);
    sm.metrics.push_back({"beta_per_um", lm.beta.real()});
    sm.metrics.push_back({"physical_domain_fraction", lm.physical_fraction});
    if (c.bend) {
      // Loss of a 90° and of a full turn of the bend: the arc length is R·angle (µm → m).
      sm.metrics.push_back({"bend_loss_db_per_90deg", bend_loss_db(lm.loss_db_per_m, c.bend->radius_um, 0.5 * std::numbers::pi)});
      sm.metrics.push_back({"bend_loss_db_per_turn", bend_loss_db(lm.loss_db_per_m, c.bend->radius_um, 2.0 * std::numbers::pi)});
    }
    if (std::isfinite(lm.pml_loss_change)) sm.metrics.push_back({"pml_loss_change", lm.pml_loss_change});
    sm.fields = LeakyModeFieldEvaluator(solver, lm).at_nodes();
    sm.complex_eigenvector = lm.eigenvector;
    if (lm.loss_unresolved) {
      sm.warnings.push_back("the loss of " + sm.label + " is below what the PML and mesh resolve (it changes with the PML or lies at rounding level); treat it as an upper bound");
    }
    if (lm.gain) sm.warnings.push_back(sm.label + " shows gain (Im n_eff > 0): not a passive mode; check the materials' loss signs");
    out.modes.push_back(std::move(sm));
  }
  return out;
}

}  // namespace

bool needs_complex_solver(const CaseSpec& c, const Mesh& mesh) {
  if (c.bend) return true;
  for (const auto& region : mesh.regions) {
    if (region.role == RegionRole::pml) return true;
    const PermittivityTensor eps = region_material(c, region).permittivity(c.wavelength_um);
    if (!eps.is_real() || !eps.is_diagonal() || eps.xx.real() <= 0 || eps.yy.real() <= 0 || eps.zz.real() <= 0) return true;
  }
  return false;
}

ModeProblem mode_problem(const CaseSpec& c, const Mesh& mesh) {
  ModeProblem p;
  p.mesh = &mesh;
  p.wavelength_um = c.wavelength_um;
  p.order = mesh.order;
  for (const auto& region : mesh.regions) {
    const MaterialSpec& m = region_material(c, region);
    const PermittivityTensor eps = m.permittivity(c.wavelength_um);
    assert(eps.is_real() && eps.is_diagonal());
    p.region_materials.push_back(diagonal_material(eps.xx.real(), eps.yy.real(), eps.zz.real(), m.name));
  }
  p.boundary_walls = walls(c, mesh);
  return p;
}

LeakyModeProblem leaky_mode_problem(const CaseSpec& c, const Mesh& mesh) {
  LeakyModeProblem p;
  p.mesh = &mesh;
  p.wavelength_um = c.wavelength_um;
  p.order = mesh.order;
  bool has_pml = false;
  for (const auto& region : mesh.regions) {
    const MaterialSpec& m = region_material(c, region);
    const PermittivityTensor eps = m.permittivity(c.wavelength_um);
    TensorMaterial t;
    t.name = m.name;
    t.eps_t << eps.xx, eps.xy, eps.xy, eps.yy;
    t.eps_zz = eps.zz;
    p.region_materials.push_back(t);
    has_pml = has_pml || region.role == RegionRole::pml;
  }
  p.boundary_walls = walls(c, mesh);
  if (has_pml) {
    const auto& o = c.geometry.outer;
    Pml pml;
    pml.centre = o.centre;
    pml.thickness = o.pml_thickness;
    pml.power = c.pml.power;
    pml.strength = c.pml.strength;
    if (o.kind == OuterBoundary::Kind::disk) {
      pml.shape = PmlShape::cylindrical;
      pml.inner_radius = o.radius;
    } else {
      pml.shape = PmlShape::cartesian;
      pml.half_width = 0.5 * o.width;
      pml.half_height = 0.5 * o.height;
    }
    p.pml = pml;
  }
  if (c.bend) {
    Bend b;
    b.radius_um = c.bend->radius_um;
    b.direction_deg = c.bend->direction_deg;
    b.origin = c.geometry.outer.centre;
    b.model = c.bend->conformal ? BendModel::conformal_index : BendModel::exact_transformation;
    p.bend = b;
  }
  return p;
}

std::vector<CaseSolution> solve_sweep(const CaseSpec& c, const Mesh& mesh, Progress* progress) {
  std::vector<CaseSolution> points;
  const bool complex_path = needs_complex_solver(c, mesh);
  // One solver for the whole sweep: the mesh, the DOF map and the sparsity analysis are made
  // once; each point reassembles and refactorises on the same pattern.
  std::unique_ptr<ModeSolver> real;
  std::unique_ptr<ComplexModeSolver> leaky;
  std::unique_ptr<MeshLocator> locator;
  Eigen::SparseMatrix<double> leaky_gram;
  std::vector<Mode> previous_modes;
  for (std::size_t i = 0; i < c.wavelengths_um.size(); ++i) {
    CaseSpec ci = c;
    ci.wavelength_um = c.wavelengths_um[i];
    if (progress && c.wavelengths_um.size() > 1) {
      progress->note("wavelength " + std::to_string(i + 1) + " of " + std::to_string(c.wavelengths_um.size()) +
                     ": " + std::to_string(ci.wavelength_um) + " um");
    }
    if (complex_path) {
      const LeakyModeProblem p = leaky_mode_problem(ci, mesh);
      if (!leaky) {
        leaky = std::make_unique<ComplexModeSolver>(p);
        // ∫ N_i·N_j over the whole mesh (PML included), the same at every point: the metric of
        // the transverse-field overlaps that track complex modes along the sweep.
        const std::vector<MaterialTensors<double>> unit(mesh.regions.size(), material_tensors(Material{}));
        const int ne = leaky->dof_map().n_edge_dofs();
        leaky_gram = assemble_waveguide<double>(leaky->dof_map(), unit, 0.0).b.topLeftCorner(ne, ne);
      } else {
        leaky->set_wavelength(ci.wavelength_um, p.region_materials);
      }
      points.push_back(solve_leaky_point(ci, *leaky, progress));
      points.back().transverse_gram = leaky_gram;
    } else {
      const ModeProblem p = mode_problem(ci, mesh);
      if (!real) {
        real = std::make_unique<ModeSolver>(p);
        if (progress) real->set_progress([progress](std::string_view stage, double f) { progress->update(stage, f); });
      } else {
        real->set_wavelength(ci.wavelength_um, p.region_materials);
      }
      // Warm start from the previous point's modes: same unknowns, nearby eigenvectors.
      const SolveResult r = solve_lossless_point(ci, *real, progress, previous_modes.empty() ? nullptr : &previous_modes);
      previous_modes = r.modes;
      if (!locator) locator = std::make_unique<MeshLocator>(mesh);  // once per mesh, not per point
      points.push_back(postprocess_lossless(ci, mesh, *locator, *real, r, progress));
      // The tt block of B (∫ μ⁻¹ N_i·N_j) does not depend on the wavelength: it measures the
      // overlap of transverse fields between points for mode tracking.
      const int ne = real->dof_map().n_edge_dofs();
      points.back().transverse_gram = real->matrices().b.topLeftCorner(ne, ne);
    }
  }
  return points;
}

CaseSolution solve_case(const CaseSpec& c, const Mesh& mesh, Progress* progress) {
  CaseSpec single = c;
  single.wavelengths_um = {c.wavelength_um};
  return std::move(solve_sweep(single, mesh, progress).front());
}

std::vector<VtkArray> mesh_cell_arrays(const CaseSpec& c, const Mesh& mesh) {
  VtkArray material{"material", 1, {}, true};
  VtkArray index{"index", 1, {}, true};
  for (int t = 0; t < mesh.n_triangles(); ++t) {
    const std::string& name = mesh.regions[mesh.triangle_region[t]].material;
    double id = -1;
    for (std::size_t k = 0; k < c.materials.size(); ++k) {
      if (c.materials[k].name == name) id = static_cast<double>(k);
    }
    material.values.push_back(id);
    const MaterialSpec* mat = c.find_material(name);
    index.values.push_back(mat ? mat->max_index(c.wavelength_um) : std::nan(""));
  }
  return {material, index};
}

std::vector<VtkArray> mode_field_arrays(const CaseSpec& c, const Mesh& mesh, const SolvedMode& m) {
  assert(m.fields);
  const std::size_t n = mesh.nodes.size();
  VtkArray e_re{"E_re", 3, {}, false}, e_im{"E_im", 3, {}, false};
  VtkArray h_re{"H_re", 3, {}, false}, h_im{"H_im", 3, {}, false};
  VtkArray e2{"E_abs2", 1, {}, false}, sz{"S_z", 1, {}, false};
  for (std::size_t i = 0; i < n; ++i) {
    const auto& e = m.fields->e[i];
    const auto& h = m.fields->h[i];
    for (int k = 0; k < 3; ++k) {
      e_re.values.push_back(e[k].real());
      e_im.values.push_back(e[k].imag());
      h_re.values.push_back(h[k].real());
      h_im.values.push_back(h[k].imag());
    }
    e2.values.push_back(e.squaredNorm());
    sz.values.push_back(m.fields->s_z[i]);
  }
  VtkArray e_abs{"E_abs", 1, {}, false}, h_abs{"H_abs", 1, {}, false};
  for (std::size_t i = 0; i < n; ++i) {
    e_abs.values.push_back(m.fields->e[i].norm());
    h_abs.values.push_back(m.fields->h[i].norm());
  }
  std::vector<VtkArray> arrays = {e_re, e_im, h_re, h_im, e_abs, h_abs, e2, sz};
  for (auto& a : mesh_cell_arrays(c, mesh)) arrays.push_back(std::move(a));
  return arrays;  // the last array is "index" (io/cmd_solve.cpp relies on it)
}

}  // namespace cladwise::io
