// The space-filling order the fill numbers surface functions and visits triangles in.
#include <gtest/gtest.h>

#include <algorithm>
#include <random>
#include <vector>

#include "solver/spatial_order.hpp"

namespace lobe {
namespace {

// The Z-order (Morton 1966) of the four corners of a square: (0,0), (1,0), (0,1), (1,1),
// given in another order; two points in one place keep their given order.
TEST(SpatialOrder, FollowsTheZOrderCurve) {
  const std::vector<Vec3> points{{1, 1, 0}, {0, 1, 0}, {1, 0, 0}, {0, 0, 0}, {1, 1, 0}};
  EXPECT_EQ(space_filling_order(points), (std::vector<int>{3, 2, 1, 0, 4}));
  EXPECT_TRUE(space_filling_order({}).empty());
  EXPECT_EQ(space_filling_order({Vec3(2, 2, 2), Vec3(2, 2, 2)}), (std::vector<int>{0, 1}));
}

// The points of a 32 × 32 × 2 grid, shuffled: in the curve's order every point is a
// permutation's, and consecutive points are neighbours on average (the curve's mean step
// here is 1.48 spacings, computed apart from this code; the shuffled order's is 16.7).
TEST(SpatialOrder, PutsNeighboursInSpaceNearEachOther) {
  std::vector<Vec3> points;
  for (int i = 0; i < 32; ++i)
    for (int j = 0; j < 32; ++j)
      for (int k = 0; k < 2; ++k) points.emplace_back(0.01 * i, 0.01 * j, 0.01 * k);
  std::shuffle(points.begin(), points.end(), std::mt19937(5));
  const std::vector<int> order = space_filling_order(points);
  std::vector<int> sorted = order;
  std::sort(sorted.begin(), sorted.end());
  for (int i = 0; i < static_cast<int>(sorted.size()); ++i) ASSERT_EQ(sorted[i], i);
  Real steps = 0.0;
  for (std::size_t i = 1; i < order.size(); ++i) steps += (points[order[i]] - points[order[i - 1]]).norm();
  EXPECT_LT(steps / (order.size() - 1), 2 * 0.01);
}

}  // namespace
}  // namespace lobe
