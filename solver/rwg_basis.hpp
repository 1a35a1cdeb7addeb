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

/// One function per interior edge shared by exactly two triangles.
class RwgBasis {
 public:
  explicit RwgBasis(const SurfaceMesh& mesh);
  int size() const { return m_count; }
  const std::vector<RwgPiece>& pieces_on(int triangle) const { return m_by_triangle[triangle]; }

 private:
  int m_count = 0;
  std::vector<std::vector<RwgPiece>> m_by_triangle;
};

}  // namespace lobe
