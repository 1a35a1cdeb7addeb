#include "solver/triangle_pair_integrals.hpp"

#include <cmath>

#include "core/constants.hpp"
#include "solver/smooth_kernel.hpp"
#include "solver/triangle_potentials.hpp"
#include "solver/triangle_rules.hpp"

namespace lobe {
namespace {

/// A pair is near when its centroids are closer than this many of the larger triangle's
/// longest edges: 1/R then varies too fast over Q for seven points.
constexpr Real near_distance_in_sizes = 2.0;

struct Triangle {
  Vec3 corners[3];
  Real area;
  Vec3 point(const std::array<Real, 3>& b) const { return b[0] * corners[0] + b[1] * corners[1] + b[2] * corners[2]; }
  Real size() const {
    return std::max({(corners[1] - corners[0]).norm(), (corners[2] - corners[1]).norm(), (corners[0] - corners[2]).norm()});
  }
};

Triangle triangle_of(const SurfaceMesh& mesh, int t) {
  return {{mesh.corner(t, 0), mesh.corner(t, 1), mesh.corner(t, 2)}, mesh.area(t)};
}

}  // namespace

PointPotentials triangle_point_potentials(const Vec3& r, const Vec3& q0, const Vec3& q1, const Vec3& q2, Real area,
                                          Real k, bool near) {
  const TriangleRule& rule = triangle_rule_degree5();
  PointPotentials result;
  if (near) {
    const StaticPotentials s = triangle_static_potentials(r, q0, q1, q2);
    const Vec3 normal = (q1 - q0).cross(q2 - q0).normalized();
    const Vec3 rho = r - normal.dot(r - q0) * normal;
    result.scalar += s.scalar;
    result.moment += (s.vector + rho * s.scalar).cast<Complex>();  // ∫ r'/R = ∫ (r' − ρ)/R + ρ ∫ 1/R
  }
  for (std::size_t b = 0; b < rule.points.size(); ++b) {
    const auto& w = rule.points[b];
    const Vec3 x = w[0] * q0 + w[1] * q1 + w[2] * q2;
    const Real distance = (r - x).norm();
    const Complex g = rule.weights[b] * area * (near ? smooth_kernel(k, distance) : std::polar(1.0 / distance, -k * distance));
    result.scalar += g;
    result.moment += g * x.cast<Complex>();
  }
  result.scalar /= 4 * pi;
  result.moment /= 4 * pi;
  return result;
}

TrianglePairIntegrals triangle_pair_integrals(const SurfaceMesh& mesh, int observer, int source, Real k) {
  return triangle_pair_integrals(mesh, observer, mesh, source, k);
}

TrianglePairIntegrals triangle_pair_integrals(const SurfaceMesh& observers, int observer, const SurfaceMesh& sources,
                                              int source, Real k) {
  const Triangle p = triangle_of(observers, observer), q = triangle_of(sources, source);
  const TriangleRule& rule = triangle_rule_degree5();
  const std::size_t n = rule.points.size();
  const Real distance = ((p.corners[0] + p.corners[1] + p.corners[2]) - (q.corners[0] + q.corners[1] + q.corners[2])).norm() / 3.0;
  const bool near = distance < near_distance_in_sizes * std::max(p.size(), q.size());
  TrianglePairIntegrals result;
  for (std::size_t a = 0; a < n; ++a) {
    const Vec3 r = p.point(rule.points[a]);
    const Real wa = rule.weights[a] * p.area;
    const PointPotentials inner = triangle_point_potentials(r, q.corners[0], q.corners[1], q.corners[2], q.area, k, near);
    const Complex inner_scalar = inner.scalar;
    const Eigen::Vector3cd& inner_moment = inner.moment;
    result.scalar += wa * inner_scalar;
    for (int i = 0; i < 3; ++i) {
      const Vec3 from_corner = r - p.corners[i];
      for (int j = 0; j < 3; ++j) {
        // (r − p_i)·∫ G (r' − q_j) = (r − p_i)·(∫ G r' − q_j ∫ G)
        const Eigen::Vector3cd moment = inner_moment - q.corners[j].cast<Complex>() * inner_scalar;
        result.vector(i, j) += wa * from_corner.cast<Complex>().dot(moment);
      }
    }
  }
  return result;
}

}  // namespace lobe
