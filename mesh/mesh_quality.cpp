// Areas and quality of plain meshes; see mesh_quality.hpp for the measures.
#include "mesh/mesh_quality.hpp"

#include <algorithm>
#include <array>
#include <cassert>
#include <cmath>

namespace cladwise {
namespace {

// Jacobian determinant of the 6-node map x(ξ, η) = Σ N_i(ξ, η) x_i at (ξ, η), with
// λ0 = 1 − ξ − η, λ1 = ξ, λ2 = η; N_k = λ_k (2 λ_k − 1) at the corners and 4 λ_a λ_b at the
// mid-edge nodes of edges (0,1), (1,2), (2,0).
double det_j_p2(const std::array<Point2, 6>& x, double xi, double eta) {
  const double l0 = 1 - xi - eta, l1 = xi, l2 = eta;
  // dN/dξ and dN/dη
  const double dxi[6] = {-(4 * l0 - 1), 4 * l1 - 1, 0, 4 * (l0 - l1), 4 * l2, -4 * l2};
  const double deta[6] = {-(4 * l0 - 1), 0, 4 * l2 - 1, -4 * l1, 4 * l1, 4 * (l0 - l2)};
  double a = 0, b = 0, c = 0, d = 0;
  for (int i = 0; i < 6; ++i) {
    a += dxi[i] * x[i][0];
    b += deta[i] * x[i][0];
    c += dxi[i] * x[i][1];
    d += deta[i] * x[i][1];
  }
  return a * d - b * c;
}

std::array<Point2, 6> p2_nodes(const Mesh& mesh, int t) {
  std::array<Point2, 6> x;
  for (int i = 0; i < 6; ++i) x[i] = mesh.nodes[mesh.triangles[t][i]];
  return x;
}

double straight_det(const Mesh& mesh, int t) {
  const auto& a = mesh.nodes[mesh.triangles[t][0]];
  const auto& b = mesh.nodes[mesh.triangles[t][1]];
  const auto& c = mesh.nodes[mesh.triangles[t][2]];
  return (b[0] - a[0]) * (c[1] - a[1]) - (c[0] - a[0]) * (b[1] - a[1]);
}

}  // namespace

double triangle_area(const Mesh& mesh, int t) {
  if (mesh.order == 1) return 0.5 * std::abs(straight_det(mesh, t));
  const auto x = p2_nodes(mesh, t);
  // ∫_T̂ det J dξ dη with the edge-midpoint rule, weights |T̂|/3 = 1/6 (exact for degree 2)
  const double s = det_j_p2(x, 0.5, 0.0) + det_j_p2(x, 0.5, 0.5) + det_j_p2(x, 0.0, 0.5);
  return std::abs(s) / 6.0;
}

double radius_ratio(const Mesh& mesh, int t) {
  const auto& p = mesh.nodes[mesh.triangles[t][0]];
  const auto& q = mesh.nodes[mesh.triangles[t][1]];
  const auto& r = mesh.nodes[mesh.triangles[t][2]];
  const double a = std::hypot(q[0] - r[0], q[1] - r[1]);
  const double b = std::hypot(p[0] - r[0], p[1] - r[1]);
  const double c = std::hypot(p[0] - q[0], p[1] - q[1]);
  const double area = 0.5 * std::abs(straight_det(mesh, t));
  const double denom = a * b * c * (a + b + c);
  return denom > 0 ? 16.0 * area * area / denom : 0.0;
}

double jacobian_ratio(const Mesh& mesh, int t) {
  if (mesh.order == 1) return 1.0;
  const auto x = p2_nodes(mesh, t);
  const double d0 = straight_det(mesh, t);
  if (d0 == 0) return 0.0;
  const double pts[6][2] = {{0, 0}, {1, 0}, {0, 1}, {0.5, 0}, {0.5, 0.5}, {0, 0.5}};
  double r = 1e300;
  for (const auto& p : pts) r = std::min(r, det_j_p2(x, p[0], p[1]) / d0);
  return r;
}

std::vector<double> region_areas(const Mesh& mesh) {
  std::vector<double> areas(mesh.regions.size(), 0.0);
  for (int t = 0; t < mesh.n_triangles(); ++t) areas[mesh.triangle_region[t]] += triangle_area(mesh, t);
  return areas;
}

MeshReport summarize(const Mesh& mesh) {
  MeshReport rep;
  rep.order = mesh.order;
  rep.n_triangles = mesh.n_triangles();
  rep.n_nodes = mesh.n_nodes();
  rep.n_vertices = mesh.n_vertices;
  rep.regions.resize(mesh.regions.size());
  for (std::size_t i = 0; i < mesh.regions.size(); ++i) {
    rep.regions[i].name = mesh.regions[i].name;
    rep.regions[i].material = mesh.regions[i].material;
    rep.regions[i].role = mesh.regions[i].role;
    rep.regions[i].min_quality = 1.0;
  }
  double sum_q = 0;
  rep.min_quality = mesh.n_triangles() > 0 ? 1.0 : 0.0;
  for (int t = 0; t < mesh.n_triangles(); ++t) {
    auto& rr = rep.regions[mesh.triangle_region[t]];
    const double q = radius_ratio(mesh, t);
    rr.area += triangle_area(mesh, t);
    rr.n_triangles += 1;
    rr.min_quality = std::min(rr.min_quality, q);
    rr.mean_quality += q;
    sum_q += q;
    rep.min_quality = std::min(rep.min_quality, q);
    rep.min_jacobian_ratio = std::min(rep.min_jacobian_ratio, jacobian_ratio(mesh, t));
  }
  for (auto& rr : rep.regions) {
    if (rr.n_triangles > 0) {
      rr.mean_quality /= rr.n_triangles;
    } else {
      rr.min_quality = 0;
    }
  }
  if (mesh.n_triangles() > 0) rep.mean_quality = sum_q / mesh.n_triangles();
  return rep;
}

}  // namespace cladwise
