#include "solver/slab_pair_remainders.hpp"

#include <array>

namespace lobe {
namespace {

/// A triangle's points and weights (× area) by one rule.
struct RulePoints {
  int count = 0;
  std::array<Vec3, TriangleQuadrature::points> x;
  std::array<Real, TriangleQuadrature::points> w;
};

RulePoints seven_points(const TriangleQuadrature& t) {
  RulePoints r;
  r.count = TriangleQuadrature::points;
  r.x = t.x;
  r.w = t.w;
  return r;
}

RulePoints distant_points(const TriangleQuadrature& t) {
  RulePoints r;
  r.count = t.distant.points;
  for (int b = 0; b < r.count; ++b) {
    r.x[b] = Vec3(t.distant.x[b], t.distant.y[b], t.distant.z[b]);
    r.w[b] = t.distant.w[b];
  }
  return r;
}

}  // namespace

TrianglePairIntegrals slab_remainder_integrals(const SlabKernelTable& table, const TriangleQuadrature& p,
                                               const TriangleQuadrature& q) {
  const bool distant = triangle_pair_is_distant(p, q);
  const RulePoints a_points = distant ? distant_points(p) : seven_points(p);
  const RulePoints b_points = distant ? distant_points(q) : seven_points(q);
  const int na = a_points.count, nb = b_points.count;
  // With S = Σ w R, S_x = Σ w R x, S_y = Σ w R y and S_xy = Σ w R x·y over the point pairs,
  // (x − p_i)·(y − q_j) sums to S_xy − S_x·q_j − p_i·S_y + (p_i·q_j) S.
  constexpr int most = TriangleQuadrature::points * TriangleQuadrature::points;
  Real distance[most] = {};
  SlabRemainders remainders[most];
  for (int a = 0; a < na; ++a)
    for (int b = 0; b < nb; ++b) distance[a * nb + b] = (a_points.x[a] - b_points.x[b]).norm();
  table.remainders(distance, na * nb, remainders);
  Complex s = 0.0, s_vector = 0.0, s_xy = 0.0;
  Eigen::Vector3cd s_x = Eigen::Vector3cd::Zero(), s_y = Eigen::Vector3cd::Zero();
  for (int a = 0; a < na; ++a)
    for (int b = 0; b < nb; ++b) {
      const SlabRemainders& r = remainders[a * nb + b];
      const Real w = a_points.w[a] * b_points.w[b];
      s += w * r.scalar;
      const Complex v = w * r.vector;
      s_vector += v;
      s_x += v * a_points.x[a].cast<Complex>();
      s_y += v * b_points.x[b].cast<Complex>();
      s_xy += v * a_points.x[a].dot(b_points.x[b]);
    }
  TrianglePairIntegrals integrals;
  integrals.scalar = s;
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j)
      // Eigen's dot conjugates its left side: keep the real vector there.
      integrals.vector(i, j) = s_xy - q.corners[j].cast<Complex>().dot(s_x) - p.corners[i].cast<Complex>().dot(s_y) +
                               p.corners[i].dot(q.corners[j]) * s_vector;
  return integrals;
}

}  // namespace lobe
