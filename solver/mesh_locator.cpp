// Uniform-grid bucket point location on a triangle mesh (see mesh_locator.hpp).
#include "solver/mesh_locator.hpp"

#include <algorithm>
#include <cmath>

#include "solver/assembly.hpp"
#include "solver/element_kernels.hpp"
#include "solver/lagrange_triangle.hpp"

namespace cladwise {

MeshLocator::MeshLocator(const Mesh& mesh, double buckets_per_triangle) : mesh_(&mesh) {
  const int nt = mesh.n_triangles();
  x0_ = y0_ = 1e300;
  x1_ = y1_ = -1e300;
  for (const auto& p : mesh.nodes) {
    x0_ = std::min(x0_, p[0]), x1_ = std::max(x1_, p[0]);
    y0_ = std::min(y0_, p[1]), y1_ = std::max(y1_, p[1]);
  }
  if (nt == 0) return;
  const double w = std::max(x1_ - x0_, 1e-300), h = std::max(y1_ - y0_, 1e-300);
  cell_ = std::sqrt(w * h / std::max(1.0, buckets_per_triangle * nt));
  nx_ = std::max(1, static_cast<int>(std::ceil(w / cell_)));
  ny_ = std::max(1, static_cast<int>(std::ceil(h / cell_)));
  // Bounding boxes of the nodes, enlarged by a quarter of their size: a curved 6-node edge may
  // bulge beyond its nodes by a small fraction of the element size.
  std::vector<std::array<int, 4>> range(nt);
  std::vector<int> count(static_cast<std::size_t>(nx_) * ny_ + 1, 0);
  for (int t = 0; t < nt; ++t) {
    double a0 = 1e300, a1 = -1e300, b0 = 1e300, b1 = -1e300;
    for (int i = 0; i < mesh.nodes_per_triangle(); ++i) {
      const Point2& p = mesh.nodes[mesh.triangles[t][i]];
      a0 = std::min(a0, p[0]), a1 = std::max(a1, p[0]), b0 = std::min(b0, p[1]), b1 = std::max(b1, p[1]);
    }
    const double pad = 0.25 * std::max(a1 - a0, b1 - b0);
    auto ix = [&](double x) { return std::clamp(static_cast<int>((x - x0_) / cell_), 0, nx_ - 1); };
    auto iy = [&](double y) { return std::clamp(static_cast<int>((y - y0_) / cell_), 0, ny_ - 1); };
    range[t] = {ix(a0 - pad), ix(a1 + pad), iy(b0 - pad), iy(b1 + pad)};
    for (int j = range[t][2]; j <= range[t][3]; ++j)
      for (int i = range[t][0]; i <= range[t][1]; ++i) ++count[j * nx_ + i + 1];
  }
  for (std::size_t k = 1; k < count.size(); ++k) count[k] += count[k - 1];
  start_ = count;
  triangles_.resize(count.back());
  for (int t = 0; t < nt; ++t) {
    for (int j = range[t][2]; j <= range[t][3]; ++j)
      for (int i = range[t][0]; i <= range[t][1]; ++i) triangles_[count[j * nx_ + i]++] = t;
  }
}

bool MeshLocator::inside(int t, const Eigen::Vector2d& x, Eigen::Vector2d& xi) const {
  const ElementGeometry g = element_geometry(*mesh_, t);
  // Barycentric coordinates in the straight triangle of the three vertices: exact for 3-node
  // triangles, and a cheap rejection test and Newton start for curved 6-node ones, whose edges
  // bulge from the chords by a small fraction of the element (the margin below).
  const Eigen::Vector2d a = g.x.col(0), e1 = g.x.col(1) - a, e2 = g.x.col(2) - a;
  const double det = e1.x() * e2.y() - e1.y() * e2.x();
  if (!(std::abs(det) > 0.0)) return false;
  const Eigen::Vector2d d = x - a;
  xi = Eigen::Vector2d((d.x() * e2.y() - d.y() * e2.x()) / det, (e1.x() * d.y() - e1.y() * d.x()) / det);
  const double tol = 1e-10;
  auto in_reference = [tol](const Eigen::Vector2d& s, double margin) {
    return s.x() >= -tol - margin && s.y() >= -tol - margin && s.x() + s.y() <= 1.0 + tol + margin;
  };
  if (g.n_nodes != 6) return in_reference(xi, 0.0);
  if (!in_reference(xi, 0.25)) return false;
  for (int it = 0; it < 20; ++it) {  // Newton on x(ξ) = x
    LagrangeTriangle<2>::Values l;
    LagrangeTriangle<2>::Gradients dl;
    LagrangeTriangle<2>::evaluate(xi, l, dl);
    const Eigen::Matrix2d jacobian = g.x * dl.transpose();
    const Eigen::Vector2d step = jacobian.inverse() * (g.x * l - x);
    xi -= step;
    if (step.norm() < 1e-14) break;
    if (xi.norm() > 10.0) return false;  // far outside: Newton on a curved map may wander
  }
  if (!in_reference(xi, 0.0)) return false;
  return (map_point(g, xi).x - x).norm() <= 1e-9 * (1.0 + x.norm());
}

std::optional<MeshPoint> MeshLocator::locate(const Point2& p) const {
  if (triangles_.empty() || p[0] < x0_ || p[0] > x1_ || p[1] < y0_ || p[1] > y1_) return std::nullopt;
  const int i = std::clamp(static_cast<int>((p[0] - x0_) / cell_), 0, nx_ - 1);
  const int j = std::clamp(static_cast<int>((p[1] - y0_) / cell_), 0, ny_ - 1);
  const int b = j * nx_ + i;
  const Eigen::Vector2d x(p[0], p[1]);
  for (int k = start_[b]; k < start_[b + 1]; ++k) {
    MeshPoint out;
    if (inside(triangles_[k], x, out.xi)) {
      out.triangle = triangles_[k];
      return out;
    }
  }
  return std::nullopt;
}

}  // namespace cladwise
