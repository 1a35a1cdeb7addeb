#include <gtest/gtest.h>

#include <cmath>

#include "core/constants.hpp"
#include "solver/green_function.hpp"
#include "solver/triangle_pair_integrals.hpp"
#include "solver/triangle_potentials.hpp"
#include "solver/triangle_rules.hpp"
#include "support/fine_pair_quadrature.hpp"

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

// Distant pairs take the 6 × 6 degree-4 rule to save kernels; that must cost no accuracy
// against what the 7 × 7 rule gives a far pair at the near distance (two sizes), checked
// against a fine quadrature over tilted and offset pairs, with triangles up to a tenth of a
// wavelength (kh = 0.63).
TEST(TrianglePairRules, DistantPairsAreIntegratedAsWellAsTheNearestFarPairs) {
  const Vec3 a(0, 0, 0), b(1, 0, 0), c(0.5, 0.866, 0);
  const Vec3 centre = (a + b + c) / 3;
  for (const Real kh : {0.2, 0.63}) {
    Real worst_far = 0.0, worst_distant = 0.0;
    for (const Real sizes : {2.0, 3.0, 5.0, 10.0})
      for (int o = 0; o < 6; ++o) {
        const Eigen::Matrix3d turn = (Eigen::AngleAxisd(0.7 * (o % 3), Vec3::UnitY()) *
                                      Eigen::AngleAxisd(1.1 * o, Vec3::UnitZ())).toRotationMatrix();
        // A little beyond the distance, so that the centroids' spacing is not on the boundary.
        const Real d = 1.0001 * sizes * (b - a).norm();
        const Vec3 offset = d * Vec3(std::cos(0.5 * o), std::sin(0.5 * o), 0.3 * (o % 2)).normalized();
        SurfaceMesh mesh;
        mesh.vertices = {a, b, c};
        for (const Vec3& v : {a, b, c}) mesh.vertices.push_back(turn * (v - centre) + centre + offset);
        mesh.triangles = {{0, 1, 2}, {3, 4, 5}};
        const std::vector<TriangleQuadrature> t = triangle_quadrature(mesh);
        const Real k = kh / t[0].size;
        const TrianglePairIntegrals reference = fine_pair_integrals(t[0], t[1], k);
        if (sizes < distant_distance_in_sizes) {
          ASSERT_FALSE(triangle_pair_is_near(t[0], t[1]));
          worst_far = std::max(worst_far, relative_error(triangle_pair_integrals_by_points(t[0], t[1], k), reference));
        } else {
          ASSERT_TRUE(triangle_pair_is_distant(t[0], t[1]));
          worst_distant = std::max(worst_distant, relative_error(triangle_pair_integrals(t[0], t[1], k), reference));
        }
      }
    std::printf("kh %.2f: 7 x 7 at two sizes %.1e, distant pairs %.1e\n", kh, worst_far, worst_distant);
    EXPECT_LT(worst_distant, worst_far) << "kh " << kh;
  }
}

// The batched forms put one source triangle in each vector lane. Each lane must be its own
// pair: the same numbers as the pair taken alone, for full and partial batches of sources of
// different sizes, turns and distances, and near the fine quadrature (the far rule's error
// at two to three sizes is 2e-5 by the test above; the distant rule's 6e-6 at three sizes).
TEST(TrianglePairBatches, EachLaneHoldsItsOwnPair) {
  const Vec3 a(0, 0, 0), b(1, 0, 0), c(0.5, 0.866, 0);
  const Vec3 centre = (a + b + c) / 3;
  SurfaceMesh mesh;
  mesh.vertices = {a, b, c};
  mesh.triangles = {{0, 1, 2}};
  for (int o = 0; o < 2 * pair_batch_limit; ++o) {
    const Eigen::Matrix3d turn = (Eigen::AngleAxisd(0.7 * (o % 3), Vec3::UnitY()) *
                                  Eigen::AngleAxisd(1.1 * o, Vec3::UnitZ())).toRotationMatrix();
    const bool distant = o >= pair_batch_limit;
    const Real scale = 0.8 + 0.05 * (o % 5);
    const Real sizes = distant ? 3.5 + 0.6 * (o % pair_batch_limit) : 2.2 + 0.1 * o;
    const Vec3 offset = sizes * Vec3(std::cos(0.5 * o), std::sin(0.5 * o), 0.3 * (o % 2)).normalized();
    const int first = static_cast<int>(mesh.vertices.size());
    for (const Vec3& v : {a, b, c}) mesh.vertices.push_back(scale * (turn * (v - centre)) + centre + offset);
    mesh.triangles.push_back({first, first + 1, first + 2});
  }
  const std::vector<TriangleQuadrature> t = triangle_quadrature(mesh);
  const Real k = 0.63 / t[0].size;
  for (const bool distant : {false, true}) {
    std::vector<const TriangleQuadrature*> sources;
    for (int l = 0; l < pair_batch_limit; ++l) {
      const TriangleQuadrature& q = t[1 + l + (distant ? pair_batch_limit : 0)];
      ASSERT_EQ(triangle_pair_is_distant(t[0], q), distant);
      ASSERT_FALSE(triangle_pair_is_near(t[0], q));
      sources.push_back(&q);
    }
    for (const int count : {pair_batch_limit, 3}) {
      std::vector<TrianglePairIntegrals> batch(pair_batch_limit);
      if (distant) {
        triangle_pair_integrals_distant(t[0], sources.data(), count, k, batch.data());
      } else {
        triangle_pair_integrals_by_points(t[0], sources.data(), count, k, batch.data());
      }
      for (int l = 0; l < count; ++l) {
        const TrianglePairIntegrals alone = distant ? triangle_pair_integrals_distant(t[0], *sources[l], k)
                                                    : triangle_pair_integrals_by_points(t[0], *sources[l], k);
        EXPECT_EQ(batch[l].scalar, alone.scalar) << "lane " << l << " of " << count;
        EXPECT_TRUE(batch[l].vector == alone.vector) << "lane " << l << " of " << count;
        EXPECT_LT(relative_error(batch[l], fine_pair_integrals(t[0], *sources[l], k)), distant ? 6e-6 : 2.2e-5)
            << "lane " << l << (distant ? ", distant" : ", far");
      }
    }
  }
}

}  // namespace
}  // namespace lobe
