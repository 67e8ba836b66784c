// Helpers shared by the mesh tests: exact geometric predicates on the plain Mesh.
#pragma once

#include <gtest/gtest.h>

#include <cmath>
#include <numbers>
#include <string>
#include <variant>
#include <vector>

#include "mesh/cross_section.hpp"
#include "mesh/mesh.hpp"
#include "mesh/mesh_quality.hpp"

namespace cladwise::test {

inline int region_index(const Mesh& m, const std::string& name) {
  for (std::size_t i = 0; i < m.regions.size(); ++i) {
    if (m.regions[i].name == name) return static_cast<int>(i);
  }
  return -1;
}

inline double region_area(const Mesh& m, const std::string& name) {
  const int r = region_index(m, name);
  EXPECT_GE(r, 0) << "no region " << name;
  return r < 0 ? 0.0 : region_areas(m)[r];
}

inline int boundary_index(const Mesh& m, const std::string& name) {
  for (std::size_t i = 0; i < m.boundaries.size(); ++i) {
    if (m.boundaries[i].name == name) return static_cast<int>(i);
  }
  return -1;
}

/// Point of the (curved) triangle at reference coordinates (ξ, η).
inline Point2 map_point(const Mesh& m, int t, double xi, double eta) {
  const auto& tri = m.triangles[t];
  const double l0 = 1 - xi - eta, l1 = xi, l2 = eta;
  double w[6] = {l0, l1, l2, 0, 0, 0};
  if (m.order == 2) {
    w[0] = l0 * (2 * l0 - 1);
    w[1] = l1 * (2 * l1 - 1);
    w[2] = l2 * (2 * l2 - 1);
    w[3] = 4 * l0 * l1;
    w[4] = 4 * l1 * l2;
    w[5] = 4 * l2 * l0;
  }
  Point2 p{0, 0};
  for (int k = 0; k < m.nodes_per_triangle(); ++k) {
    p[0] += w[k] * m.nodes[tri[k]][0];
    p[1] += w[k] * m.nodes[tri[k]][1];
  }
  return p;
}

/// Local coordinates of a global point under placement p (inverse rigid motion).
inline Point2 to_local(const Placement& p, const Point2& g) {
  const double t = p.rotation_deg * std::numbers::pi / 180.0;
  const double dx = g[0] - p.offset[0], dy = g[1] - p.offset[1];
  return {std::cos(t) * dx + std::sin(t) * dy, -std::sin(t) * dx + std::cos(t) * dy};
}

/// Exact point-in-shape test (strict interior up to `tol`, positive inside).
inline bool inside(const Shape& s, const Point2& g) {
  const Point2 q = to_local(s.placement, g);
  return std::visit(
      [&](const auto& sh) -> bool {
        using T = std::decay_t<decltype(sh)>;
        if constexpr (std::is_same_v<T, Disk>) {
          return std::hypot(q[0], q[1]) < sh.radius;
        } else if constexpr (std::is_same_v<T, Ellipse>) {
          return std::pow(q[0] / sh.semi_axis_x, 2) + std::pow(q[1] / sh.semi_axis_y, 2) < 1;
        } else if constexpr (std::is_same_v<T, Rectangle>) {
          const double ax = std::abs(q[0]), ay = std::abs(q[1]);
          const double ex = 0.5 * sh.width - sh.corner_radius, ey = 0.5 * sh.height - sh.corner_radius;
          if (ax >= 0.5 * sh.width || ay >= 0.5 * sh.height) return false;
          if (ax > ex && ay > ey) return std::hypot(ax - ex, ay - ey) < sh.corner_radius;
          return true;
        } else if constexpr (std::is_same_v<T, Polygon>) {
          bool in = false;  // even-odd ray casting
          const auto& v = sh.vertices;
          for (std::size_t i = 0, j = v.size() - 1; i < v.size(); j = i++) {
            if ((v[i][1] > q[1]) != (v[j][1] > q[1]) &&
                q[0] < (v[j][0] - v[i][0]) * (q[1] - v[i][1]) / (v[j][1] - v[i][1]) + v[i][0]) {
              in = !in;
            }
          }
          return in;
        } else {
          const double r = std::hypot(q[0], q[1]);
          return r > sh.inner_radius && r < sh.outer_radius;
        }
      },
      s.geometry);
}

/// Conformity: each edge has one or two triangles; exactly the one-triangle edges are tagged.
inline void expect_conforming(const Mesh& m) {
  std::vector<int> count(m.n_edges(), 0);
  for (const auto& te : m.triangle_edges) {
    for (int e : te) ++count[e];
  }
  std::vector<int> tagged(m.n_edges(), 0);
  for (int e : m.boundary_edges) ++tagged[e];
  int n_boundary = 0;
  for (int e = 0; e < m.n_edges(); ++e) {
    ASSERT_TRUE(count[e] == 1 || count[e] == 2) << "edge " << e << " has " << count[e] << " triangles";
    if (count[e] == 1) {
      ++n_boundary;
      EXPECT_EQ(tagged[e], 1) << "boundary edge " << e << " is not tagged exactly once";
    } else {
      EXPECT_EQ(tagged[e], 0) << "interior edge " << e << " is tagged as boundary";
    }
  }
  EXPECT_EQ(n_boundary, static_cast<int>(m.boundary_edges.size()));
  ASSERT_EQ(m.boundary_edges.size(), m.boundary_edge_tag.size());
  // nodes: corners first, then mid-edge nodes; every node used
  std::vector<int> used(m.n_nodes(), 0);
  for (const auto& t : m.triangles) {
    for (int k = 0; k < 3; ++k) {
      ASSERT_LT(t[k], m.n_vertices);
      used[t[k]] = 1;
    }
    for (int k = 3; k < m.nodes_per_triangle(); ++k) {
      ASSERT_GE(t[k], m.n_vertices);
      used[t[k]] = 1;
    }
  }
  for (int i = 0; i < m.n_nodes(); ++i) ASSERT_TRUE(used[i]) << "node " << i << " unused";
  // counter-clockwise corners
  for (int t = 0; t < m.n_triangles(); ++t) {
    const auto& a = m.nodes[m.triangles[t][0]];
    const auto& b = m.nodes[m.triangles[t][1]];
    const auto& c = m.nodes[m.triangles[t][2]];
    ASSERT_GT((b[0] - a[0]) * (c[1] - a[1]) - (c[0] - a[0]) * (b[1] - a[1]), 0) << "triangle " << t;
  }
}

}  // namespace cladwise::test
