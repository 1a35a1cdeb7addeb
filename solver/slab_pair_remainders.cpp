#include "solver/slab_pair_remainders.hpp"

#include <cmath>

#include "core/vector_clones.hpp"

namespace lobe {
namespace {

/// A pair's point pairs by flattened index t: observer point x, source point y, weight.
struct PointPairs {
  static constexpr int most = TriangleQuadrature::points * TriangleQuadrature::points;
  alignas(64) Real x[3][most], y[3][most], w[most], distance[most];
};

/// With R the remainders at the point pairs: S = Σ w R_V, and with v = w R_A, V = Σ v,
/// S_x = Σ v x, S_y = Σ v y and S_xy = Σ v x·y, as real and imaginary parts, summed in
/// vector lanes.
struct RemainderSums {
  Real s_re = 0, s_im = 0, v_re = 0, v_im = 0, xy_re = 0, xy_im = 0;
  Real x_re[3] = {}, x_im[3] = {}, y_re[3] = {}, y_im[3] = {};
};

/// The point pairs' distances, in vector lanes.
LOBE_VECTOR_CLONES void measure_distances(PointPairs& pairs, int count) {
#pragma omp simd
  for (int t = 0; t < count; ++t) {
    const Real dx = pairs.x[0][t] - pairs.y[0][t], dy = pairs.x[1][t] - pairs.y[1][t], dz = pairs.x[2][t] - pairs.y[2][t];
    pairs.distance[t] = std::sqrt(dx * dx + dy * dy + dz * dz);
  }
}

LOBE_VECTOR_CLONES RemainderSums sum_remainders(const PointPairs& pairs, const SlabKernelTable::Parts& r, int count) {
  Real s_re = 0, s_im = 0, v_re = 0, v_im = 0, xy_re = 0, xy_im = 0;
  Real x0_re = 0, x0_im = 0, x1_re = 0, x1_im = 0, x2_re = 0, x2_im = 0;
  Real y0_re = 0, y0_im = 0, y1_re = 0, y1_im = 0, y2_re = 0, y2_im = 0;
#pragma omp simd reduction(+ : s_re, s_im, v_re, v_im, xy_re, xy_im, x0_re, x0_im, x1_re, x1_im, x2_re, x2_im, \
                               y0_re, y0_im, y1_re, y1_im, y2_re, y2_im)
  for (int t = 0; t < count; ++t) {
    const Real w = pairs.w[t];
    s_re += w * r.scalar_re[t], s_im += w * r.scalar_im[t];
    const Real a_re = w * r.vector_re[t], a_im = w * r.vector_im[t];
    v_re += a_re, v_im += a_im;
    const Real x0 = pairs.x[0][t], x1 = pairs.x[1][t], x2 = pairs.x[2][t];
    const Real y0 = pairs.y[0][t], y1 = pairs.y[1][t], y2 = pairs.y[2][t];
    x0_re += a_re * x0, x0_im += a_im * x0, x1_re += a_re * x1, x1_im += a_im * x1, x2_re += a_re * x2, x2_im += a_im * x2;
    y0_re += a_re * y0, y0_im += a_im * y0, y1_re += a_re * y1, y1_im += a_im * y1, y2_re += a_re * y2, y2_im += a_im * y2;
    const Real xy = x0 * y0 + x1 * y1 + x2 * y2;
    xy_re += a_re * xy, xy_im += a_im * xy;
  }
  return {s_re, s_im, v_re, v_im, xy_re, xy_im, {x0_re, x1_re, x2_re}, {x0_im, x1_im, x2_im}, {y0_re, y1_re, y2_re},
          {y0_im, y1_im, y2_im}};
}

}  // namespace

TrianglePairIntegrals slab_remainder_integrals(const SlabKernelTable& table, const TriangleQuadrature& p,
                                               const TriangleQuadrature& q) {
  const bool distant = triangle_pair_is_distant(p, q);
  const PointLanes& a_points = distant ? p.distant : p.far;
  const PointLanes& b_points = distant ? q.distant : q.far;
  const int na = a_points.points, nb = b_points.points, count = na * nb;
  PointPairs pairs;
  for (int a = 0; a < na; ++a)
    for (int b = 0; b < nb; ++b) {
      const int t = a * nb + b;
      pairs.x[0][t] = a_points.x[a], pairs.x[1][t] = a_points.y[a], pairs.x[2][t] = a_points.z[a];
      pairs.y[0][t] = b_points.x[b], pairs.y[1][t] = b_points.y[b], pairs.y[2][t] = b_points.z[b];
      pairs.w[t] = a_points.w[a] * b_points.w[b];
    }
  measure_distances(pairs, count);
  SlabKernelTable::Parts remainders;
  table.remainders(pairs.distance, count, remainders);
  const RemainderSums sums = sum_remainders(pairs, remainders, count);
  const Complex s(sums.s_re, sums.s_im), s_vector(sums.v_re, sums.v_im), s_xy(sums.xy_re, sums.xy_im);
  const Eigen::Vector3cd s_x(Complex(sums.x_re[0], sums.x_im[0]), Complex(sums.x_re[1], sums.x_im[1]),
                             Complex(sums.x_re[2], sums.x_im[2]));
  const Eigen::Vector3cd s_y(Complex(sums.y_re[0], sums.y_im[0]), Complex(sums.y_re[1], sums.y_im[1]),
                             Complex(sums.y_re[2], sums.y_im[2]));
  // (x − p_i)·(y − q_j) sums to S_xy − S_x·q_j − p_i·S_y + (p_i·q_j) S.
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
