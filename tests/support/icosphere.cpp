#include "support/icosphere.hpp"

#include <cmath>
#include <map>

namespace lobe::testing {

SurfaceMesh icosphere(Real radius, int levels) {
  const Real t = (1.0 + std::sqrt(5.0)) / 2.0;
  SurfaceMesh mesh;
  mesh.vertices = {{-1, t, 0}, {1, t, 0}, {-1, -t, 0}, {1, -t, 0}, {0, -1, t}, {0, 1, t},
                   {0, -1, -t}, {0, 1, -t}, {t, 0, -1}, {t, 0, 1}, {-t, 0, -1}, {-t, 0, 1}};
  mesh.triangles = {{0, 11, 5}, {0, 5, 1},  {0, 1, 7},   {0, 7, 10}, {0, 10, 11}, {1, 5, 9}, {5, 11, 4},
                    {11, 10, 2}, {10, 7, 6}, {7, 1, 8},  {3, 9, 4},  {3, 4, 2},   {3, 2, 6}, {3, 6, 8},
                    {3, 8, 9},  {4, 9, 5},  {2, 4, 11}, {6, 2, 10}, {8, 6, 7},   {9, 8, 1}};
  for (int level = 0; level < levels; ++level) {
    std::map<std::pair<int, int>, int> midpoints;
    auto midpoint = [&](int a, int b) {
      const auto key = std::make_pair(std::min(a, b), std::max(a, b));
      if (auto it = midpoints.find(key); it != midpoints.end()) return it->second;
      mesh.vertices.push_back(0.5 * (mesh.vertices[a] + mesh.vertices[b]));
      return midpoints[key] = static_cast<int>(mesh.vertices.size()) - 1;
    };
    std::vector<std::array<int, 3>> finer;
    for (const auto& [a, b, c] : mesh.triangles) {
      const int ab = midpoint(a, b), bc = midpoint(b, c), ca = midpoint(c, a);
      finer.push_back({a, ab, ca});
      finer.push_back({b, bc, ab});
      finer.push_back({c, ca, bc});
      finer.push_back({ab, bc, ca});
    }
    mesh.triangles = std::move(finer);
  }
  for (auto& v : mesh.vertices) v = radius * v.normalized();
  return mesh;
}

}  // namespace lobe::testing
