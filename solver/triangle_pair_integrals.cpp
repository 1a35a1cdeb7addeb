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

TrianglePairIntegrals triangle_pair_integrals(const SurfaceMesh& mesh, int observer, int source, Real k) {
  const Triangle p = triangle_of(mesh, observer), q = triangle_of(mesh, source);
  const TriangleRule& rule = triangle_rule_degree5();
  const std::size_t n = rule.points.size();
  const Real distance = ((p.corners[0] + p.corners[1] + p.corners[2]) - (q.corners[0] + q.corners[1] + q.corners[2])).norm() / 3.0;
  const bool near = distance < near_distance_in_sizes * std::max(p.size(), q.size());
  TrianglePairIntegrals result;
  for (std::size_t a = 0; a < n; ++a) {
    const Vec3 r = p.point(rule.points[a]);
    const Real wa = rule.weights[a] * p.area;
    // Inner integrals over Q at r: ∫ G dS' and ∫ G (r' − q_j) dS' for each corner j.
    Complex inner_scalar = 0.0;
    Eigen::Vector3cd inner_moment = Eigen::Vector3cd::Zero();  // ∫ G r' dS'
    if (near) {
      const StaticPotentials s = triangle_static_potentials(r, q.corners[0], q.corners[1], q.corners[2]);
      const Vec3 normal = (q.corners[1] - q.corners[0]).cross(q.corners[2] - q.corners[0]).normalized();
      const Vec3 rho = r - normal.dot(r - q.corners[0]) * normal;
      inner_scalar += s.scalar;
      inner_moment += (s.vector + rho * s.scalar).cast<Complex>();  // ∫ r'/R = ∫ (r' − ρ)/R + ρ ∫ 1/R
      for (std::size_t b = 0; b < n; ++b) {
        const Vec3 x = q.point(rule.points[b]);
        const Complex g = rule.weights[b] * q.area * smooth_kernel(k, (r - x).norm());
        inner_scalar += g;
        inner_moment += g * x.cast<Complex>();
      }
    } else {
      for (std::size_t b = 0; b < n; ++b) {
        const Vec3 x = q.point(rule.points[b]);
        const Real distance_ab = (r - x).norm();
        const Complex g = rule.weights[b] * q.area * std::polar(1.0 / distance_ab, -k * distance_ab);
        inner_scalar += g;
        inner_moment += g * x.cast<Complex>();
      }
    }
    inner_scalar /= 4 * pi;
    inner_moment /= 4 * pi;
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
