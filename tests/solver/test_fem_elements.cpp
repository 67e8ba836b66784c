// Element-level checks of the quadrature, the Nédélec and Lagrange bases and the covariant map:
// exact properties that hold for any correct implementation (no tuned numbers).
#include <gtest/gtest.h>

#include <Eigen/Dense>

#include <cmath>
#include <random>

#include "solver/assembly.hpp"
#include "solver/dof_map.hpp"
#include "solver/element_kernels.hpp"
#include "solver/quadrature.hpp"
#include "fem_test_meshes.hpp"

namespace cladwise {
namespace {

double factorial(int n) { return n <= 1 ? 1.0 : n * factorial(n - 1); }

// ∫_T̂ ξ^a η^b = a! b! / (a + b + 2)!  (Dirichlet integral; exact).
TEST(FemQuadrature, ExactForMonomialsUpToItsDegree) {
  for (int d = 1; d <= 8; ++d) {
    const QuadratureRule& rule = triangle_rule(d);
    for (int a = 0; a <= d; ++a) {
      for (int b = 0; a + b <= d; ++b) {
        double s = 0.0;
        for (int q = 0; q < rule.n_points(); ++q) {
          s += rule.weights[q] * std::pow(rule.points[q].x(), a) * std::pow(rule.points[q].y(), b);
        }
        EXPECT_NEAR(s, factorial(a) * factorial(b) / factorial(a + b + 2), 1e-15)
            << "degree " << d << " monomial " << a << "," << b;
      }
    }
  }
}

ElementGeometry straight_triangle() {
  ElementGeometry g;
  g.n_nodes = 3;
  g.x << 0.3, 1.7, 0.6, 0, 0, 0,  //
      -0.2, 0.4, 1.5, 0, 0, 0;
  return g;
}

// A 6-node triangle with its edge 1 (v1–v2) bowed outwards and edge 0 bowed slightly.
ElementGeometry curved_triangle() {
  ElementGeometry g = straight_triangle();
  g.n_nodes = 6;
  for (int k = 0; k < 3; ++k) g.x.col(3 + k) = 0.5 * (g.x.col(k) + g.x.col((k + 1) % 3));
  g.x.col(4) += Eigen::Vector2d(0.18, 0.12);
  g.x.col(3) += Eigen::Vector2d(0.02, -0.05);
  return g;
}

// Whitney interpolation (edge moments ∫ E·t ds with t = x_b − x_a) reproduces a constant field
// and its zero curl exactly (Whitney forms: A. Bossavit, IEE Proc. A 135, 493 (1988)).
TEST(FemNedelec, WhitneyInterpolationReproducesConstantField) {
  const ElementGeometry g = straight_triangle();
  const Eigen::Vector2d field(0.7, -1.3);
  Eigen::Vector3d dof;
  for (int k = 0; k < 3; ++k) dof[k] = field.dot(g.x.col((k + 1) % 3) - g.x.col(k));
  for (const Eigen::Vector2d& xi : {Eigen::Vector2d(0.2, 0.3), Eigen::Vector2d(0.0, 0.9),
                                   Eigen::Vector2d(0.6, 0.1)}) {
    const MappedPoint m = map_point(g, xi);
    NedelecTriangle<1>::Values n;
    NedelecTriangle<1>::Curls c;
    edge_basis<1>(m, xi, n, c);
    EXPECT_NEAR((n * dof - field).norm(), 0.0, 1e-14);
    EXPECT_NEAR(c.dot(dof.transpose()), 0.0, 1e-13);
  }
  // A rotating field E = (−y, x) is not in the Whitney space, but its curl (2) is reproduced.
  Eigen::Vector3d rot;
  for (int k = 0; k < 3; ++k) {
    const Eigen::Vector2d a = g.x.col(k), b = g.x.col((k + 1) % 3), mid = 0.5 * (a + b);
    rot[k] = Eigen::Vector2d(-mid.y(), mid.x()).dot(b - a);  // exact: integrand linear in s
  }
  const Eigen::Vector2d xi(0.25, 0.25);
  NedelecTriangle<1>::Values n;
  NedelecTriangle<1>::Curls c;
  edge_basis<1>(map_point(g, xi), xi, n, c);
  EXPECT_NEAR(c.dot(rot.transpose()), 2.0, 1e-13);
}

// L2 projection onto the element space reproduces every field the space contains, with its
// curl. Order 2 contains all linear fields on a straight triangle; on a curved isoparametric one
// it contains constants (∇x, ∇y are gradients of mapped P2 functions).
template <int Order>
void expect_projection_exact(const ElementGeometry& g, const std::function<Eigen::Vector2d(Eigen::Vector2d)>& f,
                             double curl_f) {
  constexpr int n = NedelecTriangle<Order>::n_functions;
  const QuadratureRule& rule = triangle_rule(10);
  Eigen::Matrix<double, n, n> mass = Eigen::Matrix<double, n, n>::Zero();
  Eigen::Matrix<double, n, 1> rhs = Eigen::Matrix<double, n, 1>::Zero();
  for (int q = 0; q < rule.n_points(); ++q) {
    const MappedPoint m = map_point(g, rule.points[q]);
    typename NedelecTriangle<Order>::Values v;
    typename NedelecTriangle<Order>::Curls c;
    edge_basis<Order>(m, rule.points[q], v, c);
    mass += rule.weights[q] * m.det * v.transpose() * v;
    rhs += rule.weights[q] * m.det * v.transpose() * f(m.x);
  }
  const Eigen::Matrix<double, n, 1> coef = mass.ldlt().solve(rhs);
  for (const Eigen::Vector2d& xi : {Eigen::Vector2d(0.1, 0.2), Eigen::Vector2d(0.7, 0.3),
                                   Eigen::Vector2d(0.0, 0.0), Eigen::Vector2d(0.3, 0.3)}) {
    const MappedPoint m = map_point(g, xi);
    typename NedelecTriangle<Order>::Values v;
    typename NedelecTriangle<Order>::Curls c;
    edge_basis<Order>(m, xi, v, c);
    EXPECT_NEAR((v * coef - f(m.x)).norm(), 0.0, 1e-11);
    EXPECT_NEAR(c.dot(coef.transpose()), curl_f, 1e-10);
  }
}

TEST(FemNedelec, Order2ReproducesLinearFieldsAndCurlOnStraightTriangle) {
  const auto g = straight_triangle();
  // E = (0.5 + 2x − y, −1 + 3x + 0.25y): ∂x E_y − ∂y E_x = 3 + 1 = 4
  expect_projection_exact<2>(g, [](Eigen::Vector2d x) {
    return Eigen::Vector2d(0.5 + 2 * x.x() - x.y(), -1 + 3 * x.x() + 0.25 * x.y());
  }, 4.0);
  expect_projection_exact<1>(g, [](Eigen::Vector2d) { return Eigen::Vector2d(0.3, 0.8); }, 0.0);
  // Whitney space also holds the rotation (−y, x) (curl 2): it is a + b × x.
  expect_projection_exact<1>(g, [](Eigen::Vector2d x) { return Eigen::Vector2d(1 - x.y(), x.x()); }, 2.0);
}

TEST(FemNedelec, ConstantsReproducedOnCurvedTriangle) {
  const auto g = curved_triangle();
  expect_projection_exact<2>(g, [](Eigen::Vector2d) { return Eigen::Vector2d(-0.4, 1.1); }, 0.0);
}

TEST(FemLagrange, ReproducesPolynomialsOfItsOrder) {
  const auto g = straight_triangle();
  auto p2 = [](Eigen::Vector2d x) { return 1 + x.x() - 2 * x.y() + 0.5 * x.x() * x.y() + x.y() * x.y(); };
  Eigen::Matrix<double, 6, 1> nodal;
  Eigen::Matrix<double, 2, 6> xn;
  xn.leftCols<3>() = g.x.leftCols<3>();
  for (int k = 0; k < 3; ++k) xn.col(3 + k) = 0.5 * (g.x.col(k) + g.x.col((k + 1) % 3));
  for (int i = 0; i < 6; ++i) nodal[i] = p2(xn.col(i));
  const Eigen::Vector2d xi(0.21, 0.37);
  const MappedPoint m = map_point(g, xi);
  LagrangeTriangle<2>::Values l;
  LagrangeTriangle<2>::Gradients gl;
  nodal_basis<2>(m, xi, l, gl);
  EXPECT_NEAR(l.dot(nodal), p2(m.x), 1e-14);
  const Eigen::Vector2d grad(1 + 0.5 * m.x.y(), -2 + 0.5 * m.x.x() + 2 * m.x.y());
  EXPECT_NEAR((gl * nodal - grad).norm(), 0.0, 1e-13);
}

// Two triangles sharing an edge; the global function of every shared-edge DOF must have the same
// tangential component on both sides. Checked for both local orientations of the shared edge
// (the two numberings of the same geometry) and for straight and curved (order-2 mesh) elements.
template <int Order>
void expect_tangential_continuity(bool flip_numbering, bool curved) {
  Mesh m;
  // vertices: shared edge between P and Q; flip swaps their global numbers
  const Point2 p{0.0, 0.0}, q{1.0, 0.2}, left{0.1, 1.0}, right{0.8, -0.9};
  m.nodes = flip_numbering ? std::vector<Point2>{q, p, left, right}
                           : std::vector<Point2>{p, q, left, right};
  const int ip = flip_numbering ? 1 : 0, iq = flip_numbering ? 0 : 1;
  m.n_vertices = 4;
  m.triangles = {{ip, iq, 2, -1, -1, -1}, {iq, ip, 3, -1, -1, -1}};
  m.regions = {{"fill", "fill"}};
  m.triangle_region = {0, 0};
  if (curved) {
    testing::add_mid_nodes(m, [&](int a, int b) {
      Point2 mid{0.5 * (m.nodes[a][0] + m.nodes[b][0]), 0.5 * (m.nodes[a][1] + m.nodes[b][1])};
      if (std::minmax(a, b) == std::minmax(ip, iq)) { mid[0] -= 0.06; mid[1] += 0.25; }
      return mid;
    });
  }
  build_topology(m);
  const DofMap dofs(m, Order, {});
  const int nl = dofs.n_local();
  for (int dof = 0; dof < dofs.n_edge_dofs(); ++dof) {
    // Evaluate the global function `dof` at points of the shared edge from both triangles.
    for (double s : {0.15, 0.5, 0.8}) {
      Eigen::Vector2d value[2], tangent[2];
      for (int t = 0; t < 2; ++t) {
        int index[14];
        double sign[14];
        dofs.element_dofs(t, index, sign);
        // local edge 0 is (v0, v1) in both triangles; parametrise from P to Q
        const double sl = t == 0 ? s : 1.0 - s;
        const Eigen::Vector2d xi(sl, 0.0);
        const ElementGeometry g = element_geometry(m, t);
        const MappedPoint mp = map_point(g, xi);
        typename NedelecTriangle<Order>::Values v;
        typename NedelecTriangle<Order>::Curls c;
        edge_basis<Order>(mp, xi, v, c);
        value[t].setZero();
        for (int i = 0; i < NedelecTriangle<Order>::n_functions; ++i) {
          if (index[i] == dof) value[t] += sign[i] * v.col(i);
        }
        tangent[t] = mp.jacobian.col(0).normalized() * (t == 0 ? 1.0 : -1.0);  // P -> Q
      }
      ASSERT_LT((tangent[0] - tangent[1]).norm(), 1e-12);
      EXPECT_NEAR(value[0].dot(tangent[0]), value[1].dot(tangent[1]), 1e-12)
          << "dof " << dof << " s " << s << " flip " << flip_numbering << " curved " << curved;
    }
  }
  (void)nl;
}

TEST(FemNedelec, TangentialContinuityAcrossSharedEdge) {
  for (bool flip : {false, true}) {
    for (bool curved : {false, true}) {
      expect_tangential_continuity<1>(flip, curved);
      expect_tangential_continuity<2>(flip, curved);
    }
  }
}

}  // namespace
}  // namespace cladwise
