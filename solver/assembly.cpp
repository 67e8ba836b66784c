// Sparse assembly of the Lee–Sun–Cendes pencil (see assembly.hpp).
#include "solver/assembly.hpp"

#include <Eigen/SparseCore>

#include <complex>
#include <string>

#include "mesh/error.hpp"

namespace cladwise {
namespace {

constexpr int kChunk = 256;  // elements per triplet list; fixed so results do not depend on threads

template <typename Scalar, int Order>
WaveguideElementMatrices<Scalar, Order> element_matrices(const ElementGeometry& g,
                                                         const MaterialTensors<Scalar>& tensors,
                                                         double k0, const QuadratureRule& rule) {
  return waveguide_element_matrices<Scalar, Order>(g, tensors, k0, rule);
}

template <typename Scalar, int Order>
WaveguideElementMatrices<Scalar, Order> element_matrices(const ElementGeometry& g,
                                                         const RegionMedium<Scalar>& medium,
                                                         double k0, const QuadratureRule& rule) {
  if (!medium.at_point) return waveguide_element_matrices<Scalar, Order>(g, medium.tensors, k0, rule);
  return waveguide_element_matrices_at<Scalar, Order>(
      g, [&medium](const Eigen::Vector2d& x) { return medium.at_point(x); }, k0, rule);
}

template <typename Scalar, int Order, typename Media>
void assemble_chunk(const DofMap& dofs, const std::vector<Media>& tensors,
                    double k0, int t_begin, int t_end,
                    std::vector<Eigen::Triplet<Scalar>>& ta, std::vector<Eigen::Triplet<Scalar>>& tb,
                    bool& inverted) {
  using Em = WaveguideElementMatrices<Scalar, Order>;
  constexpr int nt = Em::n_t, nz = Em::n_z;
  const Mesh& mesh = dofs.mesh();
  const QuadratureRule& rule = triangle_rule(kernel_quadrature_degree(Order));
  int index[nt + nz];
  double sign[nt + nz];
  for (int t = t_begin; t < t_end; ++t) {
    const ElementGeometry g = element_geometry(mesh, t);
    for (const auto& xi : rule.points) {
      if (!(map_point(g, xi).det > 0.0)) { inverted = true; return; }
    }
    const Em em = element_matrices<Scalar, Order>(g, tensors[mesh.triangle_region[t]], k0, rule);
    dofs.element_dofs(t, index, sign);
    for (int i = 0; i < nt; ++i) {
      if (index[i] < 0) continue;
      for (int j = 0; j < nt; ++j) {
        if (index[j] < 0) continue;
        const double s = sign[i] * sign[j];
        ta.emplace_back(index[i], index[j], Scalar(s) * em.a_tt(i, j));
        tb.emplace_back(index[i], index[j], Scalar(s) * em.b_tt(i, j));
      }
      for (int j = 0; j < nz; ++j) {
        if (index[nt + j] < 0) continue;
        const Scalar v = Scalar(sign[i]) * em.b_tz(i, j);
        tb.emplace_back(index[i], index[nt + j], v);
        tb.emplace_back(index[nt + j], index[i], v);
      }
    }
    for (int i = 0; i < nz; ++i) {
      if (index[nt + i] < 0) continue;
      for (int j = 0; j < nz; ++j) {
        if (index[nt + j] < 0) continue;
        tb.emplace_back(index[nt + i], index[nt + j], em.b_zz(i, j));
      }
    }
  }
}

template <typename Scalar, int Order, typename Media>
SystemMatrices<Scalar> assemble_order(const DofMap& dofs, const std::vector<Media>& tensors,
                                      double k0) {
  const int n_t = dofs.mesh().n_triangles();
  const int n_chunks = (n_t + kChunk - 1) / kChunk;
  std::vector<std::vector<Eigen::Triplet<Scalar>>> ta(n_chunks), tb(n_chunks);
  std::vector<char> inverted(n_chunks, 0);
#pragma omp parallel for schedule(dynamic)
  for (int c = 0; c < n_chunks; ++c) {
    bool bad = false;
    assemble_chunk<Scalar, Order, Media>(dofs, tensors, k0, c * kChunk, std::min(n_t, (c + 1) * kChunk),
                                  ta[c], tb[c], bad);
    inverted[c] = bad;
  }
  for (int c = 0; c < n_chunks; ++c) {
    if (inverted[c]) {
      throw ComputationError("assembly: an element in triangles [" + std::to_string(c * kChunk) +
                             ", " + std::to_string(std::min(n_t, (c + 1) * kChunk)) +
                             ") is inverted or clockwise (det J <= 0); check the mesh, in "
                             "particular curved mid-edge nodes");
    }
  }
  std::vector<Eigen::Triplet<Scalar>> all_a, all_b;
  std::size_t na = 0, nb = 0;
  for (int c = 0; c < n_chunks; ++c) { na += ta[c].size(); nb += tb[c].size(); }
  all_a.reserve(na);
  all_b.reserve(nb);
  for (int c = 0; c < n_chunks; ++c) {
    all_a.insert(all_a.end(), ta[c].begin(), ta[c].end());
    all_b.insert(all_b.end(), tb[c].begin(), tb[c].end());
    std::vector<Eigen::Triplet<Scalar>>().swap(ta[c]);
    std::vector<Eigen::Triplet<Scalar>>().swap(tb[c]);
  }
  SystemMatrices<Scalar> m;
  const int n = dofs.n_dofs();
  m.a.resize(n, n);
  m.b.resize(n, n);
  m.a.setFromTriplets(all_a.begin(), all_a.end());
  m.b.setFromTriplets(all_b.begin(), all_b.end());
  return m;
}

}  // namespace

ElementGeometry element_geometry(const Mesh& mesh, int t) {
  ElementGeometry g;
  g.n_nodes = mesh.nodes_per_triangle();
  const auto& tri = mesh.triangles[t];
  for (int i = 0; i < g.n_nodes; ++i) {
    g.x(0, i) = mesh.nodes[tri[i]][0];
    g.x(1, i) = mesh.nodes[tri[i]][1];
  }
  return g;
}

namespace {

template <typename Scalar, typename Media>
SystemMatrices<Scalar> assemble_media(const DofMap& dofs, const std::vector<Media>& media, double k0) {
  if (media.size() != dofs.mesh().regions.size()) {
    throw InputError("materials", "one material is needed per mesh region (" +
                                      std::to_string(dofs.mesh().regions.size()) + "), got " +
                                      std::to_string(media.size()));
  }
  return dofs.order() == 1 ? assemble_order<Scalar, 1, Media>(dofs, media, k0)
                           : assemble_order<Scalar, 2, Media>(dofs, media, k0);
}

}  // namespace

template <typename Scalar>
SystemMatrices<Scalar> assemble_waveguide(const DofMap& dofs,
                                          const std::vector<MaterialTensors<Scalar>>& region_tensors,
                                          double k0) {
  return assemble_media<Scalar>(dofs, region_tensors, k0);
}

template <typename Scalar>
SystemMatrices<Scalar> assemble_waveguide(const DofMap& dofs,
                                          const std::vector<RegionMedium<Scalar>>& region_media,
                                          double k0) {
  return assemble_media<Scalar>(dofs, region_media, k0);
}

template SystemMatrices<double> assemble_waveguide<double>(
    const DofMap&, const std::vector<MaterialTensors<double>>&, double);
template SystemMatrices<std::complex<double>> assemble_waveguide<std::complex<double>>(
    const DofMap&, const std::vector<MaterialTensors<std::complex<double>>>&, double);
template SystemMatrices<double> assemble_waveguide<double>(
    const DofMap&, const std::vector<RegionMedium<double>>&, double);
template SystemMatrices<std::complex<double>> assemble_waveguide<std::complex<double>>(
    const DofMap&, const std::vector<RegionMedium<std::complex<double>>>&, double);

}  // namespace cladwise
