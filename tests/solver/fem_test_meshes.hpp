// Small structured meshes built directly in the plain Mesh contract (mesh/mesh.hpp) for the FEM
// tests, so the solver is tested independently of the Gmsh mesher.
#pragma once

#include <array>
#include <cmath>
#include <cstdint>
#include <functional>
#include <map>
#include <numbers>
#include <string>
#include <utility>
#include <vector>

#include "mesh/mesh.hpp"

namespace cladwise::testing {

/// Adds order-2 mid-edge nodes: `place(a, b)` gives the coordinates of the node on edge (a, b).
inline void add_mid_nodes(Mesh& m, const std::function<Point2(int, int)>& place) {
  std::map<std::pair<int, int>, int> mid;
  for (auto& tri : m.triangles) {
    for (int k = 0; k < 3; ++k) {
      const int a = tri[k], b = tri[(k + 1) % 3];
      const auto key = std::minmax(a, b);
      auto it = mid.find(key);
      if (it == mid.end()) {
        it = mid.emplace(key, m.n_nodes()).first;
        m.nodes.push_back(place(key.first, key.second));
      }
      tri[3 + k] = it->second;
    }
  }
  m.order = 2;
}

/// Rectangle [x0, x1] × [y0, y1] cut into nx × ny cells, each split into two right triangles by
/// its (lower-left, upper-right) diagonal. Boundaries: 0 left (x = x0), 1 right, 2 bottom (y = y0),
/// 3 top. `region_of(xc, yc)` picks the region of a triangle from its centroid.
inline Mesh rectangle_mesh(double x0, double x1, double y0, double y1, int nx, int ny, int order,
                           std::vector<Region> regions = {{"fill", "fill"}},
                           const std::function<int(double, double)>& region_of = {},
                           const std::vector<double>& x_lines = {}) {
  Mesh m;
  std::vector<double> xs(nx + 1), ys(ny + 1);
  for (int i = 0; i <= nx; ++i) xs[i] = x_lines.empty() ? x0 + (x1 - x0) * i / nx : x_lines[i];
  for (int j = 0; j <= ny; ++j) ys[j] = y0 + (y1 - y0) * j / ny;
  auto vid = [&](int i, int j) { return j * (nx + 1) + i; };
  for (int j = 0; j <= ny; ++j)
    for (int i = 0; i <= nx; ++i) m.nodes.push_back({xs[i], ys[j]});
  m.n_vertices = m.n_nodes();
  for (int j = 0; j < ny; ++j) {
    for (int i = 0; i < nx; ++i) {
      const int a = vid(i, j), b = vid(i + 1, j), c = vid(i + 1, j + 1), d = vid(i, j + 1);
      m.triangles.push_back({a, b, c, -1, -1, -1});
      m.triangles.push_back({a, c, d, -1, -1, -1});
    }
  }
  m.regions = std::move(regions);
  for (const auto& tri : m.triangles) {
    double xc = 0, yc = 0;
    for (int k = 0; k < 3; ++k) { xc += m.nodes[tri[k]][0] / 3; yc += m.nodes[tri[k]][1] / 3; }
    m.triangle_region.push_back(region_of ? region_of(xc, yc) : 0);
  }
  if (order == 2) {
    add_mid_nodes(m, [&](int a, int b) {
      return Point2{0.5 * (m.nodes[a][0] + m.nodes[b][0]), 0.5 * (m.nodes[a][1] + m.nodes[b][1])};
    });
  }
  m.boundaries = {{"left", BoundaryKind::outer}, {"right", BoundaryKind::outer},
                  {"bottom", BoundaryKind::outer}, {"top", BoundaryKind::outer}};
  std::vector<std::array<int, 2>> seg;
  std::vector<int> tag;
  for (int j = 0; j < ny; ++j) {
    seg.push_back({vid(0, j), vid(0, j + 1)}); tag.push_back(0);
    seg.push_back({vid(nx, j), vid(nx, j + 1)}); tag.push_back(1);
  }
  for (int i = 0; i < nx; ++i) {
    seg.push_back({vid(i, 0), vid(i + 1, 0)}); tag.push_back(2);
    seg.push_back({vid(i, ny), vid(i + 1, ny)}); tag.push_back(3);
  }
  build_topology(m, seg, tag);
  return m;
}

/// Disk of radius r: a structured polar mesh with n_rings rings; ring k (1-based) has 6k vertices
/// on the circle of radius r·k/n_rings (the classic hexagon-based disk triangulation). For
/// order 2 the mid-edge node of an edge joining two vertices of the same ring is placed on that
/// ring's circle (so the outer boundary is exact); other mid nodes are placed at the mapped
/// mid-point in polar coordinates. Boundary 0 = "outer".
inline Mesh disk_mesh(double r, int n_rings, int order) {
  Mesh m;
  m.nodes.push_back({0.0, 0.0});
  std::vector<int> ring_start = {0};
  std::vector<double> ring_radius = {0.0};
  std::vector<int> ring_of = {0};
  for (int k = 1; k <= n_rings; ++k) {
    ring_start.push_back(m.n_nodes());
    const double rk = r * k / n_rings;
    ring_radius.push_back(rk);
    for (int i = 0; i < 6 * k; ++i) {
      const double phi = 2 * std::numbers::pi * i / (6 * k);
      m.nodes.push_back({rk * std::cos(phi), rk * std::sin(phi)});
      ring_of.push_back(k);
    }
  }
  m.n_vertices = m.n_nodes();
  auto node = [&](int k, int i) { return k == 0 ? 0 : ring_start[k] + ((i % (6 * k)) + 6 * k) % (6 * k); };
  for (int k = 1; k <= n_rings; ++k) {
    // Sector s (6 of them): ring k has k segments per sector, ring k−1 has k−1.
    for (int s = 0; s < 6; ++s) {
      for (int j = 0; j < k; ++j) {
        const int o0 = node(k, s * k + j), o1 = node(k, s * k + j + 1);
        const int i0 = node(k - 1, s * (k - 1) + j);
        m.triangles.push_back({i0, o0, o1, -1, -1, -1});
        if (j < k - 1) {
          const int i1 = node(k - 1, s * (k - 1) + j + 1);
          m.triangles.push_back({i0, o1, i1, -1, -1, -1});
        }
      }
    }
  }
  m.regions = {{"fill", "fill"}};
  m.triangle_region.assign(m.triangles.size(), 0);
  if (order == 2) {
    add_mid_nodes(m, [&](int a, int b) {
      const auto& pa = m.nodes[a];
      const auto& pb = m.nodes[b];
      Point2 mid{0.5 * (pa[0] + pb[0]), 0.5 * (pa[1] + pb[1])};
      if (ring_of[a] == ring_of[b] && ring_of[a] > 0) {  // on a circle: project radially
        const double rr = ring_radius[ring_of[a]] / std::hypot(mid[0], mid[1]);
        mid = {mid[0] * rr, mid[1] * rr};
      }
      return mid;
    });
  }
  m.boundaries = {{"outer", BoundaryKind::outer}};
  std::vector<std::array<int, 2>> seg;
  std::vector<int> tag;
  for (int i = 0; i < 6 * n_rings; ++i) {
    seg.push_back({node(n_rings, i), node(n_rings, i + 1)});
    tag.push_back(0);
  }
  build_topology(m, seg, tag);
  return m;
}

}  // namespace cladwise::testing
