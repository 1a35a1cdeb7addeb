#include "solver/rwg_basis.hpp"

#include <algorithm>
#include <map>
#include <tuple>
#include <utility>

#include "solver/spatial_order.hpp"

namespace lobe {

RwgBasis::RwgBasis(const SurfaceMesh& mesh, int first) : m_first(first), m_by_triangle(mesh.triangles.size()) {
  // Each undirected edge, with the triangles (and their local opposite corners) that hold it.
  std::map<std::pair<int, int>, std::vector<std::pair<int, int>>> edges;
  for (std::size_t t = 0; t < mesh.triangles.size(); ++t)
    for (int k = 0; k < 3; ++k) {
      const int a = mesh.triangles[t][(k + 1) % 3], b = mesh.triangles[t][(k + 2) % 3];
      edges[{std::min(a, b), std::max(a, b)}].emplace_back(static_cast<int>(t), k);
    }
  std::vector<decltype(edges)::const_iterator> interior;
  std::vector<Vec3> midpoints;
  for (auto edge = edges.cbegin(); edge != edges.cend(); ++edge) {
    if (edge->second.size() != 2) continue;
    interior.push_back(edge);
    midpoints.push_back(0.5 * (mesh.vertices[edge->first.first] + mesh.vertices[edge->first.second]));
  }
  // Numbered along a space-filling curve (solver/spatial_order.hpp); m_by_vertices keeps
  // the functions in the order of their vertex pairs, for function_on().
  const std::vector<int> order = space_filling_order(midpoints);
  m_by_vertices.resize(interior.size());
  for (const int i : order) {
    const auto& [edge, sides] = *interior[i];
    const Real length = (mesh.vertices[edge.first] - mesh.vertices[edge.second]).norm();
    const auto [plus, plus_corner] = sides[0];
    const auto [minus, minus_corner] = sides[1];
    m_by_vertices[i] = size();
    const int basis = m_first + size();
    m_by_triangle[plus].push_back({basis, plus_corner, length / (2 * mesh.area(plus))});
    m_by_triangle[minus].push_back({basis, minus_corner, -length / (2 * mesh.area(minus))});
    m_edges.push_back({edge.first, edge.second, plus, minus, length});
  }
}

int RwgBasis::function_on(int a, int b) const {
  const RwgEdge key{std::min(a, b), std::max(a, b)};
  const auto before = [this, &key](int function) {
    return std::tie(m_edges[function].a, m_edges[function].b) < std::tie(key.a, key.b);
  };
  const auto found = std::partition_point(m_by_vertices.begin(), m_by_vertices.end(), before);
  if (found == m_by_vertices.end() || m_edges[*found].a != key.a || m_edges[*found].b != key.b) return -1;
  return m_first + *found;
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
