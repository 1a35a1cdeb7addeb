#pragma once
/// Triangle meshes of plates and bodies, made by Gmsh (OpenCASCADE kernel).
#include <vector>

#include "geometry/mesh_warning.hpp"
#include "geometry/model.hpp"
#include "geometry/surface_mesh.hpp"
#include "geometry/surface_shape.hpp"

namespace lobe {

/// A straight line that must be laid along mesh edges (a port across a plate), m.
struct MeshLine {
  Vec3 from = Vec3::Zero();
  Vec3 to = Vec3::Zero();
};

/// What the mesh must respect besides the shapes themselves.
struct MeshConstraints {
  std::vector<Vec3> points;     ///< become mesh vertices where they lie on a surface (wire ends)
  std::vector<MeshLine> lines;  ///< become chains of mesh edges where they lie on a surface
};

/// The mesh and what a user checks about it.
struct SurfaceMeshReport {
  SurfaceMesh mesh;
  std::vector<int> region;    ///< per triangle: the index of the shape it belongs to
  Real smallest_angle = 0.0;  ///< rad, over all triangles (slivers have small ones)
  /// Per constraint point: the vertex at it when it lies on a surface, else −1.
  std::vector<int> point_vertex;
  /// Per constraint line: the mesh edges (vertex pairs) laid along it on surfaces.
  std::vector<std::vector<std::array<int, 2>>> line_edges;
  std::vector<MeshWarning> warnings;  ///< from mesh_model_surfaces: meshes too coarse for their shape
};

/// Meshes every shape with triangles of about its mesh size. Shapes that touch or overlap
/// are fragmented first (OpenCASCADE boolean fragments), so meshes are conformal where they
/// meet; constraint points and lines are fragmented in too, and meshed about half the
/// smallest shape size around them. Gmsh is a global library: this function is not
/// re-entrant. Throws InputError, located at the offending shape, for degenerate or
/// non-planar input.
SurfaceMeshReport mesh_surfaces(const std::vector<SurfaceShape>& shapes, const MeshConstraints& constraints = {});

}  // namespace lobe

namespace lobe {

/// Default mesh: about ten triangle edges per wavelength (common practice for RWG).
constexpr Real default_edges_per_wavelength = 10.0;
/// What a curved body needs for its facets to follow it (about 0.15 dB in a sphere's RCS).
constexpr Real curved_edges_per_wavelength = 20.0;
/// Coarser than this a curved body earns a warning: "about λ/20", with a quarter's grace.
constexpr Real coarse_curved_edges_per_wavelength = 16.0;

/// Meshes the model's plates and bodies; shapes without a `mesh` size get a tenth of the
/// wavelength at the model's highest frequency. Warns where a curved body's triangles are
/// longer than a twentieth of that wavelength.
SurfaceMeshReport mesh_model_surfaces(const Model& model, const MeshConstraints& constraints = {});

/// The RWG functions the model's surfaces will have, estimated from their areas and mesh
/// sizes before meshing (about 1.5 edges per triangle of area √3/4 h²; cuts ignored), so
/// that a model too large for the machine is refused before the mesher runs for hours.
double estimated_surface_functions(const Model& model);

}  // namespace lobe
