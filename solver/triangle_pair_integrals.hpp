#pragma once
/// Integrals of the free-space Green's function over a pair of triangles, for RWG fills.
#include <algorithm>
#include <array>
#include <vector>

#include "core/types.hpp"
#include "geometry/surface_mesh.hpp"

namespace lobe {

/// vector(i, j) = ∫_P ∫_Q (r − p_i)·(r' − q_j) G dS' dS and scalar = ∫_P ∫_Q G dS' dS, with
/// p_i, q_j the corners of the observation triangle P and the source triangle Q and
/// G = e^{−jkR}/(4πR). Units: vector m⁵, scalar m³.
struct TrianglePairIntegrals {
  Eigen::Matrix3cd vector = Eigen::Matrix3cd::Zero();
  Complex scalar = 0.0;
};

/// The potentials of uniform and linear sources on one triangle at a point r:
/// scalar = ∫_Q G dS' (m) and moment = ∫_Q G r' dS' (m²), G = e^{−jkR}/(4πR). With `near`,
/// the static 1/R part is integrated in closed form (Wilton et al. 1984) and the smooth rest
/// with the 7-point rule, which is accurate at any r, on Q or not; otherwise 7 points.
struct PointPotentials {
  Complex scalar = 0.0;
  Eigen::Vector3cd moment = Eigen::Vector3cd::Zero();
};
PointPotentials triangle_point_potentials(const Vec3& r, const Vec3& q0, const Vec3& q1, const Vec3& q2, Real area,
                                          Real k, bool near);

/// A rule's points on one triangle by coordinate, with their weights times the area, for
/// the far pairs' vectorised loops.
struct PointLanes {
  static constexpr int capacity = 8;
  int points = 0;
  alignas(64) std::array<Real, capacity> x, y, z, w;
};

/// What a fill needs of one triangle, computed once per triangle rather than per pair:
/// corners, area, longest edge, centroid, and the 7-point degree-5 rule's points with their
/// weights times the area, also as lanes; the 6-point degree-4 rule's as lanes for distant
/// pairs (256 bytes a source triangle brings into cache).
struct TriangleQuadrature {
  static constexpr int points = 7;
  std::array<Vec3, 3> corners;
  Real area = 0.0;
  Real size = 0.0;
  Vec3 centroid = Vec3::Zero();
  std::array<Vec3, points> x;
  std::array<Real, points> w;
  PointLanes far;
  PointLanes distant;
};
std::vector<TriangleQuadrature> triangle_quadrature(const SurfaceMesh& mesh);

/// A pair is near when its centroids are closer than this many of the larger triangle's
/// longest edges: 1/R then varies too fast over Q for seven points.
constexpr Real near_distance_in_sizes = 2.0;
inline bool triangle_pair_is_near(const TriangleQuadrature& observer, const TriangleQuadrature& source) {
  const Real reach = near_distance_in_sizes * std::max(observer.size, source.size);
  return (observer.centroid - source.centroid).squaredNorm() < reach * reach;
}

/// A pair is distant when its centroids are at least this many of the larger triangle's
/// longest edges apart: the 6 × 6 product rule of degree 4 then integrates it better than
/// 7 × 7 points integrate a pair at the near distance (worst relative error of the nine
/// vector integrals and the scalar one over tilted and offset pairs with kh ≤ 0.63: 6e-6
/// at three sizes, against 2e-5 at two), with 36 kernels instead of 49.
constexpr Real distant_distance_in_sizes = 3.0;
inline bool triangle_pair_is_distant(const TriangleQuadrature& observer, const TriangleQuadrature& source) {
  const Real reach = distant_distance_in_sizes * std::max(observer.size, source.size);
  return (observer.centroid - source.centroid).squaredNorm() >= reach * reach;
}

/// The pair's integrals by the 7 × 7 product rule alone, as a far pair gets them.
TrianglePairIntegrals triangle_pair_integrals_by_points(const TriangleQuadrature& observer,
                                                        const TriangleQuadrature& source, Real k);

/// The pair's integrals by the 6 × 6 product rule, as a distant pair gets them.
TrianglePairIntegrals triangle_pair_integrals_distant(const TriangleQuadrature& observer,
                                                      const TriangleQuadrature& source, Real k);

/// Most pairs the batched forms below take at once: a source triangle to each of a vector
/// register's eight lanes (AVX-512; two registers with AVX2).
constexpr int pair_batch_limit = 8;

/// out[l] = triangle_pair_integrals_by_points(observer, *sources[l], k) for l < count ≤
/// pair_batch_limit, the pairs side by side in the vector lanes (a fill's pairs mostly share
/// their observer with many others; one pair alone leaves seven lanes idle).
void triangle_pair_integrals_by_points(const TriangleQuadrature& observer, const TriangleQuadrature* const* sources,
                                       int count, Real k, TrianglePairIntegrals* out);

/// out[l] = triangle_pair_integrals_distant(observer, *sources[l], k), as above.
void triangle_pair_integrals_distant(const TriangleQuadrature& observer, const TriangleQuadrature* const* sources,
                                     int count, Real k, TrianglePairIntegrals* out);

/// The static part of a near pair at each of P's points x_a: ∫_Q 1/R dS' (m) and
/// ∫_Q r'/R dS' (m²), in closed form (Wilton et al. 1984). They do not depend on the
/// frequency, so a fill takes them from a table made once per mesh (FillGeometry).
struct StaticMoments {
  Real scalar = 0.0;
  Vec3 moment = Vec3::Zero();
};
using NearPairStatics = std::array<StaticMoments, TriangleQuadrature::points>;
NearPairStatics near_pair_statics(const TriangleQuadrature& observer, const TriangleQuadrature& source);

/// A near pair's integrals from its static part and the smooth (e^{−jkR} − 1)/R rest.
TrianglePairIntegrals triangle_pair_integrals_near(const TriangleQuadrature& observer,
                                                   const TriangleQuadrature& source, const NearPairStatics& statics,
                                                   Real k);

/// Near pairs (centroids closer than two triangle sizes) integrate the static 1/R part over
/// Q in closed form (Wilton et al. 1984) and the smooth (e^{−jkR} − 1)/R part, and the
/// outer integral over P, with the 7-point degree-5 rule; far pairs use 7 × 7 points and
/// distant pairs 6 × 6 (Dunavant 1985, degree 4), the phases evaluated in one vectorised
/// batch.
TrianglePairIntegrals triangle_pair_integrals(const TriangleQuadrature& observer, const TriangleQuadrature& source,
                                              Real k);

}  // namespace lobe
