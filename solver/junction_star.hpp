#pragma once
/// The surface half of a wire-to-surface junction basis function: the current a wire
/// brings to a mesh vertex, spreading out over the triangles around that vertex.
#include <vector>

#include "geometry/surface_mesh.hpp"

namespace lobe {

/// One triangle around the junction vertex v, with its far edge from a to b.
struct StarTriangle {
  Vec3 a = Vec3::Zero();
  Vec3 b = Vec3::Zero();
  Real area = 0.0;
  int triangle = -1;  ///< index in the surface mesh
};

/// On each triangle T_i around v, with s = 1 − λ_v (λ_v the barycentric coordinate of v:
/// s runs from 0 at v to 1 on the far edge),
///   f(r) = K (1 − s²) (r − v) / |r − v|²,   ∇·f = −2 K s² / |r − v|²,
/// and K = 1/α, α the total angle of the triangles at v. Unit current leaves v
/// (f ~ 1/(α ρ) near it); the normal component vanishes on every edge, so there are no line
/// charges; the charge density stays bounded and, like an RWG function's, grows linearly
/// with s along each ray, so the RWG functions around the star can carry it away without
/// a singular remainder. It integrates to −1, balancing the wire half. An attachment mode
/// of the kind published for wire-to-surface junctions (Hwu, Wilton & Rao, 1988, from
/// memory), integrated in the Duffy coordinates r = v + s (a + t(b − a) − v), in which
/// f dS and ∇·f dS are smooth:
///   ∇·f dS = −4 A K s / |d|² ds dt,   f dS = 2 A K (1 − s²) d / |d|² ds dt,
///   d = a + t(b − a) − v.
struct JunctionStar {
  Vec3 vertex = Vec3::Zero();
  int mesh_vertex = -1;      ///< index of v in the surface mesh
  std::vector<StarTriangle> triangles;
  Real scale = 0.0;          ///< K = 1/α, 1/rad
  std::vector<int> bases;    ///< the junction functions (one per wire end at v)

  /// Longest distance from v to a far-edge end, m.
  Real radius() const;
  /// The star mapped by a reflection (for image theory); f maps to its mirror image.
  JunctionStar imaged(const Eigen::Matrix3d& mirror) const;
};

/// The star of the triangles of `mesh` that use `vertex`. Throws std::logic_error if none do.
JunctionStar junction_star(const SurfaceMesh& mesh, int vertex);

/// Φ = ∫ G ∇·f dS (1/m) and A = ∫ G f dS (dimensionless) of the star's function at r, G = e^{−jkR}/(4πR). Far points (beyond four star radii) use a
/// 4 × 4 Gauss rule in (s, t) on each triangle; near points integrate the static part
/// along each ray v → a + t(b − a) in closed form and split the t-range where the ray
/// passes through r, leaving only logarithmic behaviour for 8-point Gauss rules.
struct StarPotentials {
  Complex scalar = 0.0;
  Eigen::Vector3cd vector = Eigen::Vector3cd::Zero();
};
StarPotentials star_potentials(const JunctionStar& star, const Vec3& r, Real k);

/// A test point on the star: position, ∇·f dS weight and f dS weight.
struct StarSample {
  Vec3 r;
  Real charge;
  Vec3 current;
};
/// Duffy-coordinate samples of the star's function, `order` × `order` per triangle.
std::vector<StarSample> star_samples(const JunctionStar& star, int order);

}  // namespace lobe
