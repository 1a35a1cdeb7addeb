#include <gtest/gtest.h>

#include <cmath>

#include "core/constants.hpp"
#include "solver/segment_integrals.hpp"

namespace lobe {
namespace {

/// The production rules against an independent slow reference must agree to this
/// relative accuracy: far below anything a port impedance is quoted to.
constexpr Real quadrature_tolerance = 1e-5;

/// Independent slow reference: a composite 8-point product rule with `parts` equal
/// subintervals on each segment, no singularity treatment (the reduced kernel is smooth,
/// only steep, so this converges as parts grows).
PairIntegrals brute_force(const SegmentGeometry& a, const SegmentGeometry& b, Real k, int parts) {
  const QuadratureRule& g = gauss_legendre(8);
  const Real a2 = 0.5 * (a.radius * a.radius + b.radius * b.radius);
  const Real la = (a.end - a.start).norm(), lb = (b.end - b.start).norm();
  PairIntegrals sum{};
  for (int pa = 0; pa < parts; ++pa)
    for (int i = 0; i < 8; ++i) {
      const Real xi = (pa + g.nodes[i]) / parts;
      const Vec3 x = a.start + xi * (a.end - a.start);
      for (int pb = 0; pb < parts; ++pb)
        for (int j = 0; j < 8; ++j) {
          const Real eta = (pb + g.nodes[j]) / parts;
          const Real r = std::sqrt((x - b.start - eta * (b.end - b.start)).squaredNorm() + a2);
          const Complex w = g.weights[i] * g.weights[j] / (parts * parts) * la * lb * std::polar(1.0, -k * r) / (4 * pi * r);
          sum[0] += w * (1 - xi) * (1 - eta);
          sum[1] += w * (1 - xi) * eta;
          sum[2] += w * xi * (1 - eta);
          sum[3] += w * xi * eta;
        }
    }
  return sum;
}

void expect_agree(const PairIntegrals& fast, const PairIntegrals& slow) {
  Real scale = 0;
  for (const auto& v : slow) scale = std::max(scale, std::abs(v));
  for (int i = 0; i < 4; ++i) EXPECT_LE(std::abs(fast[i] - slow[i]), quadrature_tolerance * scale) << i;
}

constexpr Real k = 2 * pi;  // λ = 1 m
const SegmentGeometry self{{0, 0, 0}, {0.05, 0, 0}, 5e-4};

TEST(SegmentIntegrals, SelfTermMatchesSlowReference) {
  expect_agree(segment_pair_integrals(self, self, k), brute_force(self, self, k, 400));
}

TEST(SegmentIntegrals, BentNeighbourMatchesSlowReference) {
  const SegmentGeometry bent{{0.05, 0, 0}, {0.05, 0.04, 0.01}, 5e-4};
  expect_agree(segment_pair_integrals(self, bent, k), brute_force(self, bent, k, 400));
}

TEST(SegmentIntegrals, DistantParallelMatchesSlowReference) {
  const SegmentGeometry far{{0.02, 0.3, 0}, {0.07, 0.3, 0}, 5e-4};
  expect_agree(segment_pair_integrals(self, far, k), brute_force(self, far, k, 20));
}

TEST(SegmentIntegrals, FarPairMatchesSlowReference) {
  const SegmentGeometry far{{0.6, 0.5, 0.1}, {0.64, 0.53, 0.1}, 5e-4};  // beyond six combined lengths
  expect_agree(segment_pair_integrals(self, far, k), brute_force(self, far, k, 8));
}

// Reciprocity of the kernel: swapping observer and source transposes the 2×2 block. The
// two orders use different rules (analytic inner integral on the other segment), so this
// checks the near-term accuracy as well.
TEST(SegmentIntegrals, SwappingRolesTransposes) {
  const SegmentGeometry bent{{0.05, 0, 0}, {0.08, 0.03, 0.0}, 3e-4};
  const PairIntegrals ab = segment_pair_integrals(self, bent, k);
  const PairIntegrals ba = segment_pair_integrals(bent, self, k);
  const Real scale = std::abs(ab[0]);
  EXPECT_LE(std::abs(ab[0] - ba[0]), 1e-6 * scale);
  EXPECT_LE(std::abs(ab[1] - ba[2]), 1e-6 * scale);
  EXPECT_LE(std::abs(ab[2] - ba[1]), 1e-6 * scale);
  EXPECT_LE(std::abs(ab[3] - ba[3]), 1e-6 * scale);
}

}  // namespace
}  // namespace lobe
