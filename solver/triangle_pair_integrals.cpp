#include "solver/triangle_pair_integrals.hpp"

#include <algorithm>
#include <cmath>

#include "core/check.hpp"
#include "core/constants.hpp"
#include "core/vector_clones.hpp"
#include "solver/green_function.hpp"
#include "solver/phase_factor.hpp"
#include "solver/triangle_potentials.hpp"
#include "solver/triangle_rules.hpp"

namespace lobe {
namespace {

constexpr int n = TriangleQuadrature::points;

/// A pair's integrals from four sums over P's points x_a (weights w_a), with S_a = ∫_Q G
/// and M_a = ∫_Q G r' at x_a:  D = Σ w_a S_a,  B = Σ w_a S_a x_a,  C = Σ w_a M_a,
/// A = Σ w_a x_a·M_a.  Then
///   vector(i, j) = Σ_a w_a (x_a − p_i)·(M_a − q_j S_a) = A − q_j·B − p_i·C + (p_i·q_j) D,
/// four sums per point instead of nine dot products (the outer integral had been a fifth
/// of the fill's time).
struct PairSums {
  Complex a = 0.0, d = 0.0;
  Eigen::Vector3cd b = Eigen::Vector3cd::Zero(), c = Eigen::Vector3cd::Zero();

  void add(const Vec3& x, Real w, Complex scalar, const Eigen::Vector3cd& moment) {
    d += w * scalar;
    b += (w * scalar) * x.cast<Complex>();
    c += w * moment;
    a += w * (x.x() * moment.x() + x.y() * moment.y() + x.z() * moment.z());
  }

