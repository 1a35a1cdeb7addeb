#pragma once
/// Closed-form static potential integrals over a flat triangle, for the singular part of
/// surface (RWG) moment-method integrals.
#include "core/types.hpp"

namespace lobe {

/// ∫_T 1/R dS' and ∫_T (r' − r_p)/R dS', R = |r − r'|, over triangle (v0, v1, v2), where r_p
/// is r projected onto the triangle's plane. Units m and m².
struct StaticPotentials {
  Real scalar = 0.0;
  Vec3 vector = Vec3::Zero();
};

/// Wilton, Rao, Glisson, Schaubert, Al-Bundak & Butler, "Potential integrals for uniform
/// and linear source distributions on polygonal and polyhedral domains", IEEE Trans.
/// Antennas Propag. 32(3), 1984 (edge-by-edge sums; also Graglia 1993). Finite for r on
/// the triangle itself, including its edges and vertices.
StaticPotentials triangle_static_potentials(const Vec3& r, const Vec3& v0, const Vec3& v1, const Vec3& v2);

}  // namespace lobe
