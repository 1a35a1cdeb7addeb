#include "solver/rwg_basis.hpp"

#include <map>
#include <utility>

namespace lobe {

RwgBasis::RwgBasis(const SurfaceMesh& mesh) : m_by_triangle(mesh.triangles.size()) {
  // Each undirected edge, with the triangles (and their local opposite corners) that hold it.
  std::map<std::pair<int, int>, std::vector<std::pair<int, int>>> edges;
  for (std::size_t t = 0; t < mesh.triangles.size(); ++t)
    for (int k = 0; k < 3; ++k) {
      const int a = mesh.triangles[t][(k + 1) % 3], b = mesh.triangles[t][(k + 2) % 3];
      edges[{std::min(a, b), std::max(a, b)}].emplace_back(static_cast<int>(t), k);
    }
  for (const auto& [edge, sides] : edges) {
    if (sides.size() != 2) continue;
    const Real length = (mesh.vertices[edge.first] - mesh.vertices[edge.second]).norm();
    const auto [plus, plus_corner] = sides[0];
    const auto [minus, minus_corner] = sides[1];
    m_by_triangle[plus].push_back({m_count, plus_corner, length / (2 * mesh.area(plus))});
    m_by_triangle[minus].push_back({m_count, minus_corner, -length / (2 * mesh.area(minus))});
    ++m_count;
  }
}

}  // namespace lobe
