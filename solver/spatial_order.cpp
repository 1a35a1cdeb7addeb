#include "solver/spatial_order.hpp"

#include <algorithm>
#include <cstdint>
#include <numeric>

namespace lobe {
namespace {

/// The 21 low bits of v spread to every third bit.
std::uint64_t spread_bits(std::uint64_t v) {
  v &= 0x1fffff;
  v = (v | v << 32) & 0x1f00000000ffff;
  v = (v | v << 16) & 0x1f0000ff0000ff;
  v = (v | v << 8) & 0x100f00f00f00f00f;
  v = (v | v << 4) & 0x10c30c30c30c30c3;
  v = (v | v << 2) & 0x1249249249249249;
  return v;
}

}  // namespace

std::vector<int> space_filling_order(const std::vector<Vec3>& points) {
  std::vector<int> order(points.size());
  std::iota(order.begin(), order.end(), 0);
  if (points.empty()) return order;
  Vec3 low = points.front(), high = points.front();
  for (const Vec3& p : points) low = low.cwiseMin(p), high = high.cwiseMax(p);
  const Real cells = (1 << 21) - 1;
  const Real extent = (high - low).maxCoeff();
  const Real scale = extent > 0.0 ? cells / extent : 0.0;
  std::vector<std::uint64_t> key(points.size());
  for (std::size_t i = 0; i < points.size(); ++i) {
    const Vec3 cell = ((points[i] - low) * scale).cwiseMin(cells);
    key[i] = spread_bits(static_cast<std::uint64_t>(cell.x())) | spread_bits(static_cast<std::uint64_t>(cell.y())) << 1 |
             spread_bits(static_cast<std::uint64_t>(cell.z())) << 2;
  }
  std::stable_sort(order.begin(), order.end(), [&key](int a, int b) { return key[a] < key[b]; });
  return order;
}

}  // namespace lobe
