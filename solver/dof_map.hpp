// DofMap: global numbering of the unknowns of the edge/nodal waveguide formulation on a Mesh, with
// the electric-wall (PEC) unknowns eliminated (docs/formulation.md §5).
//
// "Raw" numbering (before elimination), for element order p:
//   edge block e_t:  p = 1: edge e -> e
//                    p = 2: edge e -> 2e (Whitney, signed), 2e + 1 (gradient ∇(λ_aλ_b), unsigned);
//                           triangle t -> 2 n_edges + 2t + {0, 1} (interior functions F_0, F_1)
//   nodal block e_z: vertex v -> v;  p = 2: edge e -> n_vertices + e (mid-edge function)
// Free numbering: the surviving edge-block unknowns first (raw order), then the surviving nodal
// ones (raw order); so the global vector is [e_t; e_z] with n_edge_dofs() + n_nodal_dofs() entries.
//
// Electric wall: on a boundary edge tagged electric, n×E = 0 removes both edge unknowns of the
// edge, the nodal unknowns of its two vertices and (p = 2) its mid-edge nodal unknown. Magnetic
// walls (n×H = 0) are natural for this formulation: nothing is removed.
#pragma once

#include <cstdint>
#include <vector>

#include "mesh/mesh.hpp"

namespace cladwise {

/// Boundary condition of one named mesh boundary.
enum class WallType : std::uint8_t {
  electric,  ///< perfect electric conductor, n × E = 0 (essential, eliminated)
  magnetic,  ///< perfect magnetic conductor, n × H = 0 (natural)
};

class DofMap {
public:
  /// `boundary_walls[b]` is the wall type of mesh.boundaries[b]. Throws InputError when the sizes
  /// disagree or the order is not 1 or 2. The mesh must outlive the DofMap.
  DofMap(const Mesh& mesh, int order, const std::vector<WallType>& boundary_walls);

  int order() const { return order_; }
  const Mesh& mesh() const { return *mesh_; }

  int n_edge_dofs() const { return n_free_t_; }              ///< free unknowns of e_t
  int n_nodal_dofs() const { return n_free_z_; }             ///< free unknowns of e_z
  int n_dofs() const { return n_free_t_ + n_free_z_; }
  int n_raw_edge_dofs() const { return static_cast<int>(free_t_.size()); }
  int n_raw_nodal_dofs() const { return static_cast<int>(free_z_.size()); }
  int n_eliminated() const { return n_raw_edge_dofs() + n_raw_nodal_dofs() - n_dofs(); }

  int n_local_edge() const { return order_ == 1 ? 3 : 8; }    ///< per-triangle e_t functions
  int n_local_nodal() const { return order_ == 1 ? 3 : 6; }   ///< per-triangle e_z functions
  int n_local() const { return n_local_edge() + n_local_nodal(); }

  /// Global free index of a raw edge-block / nodal-block unknown, or −1 if eliminated.
  int free_edge_dof(int raw) const { return free_t_[raw]; }
  int free_nodal_dof(int raw) const { return free_z_[raw] < 0 ? -1 : n_free_t_ + free_z_[raw]; }

  /// Global indices (−1 = eliminated) and signs (±1) of the n_local() element functions of
  /// triangle t, edge functions first (NedelecTriangle order), then nodal (LagrangeTriangle order).
  void element_dofs(int t, int* index, double* sign) const;

private:
  const Mesh* mesh_;
  int order_;
  std::vector<int> free_t_, free_z_;  // raw -> free (block-local), −1 if eliminated
  int n_free_t_ = 0, n_free_z_ = 0;
};

}  // namespace cladwise
