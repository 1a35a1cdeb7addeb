#pragma once
/// A hash grid of points in space, for finding near neighbours without comparing every pair.
#include <cmath>
#include <cstdint>
#include <unordered_map>
#include <vector>

#include "core/types.hpp"

namespace lobe {

/// Buckets of item indices by the cube of side `cell` their point falls in. A query around
/// p within `reach` ≤ cell visits the 27 cubes around p's, so every item within reach is
/// found; cost is proportional to the items in those cubes.
class SpatialGrid {
 public:
  explicit SpatialGrid(Real cell) : m_cell(cell > 0.0 && std::isfinite(cell) ? cell : 1.0) {}

  void insert(const Vec3& p, int item) { m_cells[key(cell_of(p))].push_back(item); }

  /// Calls visit(item) for every item whose cube neighbours p's (a superset of those
  /// within one cell of p).
  template <class Visit>
  void for_near(const Vec3& p, Visit&& visit) const {
    const Eigen::Vector3i c = cell_of(p);
    for (int dx = -1; dx <= 1; ++dx)
      for (int dy = -1; dy <= 1; ++dy)
        for (int dz = -1; dz <= 1; ++dz) {
          const auto found = m_cells.find(key(c + Eigen::Vector3i(dx, dy, dz)));
          if (found == m_cells.end()) continue;
          for (int item : found->second) visit(item);
        }
  }

 private:
  Eigen::Vector3i cell_of(const Vec3& p) const {
    // Coordinates are bounded by the parser; clamp anyway so a cast never overflows.
    auto index = [&](Real x) { return static_cast<int>(std::clamp(std::floor(x / m_cell), -1e9, 1e9)); };
    return {index(p.x()), index(p.y()), index(p.z())};
  }
  static std::uint64_t key(const Eigen::Vector3i& c) {
    const auto part = [](int v) { return static_cast<std::uint64_t>(static_cast<std::uint32_t>(v)); };
    return part(c.x()) * 0x9E3779B97F4A7C15ull ^ part(c.y()) * 0xC2B2AE3D27D4EB4Full ^ part(c.z()) * 0x165667B19E3779F9ull;
  }

  Real m_cell;
  std::unordered_map<std::uint64_t, std::vector<int>> m_cells;
};

}  // namespace lobe
