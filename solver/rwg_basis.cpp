#include "solver/rwg_basis.hpp"

#include <algorithm>
#include <map>
#include <tuple>
#include <utility>

namespace lobe {

RwgBasis::RwgBasis(const SurfaceMesh& mesh, int first) : m_first(first), m_by_triangle(mesh.triangles.size()) {
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
    const int basis = m_first + size();
    m_by_triangle[plus].push_back({basis, plus_corner, length / (2 * mesh.area(plus))});
    m_by_triangle[minus].push_back({basis, minus_corner, -length / (2 * mesh.area(minus))});
    m_edges.push_back({edge.first, edge.second, plus, minus, length});
  }
}

int RwgBasis::function_on(int a, int b) const {
  const RwgEdge key{std::min(a, b), std::max(a, b)};
  const auto less = [](const RwgEdge& x, const RwgEdge& y) { return std::tie(x.a, x.b) < std::tie(y.a, y.b); };
  const auto found = std::lower_bound(m_edges.begin(), m_edges.end(), key, less);
  if (found == m_edges.end() || found->a != key.a || found->b != key.b) return -1;
  return m_first + static_cast<int>(found - m_edges.begin());
}

Eigen::Vector3cd current_density(const SurfaceMesh& mesh, const RwgBasis& basis, const ComplexVector& coefficients, int t,
                                 const Vec3& r) {
  Eigen::Vector3cd density = Eigen::Vector3cd::Zero();
  for (const RwgPiece& piece : basis.pieces_on(t))
    density += (piece.coefficient * coefficients[piece.basis]) * (r - mesh.corner(t, piece.free_corner)).cast<Complex>();
  return density;
}

std::vector<Eigen::Vector3cd> centroid_current_density(const SurfaceMesh& mesh, const RwgBasis& basis,
                                                       const ComplexVector& coefficients) {
  std::vector<Eigen::Vector3cd> density(mesh.triangles.size());
  for (std::size_t t = 0; t < mesh.triangles.size(); ++t) {
    const int ti = static_cast<int>(t);
    density[t] = current_density(mesh, basis, coefficients, ti, mesh.centroid(ti));
  }
  return density;
}

}  // namespace lobe
