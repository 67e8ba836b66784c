// Global assembly against a dense oracle and the curl–curl null space.
//
// The oracle integrates global basis functions written directly in terms of the global vertices
// (barycentrics of the physical triangle, Whitney λ_lo∇λ_hi − λ_hi∇λ_lo for the globally oriented
// edge lo -> hi, ∇(λ_lo λ_hi), the interior functions, Lagrange functions), with no local edge
// signs and no scatter: an independent path to the same matrices.
#include <gtest/gtest.h>

#include <Eigen/Dense>

#include <cmath>

#include "solver/assembly.hpp"
#include "solver/dof_map.hpp"
#include "solver/element_kernels.hpp"
#include "solver/material.hpp"
#include "fem_test_meshes.hpp"

namespace cladwise {
namespace {

double cross2(const Eigen::Vector2d& a, const Eigen::Vector2d& b) { return a.x() * b.y() - a.y() * b.x(); }

struct Dense {
  Eigen::MatrixXd a, b;
};

// Dense A, B in the raw numbering of dof_map.hpp for a straight-sided mesh with no walls.
Dense dense_oracle(const Mesh& mesh, int order, const Material& mat, double k0) {
  const int ne = mesh.n_edges(), nv = mesh.n_vertices, nt = mesh.n_triangles();
  const int n_t = order == 1 ? ne : 2 * ne + 2 * nt;
  const int n_z = order == 1 ? nv : nv + ne;
  Dense d{Eigen::MatrixXd::Zero(n_t + n_z, n_t + n_z), Eigen::MatrixXd::Zero(n_t + n_z, n_t + n_z)};
  const QuadratureRule& rule = triangle_rule(8);
  for (int t = 0; t < nt; ++t) {
    const auto& tri = mesh.triangles[t];
    Eigen::Vector2d p[3];
    for (int i = 0; i < 3; ++i) p[i] = {mesh.nodes[tri[i]][0], mesh.nodes[tri[i]][1]};
    const double area2 = cross2(p[1] - p[0], p[2] - p[0]);
    // barycentric gradient of local vertex i: rot(p_{i+2} − p_{i+1}) / (2 area)
    Eigen::Vector2d g[3];
    for (int i = 0; i < 3; ++i) {
      const Eigen::Vector2d e = p[(i + 2) % 3] - p[(i + 1) % 3];
      g[i] = Eigen::Vector2d(-e.y(), e.x()) / area2;
    }
    auto local_of = [&](int v) { for (int i = 0; i < 3; ++i) if (tri[i] == v) return i; return -1; };
    for (int q = 0; q < rule.n_points(); ++q) {
      const double w = rule.weights[q] * area2;  // dΩ
      const double l[3] = {1 - rule.points[q].x() - rule.points[q].y(), rule.points[q].x(),
                           rule.points[q].y()};
      std::vector<std::pair<int, Eigen::Vector2d>> vec;  // (raw t index, value)
      std::vector<std::pair<int, double>> crl;
      std::vector<std::pair<int, double>> val;            // (raw z index, value)
      std::vector<std::pair<int, Eigen::Vector2d>> grd;
      for (int k = 0; k < 3; ++k) {
        const int e = mesh.triangle_edges[t][k];
        const int lo = local_of(mesh.edges[e][0]), hi = local_of(mesh.edges[e][1]);
        const Eigen::Vector2d whit = l[lo] * g[hi] - l[hi] * g[lo];
        const int raw = order == 1 ? e : 2 * e;
        vec.push_back({raw, whit});
        crl.push_back({raw, 2 * cross2(g[lo], g[hi])});
        if (order == 2) {
          vec.push_back({2 * e + 1, l[lo] * g[hi] + l[hi] * g[lo]});
          crl.push_back({2 * e + 1, 0.0});
          grd.push_back({nv + e, 4 * (l[lo] * g[hi] + l[hi] * g[lo])});
          val.push_back({nv + e, 4 * l[lo] * l[hi]});
        }
      }
      if (order == 2) {
        const Eigen::Vector2d w01 = l[0] * g[1] - l[1] * g[0], w12 = l[1] * g[2] - l[2] * g[1];
        vec.push_back({2 * ne + 2 * t, l[2] * w01});
        crl.push_back({2 * ne + 2 * t, cross2(g[2], w01) + l[2] * 2 * cross2(g[0], g[1])});
        vec.push_back({2 * ne + 2 * t + 1, l[0] * w12});
        crl.push_back({2 * ne + 2 * t + 1, cross2(g[0], w12) + l[0] * 2 * cross2(g[1], g[2])});
      }
      for (int i = 0; i < 3; ++i) {
        val.push_back({tri[i], order == 1 ? l[i] : l[i] * (2 * l[i] - 1)});
        grd.push_back({tri[i], order == 1 ? g[i] : Eigen::Vector2d((4 * l[i] - 1) * g[i])});
      }
      const Eigen::Matrix2d eps_t = Eigen::Vector2d(mat.eps_xx, mat.eps_yy).asDiagonal();
      for (std::size_t i = 0; i < vec.size(); ++i) {
        for (std::size_t j = 0; j < vec.size(); ++j) {
          d.a(vec[i].first, vec[j].first) +=
              w * (crl[i].second * crl[j].second - k0 * k0 * vec[i].second.dot(eps_t * vec[j].second));
          d.b(vec[i].first, vec[j].first) += w * vec[i].second.dot(vec[j].second);
        }
        for (std::size_t j = 0; j < grd.size(); ++j) {
          d.b(vec[i].first, n_t + grd[j].first) += w * vec[i].second.dot(grd[j].second);
          d.b(n_t + grd[j].first, vec[i].first) += w * vec[i].second.dot(grd[j].second);
        }
      }
      for (std::size_t i = 0; i < grd.size(); ++i) {
        for (std::size_t j = 0; j < grd.size(); ++j) {
          d.b(n_t + grd[i].first, n_t + grd[j].first) +=
              w * (grd[i].second.dot(grd[j].second) - k0 * k0 * mat.eps_zz * val[i].second * val[j].second);
        }
      }
    }
  }
  return d;
}

Mesh two_triangles() {
  Mesh m;
  // numbering chosen so that the shared edge (1, 2) runs against the local direction of one
  // triangle and the diagonal-free edges mix both orientations
  m.nodes = {{0.0, 0.0}, {1.2, 0.1}, {0.2, 0.9}, {1.1, 1.3}};
  m.n_vertices = 4;
  m.triangles = {{0, 1, 2, -1, -1, -1}, {3, 2, 1, -1, -1, -1}};
  m.regions = {{"core", "core"}};
  m.triangle_region = {0, 0};
  m.boundaries = {{"outer", BoundaryKind::outer}};
  build_topology(m, {{0, 1}, {1, 3}, {3, 2}, {2, 0}}, {0, 0, 0, 0});
  return m;
}

TEST(FemAssembly, MatchesDenseOracleOnTwoTriangles) {
  const Material mat = diagonal_material(2.1, 3.4, 5.2);
  const double k0 = 1.7;
  for (int order : {1, 2}) {
    const Mesh mesh = two_triangles();
    const DofMap dofs(mesh, order, {WallType::magnetic});
    const auto sys = assemble_waveguide<double>(dofs, {material_tensors(mat)}, k0);
    const Dense d = dense_oracle(mesh, order, mat, k0);
    ASSERT_EQ(sys.a.rows(), d.a.rows());
    const Eigen::MatrixXd a(sys.a), b(sys.b);
    EXPECT_LT((a - d.a).cwiseAbs().maxCoeff(), 1e-12 * d.a.cwiseAbs().maxCoeff()) << "order " << order;
    EXPECT_LT((b - d.b).cwiseAbs().maxCoeff(), 1e-12 * d.b.cwiseAbs().maxCoeff()) << "order " << order;
    EXPECT_LT((b - b.transpose()).norm(), 1e-14 * b.norm());

    // Electric wall on the outer boundary: assembled matrices are the oracle's rows/columns of
    // the unknowns that survive: the shared edge's functions, the interior ones and, for order 2,
    // the mid-edge nodal function of the shared edge (every vertex lies on the wall).
    const DofMap pec(mesh, order, {WallType::electric});
    const auto sp = assemble_waveguide<double>(pec, {material_tensors(mat)}, k0);
    const int shared = mesh.triangle_edges[0][1];
    std::vector<int> keep;
    if (order == 1) keep = {shared};
    else keep = {2 * shared, 2 * shared + 1, 2 * mesh.n_edges(), 2 * mesh.n_edges() + 1,
                 2 * mesh.n_edges() + 2, 2 * mesh.n_edges() + 3,
                 2 * mesh.n_edges() + 4 + mesh.n_vertices + shared};
    ASSERT_EQ(pec.n_dofs(), static_cast<int>(keep.size()));
    const Eigen::MatrixXd ap(sp.a), bp(sp.b);
    for (std::size_t i = 0; i < keep.size(); ++i) {
      for (std::size_t j = 0; j < keep.size(); ++j) {
        EXPECT_NEAR(ap(i, j), d.a(keep[i], keep[j]), 1e-12 * d.a.cwiseAbs().maxCoeff());
        EXPECT_NEAR(bp(i, j), d.b(keep[i], keep[j]), 1e-12 * d.b.cwiseAbs().maxCoeff());
      }
    }
  }
}

// Discrete de Rham sequence: with k0 = 0 the curl–curl matrix A_tt vanishes exactly on gradients
// of the nodal space, and on a simply connected domain with electric walls its null space is
// exactly ∇(interior nodal functions) (P. Monk, "Finite Element Methods for Maxwell's Equations",
// OUP 2003, §5.3 / Thm 3.x exact sequence). For order 1 that is one dimension per interior vertex.
TEST(FemAssembly, CurlCurlNullSpaceIsOneDimensionPerInteriorVertex) {
  const int nx = 5, ny = 4;
  const Mesh mesh = testing::rectangle_mesh(0.0, 1.5, 0.0, 1.0, nx, ny, 1);
  const DofMap dofs(mesh, 1, std::vector<WallType>(4, WallType::electric));
  const auto sys = assemble_waveguide<double>(dofs, {material_tensors(isotropic_material(1.0))}, 0.0);
  const Eigen::MatrixXd att = Eigen::MatrixXd(sys.a).topLeftCorner(dofs.n_edge_dofs(), dofs.n_edge_dofs());
  const Eigen::SelfAdjointEigenSolver<Eigen::MatrixXd> es(att);
  const double top = es.eigenvalues().cwiseAbs().maxCoeff();
  int null_dim = 0;
  for (int i = 0; i < es.eigenvalues().size(); ++i) null_dim += std::abs(es.eigenvalues()[i]) < 1e-10 * top;
  EXPECT_EQ(null_dim, (nx - 1) * (ny - 1));
  EXPECT_EQ(dofs.n_nodal_dofs(), (nx - 1) * (ny - 1));
  // and the smallest non-zero eigenvalue is well separated (no near-null spurious vectors)
  double smallest_nonzero = top;
  for (int i = 0; i < es.eigenvalues().size(); ++i) {
    const double v = std::abs(es.eigenvalues()[i]);
    if (v >= 1e-10 * top) smallest_nonzero = std::min(smallest_nonzero, v);
  }
  EXPECT_GT(smallest_nonzero, 1e-3 * top);
}

// Order 2: the null space is ∇ of the interior quadratic nodal space: interior vertices plus
// interior edges (same sequence argument).
TEST(FemAssembly, Order2CurlCurlNullSpaceMatchesInteriorNodalSpace) {
  const int nx = 3, ny = 3;
  const Mesh mesh = testing::rectangle_mesh(0.0, 1.0, 0.0, 1.0, nx, ny, 2);
  const DofMap dofs(mesh, 2, std::vector<WallType>(4, WallType::electric));
  const auto sys = assemble_waveguide<double>(dofs, {material_tensors(isotropic_material(1.0))}, 0.0);
  const Eigen::MatrixXd att = Eigen::MatrixXd(sys.a).topLeftCorner(dofs.n_edge_dofs(), dofs.n_edge_dofs());
  const Eigen::SelfAdjointEigenSolver<Eigen::MatrixXd> es(att);
  const double top = es.eigenvalues().cwiseAbs().maxCoeff();
  int null_dim = 0;
  for (int i = 0; i < es.eigenvalues().size(); ++i) null_dim += std::abs(es.eigenvalues()[i]) < 1e-10 * top;
  const int interior_vertices = (nx - 1) * (ny - 1);
  const int interior_edges = mesh.n_edges() - 2 * (nx + ny);
  EXPECT_EQ(null_dim, interior_vertices + interior_edges);
  EXPECT_EQ(dofs.n_nodal_dofs(), interior_vertices + interior_edges);
}

}  // namespace
}  // namespace cladwise
