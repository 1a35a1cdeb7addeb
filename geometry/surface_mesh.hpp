#pragma once
/// Flat triangles sharing vertices: the discrete form of plates and bodies.
#include <array>
#include <vector>

#include "core/types.hpp"

namespace lobe {

/// Triangles as vertex indices, counter-clockwise about the outward normal of a body.
struct SurfaceMesh {
  std::vector<Vec3> vertices;                 ///< m
  std::vector<std::array<int, 3>> triangles;

  Vec3 corner(int triangle, int k) const { return vertices[triangles[triangle][k]]; }
  Real area(int triangle) const {
    return 0.5 * (corner(triangle, 1) - corner(triangle, 0)).cross(corner(triangle, 2) - corner(triangle, 0)).norm();
  }
  /// Unit normal by the right-hand rule over the corners' order.
  Vec3 normal(int triangle) const {
    return (corner(triangle, 1) - corner(triangle, 0)).cross(corner(triangle, 2) - corner(triangle, 0)).normalized();
  }
  Vec3 centroid(int triangle) const {
    return (corner(triangle, 0) + corner(triangle, 1) + corner(triangle, 2)) / 3.0;
  }
};

}  // namespace lobe
