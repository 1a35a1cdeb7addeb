#pragma once
/// Plates and closed bodies, before meshing, in metres.
#include <string>
#include <vector>

#include "core/input_error.hpp"
#include "core/types.hpp"

namespace lobe {

enum class SurfaceKind { rectangle, polygon, disc, sphere, box };

/// One surface object. A rectangle spans `width` along u and `length` along n × u from
/// `corner`, with u the unit vector in its plane nearest +x (nearest +y when the normal is
/// along x); a disc is centred on `corner`; a box spans `size` from `corner`.
struct SurfaceShape {
  std::string name;
  SourceLocation where;
  SurfaceKind kind = SurfaceKind::rectangle;
  Vec3 corner = Vec3::Zero();   ///< rectangle and box corner; disc and sphere centre
  Vec3 normal = Vec3::UnitZ();  ///< rectangle and disc
  Real width = 0.0, length = 0.0;
  Real diameter = 0.0;          ///< disc and sphere
  Vec3 size = Vec3::Zero();     ///< box extents along x, y, z
  std::vector<Vec3> polygon;    ///< polygon corners, in order
  Real mesh_size = 0.0;         ///< target triangle edge, m; 0: a tenth of the shortest wavelength
  Real conductivity = 0.0;      ///< S/m; 0 means perfectly conducting
  Real conductor_thickness = 0.0;  ///< m, of a plate's metal; 0: many skin depths
  Affine transform = Affine::Identity();  ///< copy/shift/turn/mirror, applied after building
  /// Holes and notches (rectangles, polygons, discs in the plate's own plane, in its
  /// coordinates before any transform), cut away before meshing.
  std::vector<SurfaceShape> cuts;
};

}  // namespace lobe
