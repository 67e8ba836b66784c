// Global DOF numbering and electric-wall elimination (see dof_map.hpp).
#include "solver/dof_map.hpp"

#include <cassert>
#include <string>

#include "mesh/error.hpp"

namespace cladwise {

DofMap::DofMap(const Mesh& mesh, int order, const std::vector<WallType>& boundary_walls)
    : mesh_(&mesh), order_(order) {
  if (order != 1 && order != 2) {
    throw InputError("element order", "must be 1 or 2, got " + std::to_string(order));
  }
  if (boundary_walls.size() != mesh.boundaries.size()) {
    throw InputError("boundary walls", "one wall type is needed per mesh boundary (" +
                                           std::to_string(mesh.boundaries.size()) + "), got " +
                                           std::to_string(boundary_walls.size()));
  }
  if (static_cast<int>(mesh.triangle_edges.size()) != mesh.n_triangles()) {
    throw InputError("mesh", "edge topology missing: call build_topology() before the solver");
  }
  const int n_e = mesh.n_edges();
  const int n_v = mesh.n_vertices;
  const int n_t = mesh.n_triangles();
  std::vector<char> pec_edge(n_e, 0), pec_vertex(n_v, 0);
  for (std::size_t i = 0; i < mesh.boundary_edges.size(); ++i) {
    const int tag = mesh.boundary_edge_tag[i];
    assert(tag >= 0 && tag < static_cast<int>(boundary_walls.size()));
    if (boundary_walls[tag] != WallType::electric) continue;
    const int e = mesh.boundary_edges[i];
    pec_edge[e] = 1;
    pec_vertex[mesh.edges[e][0]] = 1;
    pec_vertex[mesh.edges[e][1]] = 1;
  }
  const int per_edge = order == 1 ? 1 : 2;
  free_t_.assign(per_edge * n_e + (order == 2 ? 2 * n_t : 0), -1);
  free_z_.assign(n_v + (order == 2 ? n_e : 0), -1);
  for (int raw = 0; raw < static_cast<int>(free_t_.size()); ++raw) {
    const bool on_pec = raw < per_edge * n_e && pec_edge[raw / per_edge];
    if (!on_pec) free_t_[raw] = n_free_t_++;
  }
  for (int raw = 0; raw < static_cast<int>(free_z_.size()); ++raw) {
    const bool on_pec = raw < n_v ? pec_vertex[raw] != 0 : pec_edge[raw - n_v] != 0;
    if (!on_pec) free_z_[raw] = n_free_z_++;
  }
}

void DofMap::element_dofs(int t, int* index, double* sign) const {
  const auto& edges = mesh_->triangle_edges[t];
  const auto& signs = mesh_->triangle_edge_signs[t];
  const auto& tri = mesh_->triangles[t];
  if (order_ == 1) {
    for (int k = 0; k < 3; ++k) {
      index[k] = free_t_[edges[k]];
      sign[k] = signs[k];
    }
    for (int i = 0; i < 3; ++i) {
      index[3 + i] = free_nodal_dof(tri[i]);
      sign[3 + i] = 1.0;
    }
    return;
  }
  const int n_e = mesh_->n_edges();
  for (int k = 0; k < 3; ++k) {
    index[2 * k] = free_t_[2 * edges[k]];          // Whitney: odd under reversal
    sign[2 * k] = signs[k];
    index[2 * k + 1] = free_t_[2 * edges[k] + 1];  // ∇(λ_aλ_b): even
    sign[2 * k + 1] = 1.0;
  }
  for (int f = 0; f < 2; ++f) {
    index[6 + f] = free_t_[2 * n_e + 2 * t + f];
    sign[6 + f] = 1.0;
  }
  for (int i = 0; i < 3; ++i) {
    index[8 + i] = free_nodal_dof(tri[i]);
    sign[8 + i] = 1.0;
    index[11 + i] = free_nodal_dof(mesh_->n_vertices + edges[i]);
    sign[11 + i] = 1.0;
  }
}

}  // namespace cladwise
