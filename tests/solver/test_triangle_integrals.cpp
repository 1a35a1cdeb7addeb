#include <gtest/gtest.h>

#include <cmath>

#include "solver/triangle_potentials.hpp"
#include "solver/triangle_rules.hpp"

namespace lobe {
namespace {

const Vec3 v0(0.0, 0.0, 0.0), v1(1.0, 0.1, 0.0), v2(0.3, 0.8, 0.0);
const Real area = 0.5 * (v1 - v0).cross(v2 - v0).norm();

Vec3 at(const std::array<Real, 3>& b, const Vec3& p0, const Vec3& p1, const Vec3& p2) {
  return b[0] * p0 + b[1] * p1 + b[2] * p2;
}

/// Slow reference: the degree-5 rule on 4⁶ sub-triangles.
StaticPotentials brute_force(const Vec3& r) {
  static const TriangleRule rule = subdivided_triangle_rule(6);
  const Vec3 normal = (v1 - v0).cross(v2 - v0).normalized();
  const Vec3 rho = r - normal.dot(r - v0) * normal;
  StaticPotentials sum;
  for (std::size_t i = 0; i < rule.points.size(); ++i) {
    const Vec3 x = at(rule.points[i], v0, v1, v2);
    const Real distance = (r - x).norm();
    sum.scalar += rule.weights[i] * area / distance;
    sum.vector += rule.weights[i] * area * (x - rho) / distance;
  }
  return sum;
}

// A degree-d rule integrates x^a y^b (a + b ≤ d) exactly (Dunavant 1985): check against the
// closed form over the unit right triangle, ∫ x^a y^b = a! b! / (a + b + 2)!.
void expect_exact_to_degree(const TriangleRule& rule, int degree) {
  auto factorial = [](int n) { Real f = 1; for (int i = 2; i <= n; ++i) f *= i; return f; };
  for (int a = 0; a <= degree; ++a)
    for (int b = 0; a + b <= degree; ++b) {
      Real sum = 0;
      for (std::size_t i = 0; i < rule.points.size(); ++i)
        sum += rule.weights[i] * 0.5 * std::pow(rule.points[i][1], a) * std::pow(rule.points[i][2], b);
      EXPECT_NEAR(sum, factorial(a) * factorial(b) / factorial(a + b + 2), 1e-15) << a << " " << b;
    }
}

TEST(TriangleRules, DegreeFiveIsExact) { expect_exact_to_degree(triangle_rule_degree5(), 5); }

TEST(TriangleRules, DegreeFourIsExact) { expect_exact_to_degree(triangle_rule_degree4(), 4); }

// The closed forms of Wilton et al. (1984) against brute-force quadrature, off the plane
// where the integrand is smooth enough for the reference to converge (1e-6 relative).
TEST(TrianglePotentials, MatchBruteForceOffThePlane) {
  for (const Vec3& r : {Vec3(0.4, 0.3, 0.5), Vec3(2.0, -1.0, 0.3), Vec3(0.4, 0.3, -0.2), Vec3(1.2, 0.9, 0.25)}) {
    const StaticPotentials exact = triangle_static_potentials(r, v0, v1, v2);
    const StaticPotentials slow = brute_force(r);
    EXPECT_NEAR(exact.scalar, slow.scalar, 1e-6 * std::abs(slow.scalar)) << r.transpose();
    EXPECT_LE((exact.vector - slow.vector).norm(), 1e-6 * std::abs(slow.scalar)) << r.transpose();
  }
}

// On the triangle itself (the self term) no quadrature converges well, but the integrals
// are additive: the whole triangle equals the sum of its four midpoint sub-triangles,
// whichever of them holds the observer, for points inside, on an edge and at a vertex.
TEST(TrianglePotentials, AdditiveOverSubtrianglesForPointsOnTheTriangle) {
  const Vec3 m01 = 0.5 * (v0 + v1), m12 = 0.5 * (v1 + v2), m20 = 0.5 * (v2 + v0);
  for (const Vec3& r : {Vec3((v0 + v1 + v2) / 3), Vec3(0.2 * v0 + 0.7 * v1 + 0.1 * v2), m01, v2, Vec3(0.5 * v0 + 0.5 * m12)}) {
    const StaticPotentials whole = triangle_static_potentials(r, v0, v1, v2);
    StaticPotentials parts;
    for (const auto& [a, b, c] : {std::array<Vec3, 3>{v0, m01, m20}, std::array<Vec3, 3>{m01, v1, m12},
                                  std::array<Vec3, 3>{m20, m12, v2}, std::array<Vec3, 3>{m01, m12, m20}}) {
      const StaticPotentials p = triangle_static_potentials(r, a, b, c);
      parts.scalar += p.scalar;
      parts.vector += p.vector;
    }
    EXPECT_TRUE(std::isfinite(whole.scalar)) << r.transpose();
    EXPECT_NEAR(whole.scalar, parts.scalar, 1e-12 * whole.scalar) << r.transpose();
    EXPECT_LE((whole.vector - parts.vector).norm(), 1e-12 * whole.scalar) << r.transpose();
  }
}

}  // namespace
}  // namespace lobe