  TrianglePairIntegrals integrals(const TriangleQuadrature& p, const TriangleQuadrature& q) const {
    const auto dot = [](const Vec3& r, const Eigen::Vector3cd& v) { return r.x() * v.x() + r.y() * v.y() + r.z() * v.z(); };
    TrianglePairIntegrals result;
    result.scalar = d;
    for (int i = 0; i < 3; ++i)
      for (int j = 0; j < 3; ++j)
        result.vector(i, j) = a - dot(q.corners[j], b) - dot(p.corners[i], c) + p.corners[i].dot(q.corners[j]) * d;
    return result;
  }
};

/// ∫_Q 1/R dS' and ∫_Q r'/R dS' at r, in closed form (Wilton et al. 1984).
StaticMoments static_moments(const Vec3& r, const Vec3& q0, const Vec3& q1, const Vec3& q2) {
  const StaticPotentials s = triangle_static_potentials(r, q0, q1, q2);
  const Vec3 normal = (q1 - q0).cross(q2 - q0).normalized();
  const Vec3 rho = r - normal.dot(r - q0) * normal;
  return {s.scalar, s.vector + rho * s.scalar};  // ∫ r'/R = ∫ (r' − ρ)/R + ρ ∫ 1/R
}

/// `rule`'s points on triangle q by coordinate.
PointLanes point_lanes(const TriangleRule& rule, const TriangleQuadrature& q) {
  PointLanes l;
  l.points = static_cast<int>(rule.points.size());
  LOBE_CHECK(l.points <= PointLanes::capacity, "a far-pair rule with more points than PointLanes holds");
  for (int b = 0; b < l.points; ++b) {
    const auto& c = rule.points[b];
    const Vec3 y = c[0] * q.corners[0] + c[1] * q.corners[1] + c[2] * q.corners[2];
    l.x[b] = y.x(), l.y[b] = y.y(), l.z[b] = y.z();
    l.w[b] = rule.weights[b] * q.area;
  }
  return l;
}

/// Eight source triangles' points by one rule, a triangle to a vector lane: x[b][l] is
/// point b of source l, corner[j][c][l] coordinate c of its corner j.
template <int points>
struct SourceLanes {
  static constexpr int lanes = pair_batch_limit;
  alignas(64) Real x[points][lanes], y[points][lanes], z[points][lanes], w[points][lanes];
  alignas(64) Real corner[3][3][lanes];
};

/// The integrals of up to eight pairs sharing the observer P, by the product of one rule
/// (`rule` picks it from the triangles' quadrature data): each vector lane holds one source
/// triangle Q, and P's points x_a come one at a time, so that every lane does useful work
/// (with P's points in the lanes instead, six points filled eight lanes, and each pair's
/// sums ended in a reduction across the lanes). g_ab = w_a w_b G(|x_a − y_b|); per P point,
/// S_a = Σ_b g_ab and T_a = Σ_b g_ab y_b; then PairSums' D = Σ_a S_a, B = Σ_a S_a x_a,
/// C = Σ_a T_a and A = Σ_a x_a·T_a, and the nine vector integrals from them as in
/// PairSums::integrals, all lanes at once (pair by pair, that step took a fifth of the
/// distant pairs' time). Always inlined, so that each CPU-feature clone of its callers
/// compiles it for its own registers; the point count is a template argument, so that the
/// loops unroll.
template <int points>
[[gnu::always_inline]] inline void pair_integrals_in_lanes(const TriangleQuadrature& observer,
                                                            const TriangleQuadrature* const* sources, int count,
                                                            PointLanes TriangleQuadrature::*rule, Real k,
                                                            TrianglePairIntegrals* out) {
  constexpr int lanes = pair_batch_limit;
  LOBE_ASSERT(count >= 1 && count <= lanes);
  const PointLanes& p = observer.*rule;
  LOBE_ASSERT(p.points == points);
  SourceLanes<points> q;
  for (int l = 0; l < lanes; ++l) {
    const TriangleQuadrature& source = *sources[l < count ? l : 0];  // spare lanes repeat the first
    const PointLanes& y = source.*rule;
    for (int b = 0; b < points; ++b) q.x[b][l] = y.x[b], q.y[b][l] = y.y[b], q.z[b][l] = y.z[b], q.w[b][l] = y.w[b];
    for (int j = 0; j < 3; ++j)
      for (int c = 0; c < 3; ++c) q.corner[j][c][l] = source.corners[j](c);
  }
  alignas(64) Real d_re[lanes] = {}, d_im[lanes] = {}, a_re[lanes] = {}, a_im[lanes] = {};
  alignas(64) Real b_re[3][lanes] = {}, b_im[3][lanes] = {}, c_re[3][lanes] = {}, c_im[3][lanes] = {};
  for (int a = 0; a < points; ++a) {
    const Real x[3] = {p.x[a], p.y[a], p.z[a]}, w = p.w[a];
    alignas(64) Real s_re[lanes] = {}, s_im[lanes] = {}, t_re[3][lanes] = {}, t_im[3][lanes] = {};
    for (int b = 0; b < points; ++b) {
#pragma omp simd
      for (int l = 0; l < lanes; ++l) {
        const Real dx = x[0] - q.x[b][l], dy = x[1] - q.y[b][l], dz = x[2] - q.z[b][l];
        const Real distance = std::sqrt(dx * dx + dy * dy + dz * dz);
        Real sine, cosine;
        sine_cosine_of(k * distance, sine, cosine);
        const Real g = w * q.w[b][l] / distance;
        const Real g_re = g * cosine, g_im = -g * sine;
        s_re[l] += g_re, s_im[l] += g_im;
        t_re[0][l] += q.x[b][l] * g_re, t_im[0][l] += q.x[b][l] * g_im;
        t_re[1][l] += q.y[b][l] * g_re, t_im[1][l] += q.y[b][l] * g_im;
        t_re[2][l] += q.z[b][l] * g_re, t_im[2][l] += q.z[b][l] * g_im;
      }
    }
#pragma omp simd
    for (int l = 0; l < lanes; ++l) {
      d_re[l] += s_re[l], d_im[l] += s_im[l];
      for (int i = 0; i < 3; ++i) {
        b_re[i][l] += x[i] * s_re[l], b_im[i][l] += x[i] * s_im[l];
        c_re[i][l] += t_re[i][l], c_im[i][l] += t_im[i][l];
        a_re[l] += x[i] * t_re[i][l], a_im[l] += x[i] * t_im[i][l];
      }
    }
  }
  // vector(i, j) = A − q_j·B − p_i·C + (p_i·q_j) D.
  alignas(64) Real v_re[3][3][lanes], v_im[3][3][lanes];
  for (int i = 0; i < 3; ++i) {
    const Vec3& corner = observer.corners[i];
    for (int j = 0; j < 3; ++j) {
#pragma omp simd
      for (int l = 0; l < lanes; ++l) {
        Real qb_re = 0, qb_im = 0, pc_re = 0, pc_im = 0, pq = 0;
        for (int c = 0; c < 3; ++c) {
          qb_re += q.corner[j][c][l] * b_re[c][l], qb_im += q.corner[j][c][l] * b_im[c][l];
          pc_re += corner(c) * c_re[c][l], pc_im += corner(c) * c_im[c][l];
          pq += corner(c) * q.corner[j][c][l];
        }
        v_re[i][j][l] = a_re[l] - qb_re - pc_re + pq * d_re[l];
        v_im[i][j][l] = a_im[l] - qb_im - pc_im + pq * d_im[l];
      }
    }
  }
  for (int l = 0; l < count; ++l) {
    out[l].scalar = green_scale * Complex(d_re[l], d_im[l]);
    for (int i = 0; i < 3; ++i)
      for (int j = 0; j < 3; ++j) out[l].vector(i, j) = green_scale * Complex(v_re[i][j][l], v_im[i][j][l]);
  }
}

/// One pair through a batched routine: a batch of one.
using PairBatch = void (*)(const TriangleQuadrature&, const TriangleQuadrature* const*, int, Real,
                           TrianglePairIntegrals*);
TrianglePairIntegrals one_pair(PairBatch batch, const TriangleQuadrature& p, const TriangleQuadrature& q, Real k) {
  const TriangleQuadrature* source = &q;
  TrianglePairIntegrals result;
  batch(p, &source, 1, k, &result);
  return result;
}

}  // namespace

PointPotentials triangle_point_potentials(const Vec3& r, const Vec3& q0, const Vec3& q1, const Vec3& q2, Real area,
                                          Real k, bool near) {
  const TriangleRule& rule = triangle_rule_degree5();
  PointPotentials result;
  if (near) {
    const StaticMoments s = static_moments(r, q0, q1, q2);
    result.scalar += s.scalar;
    result.moment += s.moment.cast<Complex>();
  }
  // The seven kernels in one vectorised batch (one at a time, through the library's sincos,
  // they had been a fifth of a small wire-and-plate model's fill).
  std::array<Vec3, n> x;
  std::array<Real, n> distance, weight, kernel_re, kernel_im;
  for (int b = 0; b < n; ++b) {
    const auto& w = rule.points[b];
    x[b] = w[0] * q0 + w[1] * q1 + w[2] * q2;
    distance[b] = (r - x[b]).norm();
    weight[b] = rule.weights[b] * area;
  }
  if (near) {
    green_kernel_smooth_batch(k, distance.data(), weight.data(), kernel_re.data(), kernel_im.data(), n);
  } else {
    green_kernel_batch(k, distance.data(), weight.data(), kernel_re.data(), kernel_im.data(), n);
  }
  for (int b = 0; b < n; ++b) {
    const Complex g(kernel_re[b], kernel_im[b]);
    result.scalar += g;
    result.moment += g * x[b].cast<Complex>();
  }
  result.scalar *= green_scale;
  result.moment *= green_scale;
  return result;
}

std::vector<TriangleQuadrature> triangle_quadrature(const SurfaceMesh& mesh) {
  const TriangleRule& rule = triangle_rule_degree5();
  const TriangleRule& distant = triangle_rule_degree4();
  std::vector<TriangleQuadrature> all(mesh.triangles.size());
  for (std::size_t t = 0; t < all.size(); ++t) {
    TriangleQuadrature& q = all[t];
    const int ti = static_cast<int>(t);
    q.corners = {mesh.corner(ti, 0), mesh.corner(ti, 1), mesh.corner(ti, 2)};
    q.area = mesh.area(ti);
    q.size = std::max({(q.corners[1] - q.corners[0]).norm(), (q.corners[2] - q.corners[1]).norm(),
                       (q.corners[0] - q.corners[2]).norm()});
    q.centroid = mesh.centroid(ti);
    for (int a = 0; a < n; ++a) {
      const auto& b = rule.points[a];
      q.x[a] = b[0] * q.corners[0] + b[1] * q.corners[1] + b[2] * q.corners[2];
      q.w[a] = rule.weights[a] * q.area;
    }
    q.far = point_lanes(rule, q);
    q.distant = point_lanes(distant, q);
  }
  return all;
}

// Compiled also for wider vectors (core/vector_clones.hpp), as the far pairs are most of a
// surface fill.
LOBE_VECTOR_CLONES void triangle_pair_integrals_distant(
    const TriangleQuadrature& observer, const TriangleQuadrature* const* sources, int count, Real k,
    TrianglePairIntegrals* out) {
  pair_integrals_in_lanes<6>(observer, sources, count, &TriangleQuadrature::distant, k, out);
}

LOBE_VECTOR_CLONES void triangle_pair_integrals_by_points(
    const TriangleQuadrature& observer, const TriangleQuadrature* const* sources, int count, Real k,
    TrianglePairIntegrals* out) {
  pair_integrals_in_lanes<TriangleQuadrature::points>(observer, sources, count, &TriangleQuadrature::far, k, out);
}

TrianglePairIntegrals triangle_pair_integrals_distant(const TriangleQuadrature& p, const TriangleQuadrature& q,
                                                      Real k) {
  return one_pair(triangle_pair_integrals_distant, p, q, k);
}

TrianglePairIntegrals triangle_pair_integrals_by_points(const TriangleQuadrature& p, const TriangleQuadrature& q,
                                                        Real k) {
  return one_pair(triangle_pair_integrals_by_points, p, q, k);
}

NearPairStatics near_pair_statics(const TriangleQuadrature& p, const TriangleQuadrature& q) {
  NearPairStatics statics;
  for (int a = 0; a < n; ++a) statics[a] = static_moments(p.x[a], q.corners[0], q.corners[1], q.corners[2]);
  return statics;
}

TrianglePairIntegrals triangle_pair_integrals_near(const TriangleQuadrature& p, const TriangleQuadrature& q,
                                                   const NearPairStatics& statics, Real k) {
  // As triangle_point_potentials(near) at each of P's points: the static part in closed
  // form, the smooth rest by Q's 7 points, here all 49 smooth kernels in one batch.
  std::array<Real, n * n> distance, weight, smooth_re, smooth_im;
  for (int a = 0; a < n; ++a)
    for (int b = 0; b < n; ++b) {
      distance[a * n + b] = (p.x[a] - q.x[b]).norm();
      weight[a * n + b] = q.w[b];
    }
  green_kernel_smooth_batch(k, distance.data(), weight.data(), smooth_re.data(), smooth_im.data(), n * n);
  PairSums sums;
  for (int a = 0; a < n; ++a) {
    Complex scalar = statics[a].scalar;
    Eigen::Vector3cd moment = statics[a].moment.cast<Complex>();
    for (int b = 0; b < n; ++b) {
      const Complex g(smooth_re[a * n + b], smooth_im[a * n + b]);
      scalar += g;
      moment += g * q.x[b].cast<Complex>();
    }
    sums.add(p.x[a], p.w[a], green_scale * scalar, green_scale * moment);
  }
  return sums.integrals(p, q);
}

TrianglePairIntegrals triangle_pair_integrals(const TriangleQuadrature& p, const TriangleQuadrature& q, Real k) {
  if (triangle_pair_is_distant(p, q)) return triangle_pair_integrals_distant(p, q, k);
  if (!triangle_pair_is_near(p, q)) return triangle_pair_integrals_by_points(p, q, k);
  return triangle_pair_integrals_near(p, q, near_pair_statics(p, q), k);
}

}  // namespace lobe
