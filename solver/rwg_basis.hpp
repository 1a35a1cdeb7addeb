#pragma once
/// Rao–Wilton–Glisson edge basis functions over a triangle mesh.
#include <vector>

#include "geometry/surface_mesh.hpp"

namespace lobe {

/// One half of an RWG function on one triangle: f(r) = coefficient · (r − v_free),
/// ∇·f = 2 · coefficient, with coefficient = ± l / (2A) (Rao, Wilton & Glisson, IEEE
/// Trans. Antennas Propag. 30(3), 1982): + on the triangle the current leaves (T⁺),
/// − on the one it enters (T⁻). The normal component across the shared edge is 1.
struct RwgPiece {
  int basis = 0;
  int free_corner = 0;   ///< local index (0, 1, 2) of the vertex opposite the edge
  Real coefficient = 0;  ///< 1/m
};

/// The edge of one RWG function: vertices a < b, the triangle current leaves (plus) and
/// the one it enters (minus).
struct RwgEdge {
  int a = 0, b = 0;
  int plus = 0, minus = 0;
  Real length = 0.0;  ///< m
};

/// One function per interior edge shared by exactly two triangles, numbered from `first`
/// (so that surface unknowns can follow wire unknowns in one matrix) along a space-filling
/// curve through the edges' midpoints (solver/spatial_order.hpp).
class RwgBasis {
 public:
  explicit RwgBasis(const SurfaceMesh& mesh, int first = 0);
  int size() const { return static_cast<int>(m_edges.size()); }
  int first() const { return m_first; }
  const std::vector<RwgPiece>& pieces_on(int triangle) const { return m_by_triangle[triangle]; }
  /// Edge of function first() + i.
  const RwgEdge& edge(int i) const { return m_edges[i]; }
  /// The function on the edge between vertices a and b, or −1 when that is no interior edge.
  int function_on(int a, int b) const;

 private:
  int m_first = 0;
  std::vector<RwgEdge> m_edges;
  std::vector<int> m_by_vertices;  ///< functions (from 0) sorted by their vertex pairs
  std::vector<std::vector<RwgPiece>> m_by_triangle;
};

/// Σ_n I_n f_n at the point r of triangle t, A/m.
Eigen::Vector3cd current_density(const SurfaceMesh& mesh, const RwgBasis& basis, const ComplexVector& coefficients, int t,
                                 const Vec3& r);

/// Σ_n I_n f_n at the centroid of every triangle, A/m, for coefficients indexed as the
/// basis numbers its functions.
std::vector<Eigen::Vector3cd> centroid_current_density(const SurfaceMesh& mesh, const RwgBasis& basis,
                                                       const ComplexVector& coefficients);

}  // namespace lobe
