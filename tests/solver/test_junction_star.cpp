#include <gtest/gtest.h>

#include "core/constants.hpp"
#include "solver/gauss_legendre.hpp"
#include "solver/junction_star.hpp"
#include "solver/medium.hpp"

namespace lobe {
namespace {

/// Five irregular triangles around the origin, filling the full turn.
SurfaceMesh irregular_star() {
  SurfaceMesh m;
  m.vertices = {{0, 0, 0}, {1, 0, 0}, {0.3, 0.9, 0}, {-0.8, 0.4, 0}, {-0.5, -0.7, 0}, {0.6, -0.8, 0}};
  m.triangles = {{0, 1, 2}, {0, 2, 3}, {0, 3, 4}, {0, 4, 5}, {0, 5, 1}};
  return m;
}

/// The potentials by a plain 256 × 256 Gauss rule in the Duffy coordinates, with the full
/// kernel: slow, and accurate for points off the plane of the star.
StarPotentials brute_force(const JunctionStar& star, const Vec3& r, Real k) {
  constexpr int n = 256;
  const QuadratureRule& rule = gauss_legendre(n);
  StarPotentials out;
  for (const auto& tri : star.triangles)
    for (int i = 0; i < n; ++i) {
      const Vec3 d = tri.a + rule.nodes[i] * (tri.b - tri.a) - star.vertex;
      const Real w = 2 * tri.area * star.scale * rule.weights[i] / d.squaredNorm() / (4 * pi);
      for (int j = 0; j < n; ++j) {
        const Real s = rule.nodes[j], distance = (r - star.vertex - s * d).norm();
        const Complex g = w * rule.weights[j] * std::polar(1.0 / distance, -k * distance);
        out.scalar -= 2 * s * g;
        out.vector += ((1 - s * s) * g) * d.cast<Complex>();
      }
    }
  return out;
}

TEST(JunctionStar, CarriesUnitCurrentAndBalancingCharge) {
  const JunctionStar star = junction_star(irregular_star(), 0);
  EXPECT_NEAR(star.scale, 1 / (2 * pi), 1e-12);  // an interior vertex: the full turn
  Real charge = 0.0;
  for (const StarSample& s : star_samples(star, 8)) charge += s.charge;
  EXPECT_NEAR(charge, -1.0, 1e-6);  // ∮ f·n = 1 leaves v, so ∫ ∇·f = −1
}

// The closed-form ray integrals with split t-ranges against brute force, from far away to
// just above the star, where a plain rule would need hundreds of points.
TEST(JunctionStar, PotentialsMatchBruteForceQuadrature) {
  const JunctionStar star = junction_star(irregular_star(), 0);
  const Real k = 2.0;
  for (const Vec3& r : {Vec3(5, 1, 1), Vec3(0.2, 0.1, 0.3), Vec3(0.2, 0.1, 0.05), Vec3(0.1, 0.4, 0.02), Vec3(0, 0, 0.2)}) {
    const StarPotentials fast = star_potentials(star, r, k), slow = brute_force(star, r, k);
    EXPECT_LT(std::abs(fast.scalar - slow.scalar), 1e-3 * std::abs(slow.scalar)) << r.transpose();
    EXPECT_LT((fast.vector - slow.vector).norm(), 1e-3 * slow.vector.norm()) << r.transpose();
  }
}

TEST(JunctionStar, MirrorReflectsTheGeometry) {
  SurfaceMesh raised = irregular_star();
  for (Vec3& v : raised.vertices) v.z() += 0.5;
  const JunctionStar image = junction_star(raised, 0).imaged(Medium::over_perfect_ground().images().front().mirror);
  EXPECT_NEAR(image.vertex.z(), -0.5, 1e-15);
  for (const auto& t : image.triangles) EXPECT_NEAR(t.a.z(), -0.5, 1e-15);
}

}  // namespace
}  // namespace lobe
