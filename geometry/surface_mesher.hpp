#pragma once
/// Triangle meshes of plates and bodies, made by Gmsh (OpenCASCADE kernel).
#include <vector>

#include "geometry/surface_mesh.hpp"
#include "geometry/surface_shape.hpp"

namespace lobe {

/// The mesh and what a user checks about it.
struct SurfaceMeshReport {
  SurfaceMesh mesh;
  std::vector<int> region;    ///< per triangle: the index of the shape it belongs to
  Real smallest_angle = 0.0;  ///< rad, over all triangles (slivers have small ones)
};

/// Meshes every shape with triangles of about its mesh size. Shapes that touch or overlap
/// are fragmented first (OpenCASCADE boolean fragments), so meshes are conformal where they
/// meet. Gmsh is a global library: this function is not re-entrant. Throws InputError,
/// located at the offending shape, for degenerate or non-planar input.
SurfaceMeshReport mesh_surfaces(const std::vector<SurfaceShape>& shapes);

}  // namespace lobe
