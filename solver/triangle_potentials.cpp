#include "solver/triangle_potentials.hpp"

#include <cmath>

namespace lobe {
namespace {

/// R + l without cancellation when l is negative: R + l = R0² / (R − l).
inline Real r_plus_l(Real r, Real l, Real r0_squared) { return l >= 0.0 ? r + l : r0_squared / (r - l); }

}  // namespace

StaticPotentials triangle_static_potentials(const Vec3& r, const Vec3& v0, const Vec3& v1, const Vec3& v2) {
  const Vec3 normal = (v1 - v0).cross(v2 - v0).normalized();
  const Real d = normal.dot(r - v0);
  const Real abs_d = std::abs(d);
  const Vec3 rho = r - d * normal;
  const Vec3 vertices[3] = {v0, v1, v2};
  const Real scale = (v1 - v0).norm() + (v2 - v1).norm() + (v0 - v2).norm();
  StaticPotentials result;
  for (int i = 0; i < 3; ++i) {
    const Vec3& a = vertices[i];
    const Vec3& b = vertices[(i + 1) % 3];
    const Vec3 edge = (b - a).normalized();
    const Vec3 outward = edge.cross(normal);  // in the plane, away from the triangle
    const Real l_plus = (b - rho).dot(edge), l_minus = (a - rho).dot(edge);
    const Real p0 = (a - rho).dot(outward);  // signed distance to the edge's line
    const Real r0_squared = p0 * p0 + d * d;
    const Real r_plus = std::sqrt(l_plus * l_plus + r0_squared), r_minus = std::sqrt(l_minus * l_minus + r0_squared);
    // Where the observer lies on the edge's line (R0 = 0) the logarithm's factor vanishes.
    const Real tiny = 1e-24 * scale * scale;
    Real log_term = 0.0;
    if (r0_squared > tiny)
      log_term = std::log(r_plus_l(r_plus, l_plus, r0_squared) / r_plus_l(r_minus, l_minus, r0_squared));
    Real angle_term = 0.0;
    if (abs_d > 0.0)
      angle_term = std::atan(p0 * l_plus / (r0_squared + abs_d * r_plus)) -
                   std::atan(p0 * l_minus / (r0_squared + abs_d * r_minus));
    result.scalar += p0 * log_term - abs_d * angle_term;
    result.vector += 0.5 * outward * (r0_squared * log_term + l_plus * r_plus - l_minus * r_minus);
  }
  return result;
}

}  // namespace lobe
