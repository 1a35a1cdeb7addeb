#pragma once
/// Integrals of the free-space Green's function over a pair of triangles, for RWG fills.
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

/// Near pairs (centroids closer than two triangle sizes) integrate the static 1/R part over
/// Q in closed form (Wilton et al. 1984) and the smooth (e^{−jkR} − 1)/R part, and the
/// outer integral over P, with the 7-point degree-5 rule; far pairs use 7 × 7 points.
TrianglePairIntegrals triangle_pair_integrals(const SurfaceMesh& mesh, int observer, int source, Real k);

}  // namespace lobe
