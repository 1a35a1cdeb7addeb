#include "solver/triangle_pair_integrals.hpp"

#include <algorithm>
#include <cmath>

#include "core/check.hpp"
#include "core/constants.hpp"
#include "solver/green_function.hpp"
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

/// `rule`'s points on triangle q as lanes.
PointLanes point_lanes(const TriangleRule& rule, const TriangleQuadrature& q) {
  PointLanes l;
  l.points = static_cast<int>(rule.points.size());
  LOBE_CHECK(l.points <= PointLanes::lanes, "a far-pair rule with more points than lanes");
  for (int b = 0; b < PointLanes::lanes; ++b) {
    const int i = b < l.points ? b : 0;
    const auto& c = rule.points[i];
    const Vec3 y = c[0] * q.corners[0] + c[1] * q.corners[1] + c[2] * q.corners[2];
    l.x[b] = y.x(), l.y[b] = y.y(), l.z[b] = y.z();
    l.w[b] = b < l.points ? rule.weights[i] * q.area : 0.0;
  }
  return l;
}

/// A far pair's integrals by the product of the rules behind `p` (observer) and `q`
/// (source): P's points x_a in the lanes, Q's points y_b one at a time,
/// g_ab = w_a w_b G(|x_a − y_b|). Per lane, S_a = Σ_b g_ab and T_a = Σ_b g_ab y_b; then
/// PairSums' D = Σ_a S_a, B = Σ_a S_a x_a, C = Σ_a T_a and A = Σ_a x_a·T_a. Always inlined,
/// so that each CPU-feature clone of its callers compiles it for its own registers; the
/// source's point count is a template argument, so that the loops unroll (as a run-time
/// bound they were 14 % slower).
template <int source_points>
[[gnu::always_inline]] inline TrianglePairIntegrals integrals_in_lanes(const TriangleQuadrature& observer,
                                                                         const TriangleQuadrature& source,
                                                                         const PointLanes& p, const PointLanes& q,
                                                                         Real k) {
  constexpr int lanes = PointLanes::lanes, count = source_points * lanes;
  LOBE_ASSERT(q.points == source_points);
  alignas(64) Real distance[count], phase[count], sine[count], cosine[count];
  for (int b = 0; b < source_points; ++b) {
#pragma omp simd
    for (int a = 0; a < lanes; ++a) {
      const Real dx = p.x[a] - q.x[b], dy = p.y[a] - q.y[b], dz = p.z[a] - q.z[b];
      distance[b * lanes + a] = std::sqrt(dx * dx + dy * dy + dz * dz);
      phase[b * lanes + a] = k * distance[b * lanes + a];
    }
  }
  sine_cosine(phase, sine, cosine, count);
  alignas(64) Real s_re[lanes] = {}, s_im[lanes] = {}, t_re[3][lanes] = {}, t_im[3][lanes] = {};
  for (int b = 0; b < source_points; ++b) {
    const Real w = q.w[b], yx = q.x[b], yy = q.y[b], yz = q.z[b];
#pragma omp simd
    for (int a = 0; a < lanes; ++a) {
      const Real g = w * p.w[a] / distance[b * lanes + a];
      const Real g_re = g * cosine[b * lanes + a], g_im = -g * sine[b * lanes + a];
      s_re[a] += g_re, s_im[a] += g_im;
      t_re[0][a] += yx * g_re, t_im[0][a] += yx * g_im;
      t_re[1][a] += yy * g_re, t_im[1][a] += yy * g_im;
      t_re[2][a] += yz * g_re, t_im[2][a] += yz * g_im;
    }
  }
  Real d_re = 0, d_im = 0, a_re = 0, a_im = 0, b_re[3] = {}, b_im[3] = {}, c_re[3] = {}, c_im[3] = {};
  const Real* x[3] = {p.x.data(), p.y.data(), p.z.data()};
  for (int a = 0; a < lanes; ++a) {
    d_re += s_re[a], d_im += s_im[a];
    for (int i = 0; i < 3; ++i) {
      b_re[i] += x[i][a] * s_re[a], b_im[i] += x[i][a] * s_im[a];
      c_re[i] += t_re[i][a], c_im[i] += t_im[i][a];
      a_re += x[i][a] * t_re[i][a], a_im += x[i][a] * t_im[i][a];
    }
  }
  PairSums sums;
  sums.d = green_scale * Complex(d_re, d_im);
  sums.a = green_scale * Complex(a_re, a_im);
  for (int i = 0; i < 3; ++i) {
    sums.b(i) = green_scale * Complex(b_re[i], b_im[i]);
    sums.c(i) = green_scale * Complex(c_re[i], c_im[i]);
  }
  return sums.integrals(observer, source);
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

bool triangle_pair_is_near(const TriangleQuadrature& p, const TriangleQuadrature& q) {
  return (p.centroid - q.centroid).norm() < near_distance_in_sizes * std::max(p.size, q.size);
}

bool triangle_pair_is_distant(const TriangleQuadrature& p, const TriangleQuadrature& q) {
  return (p.centroid - q.centroid).norm() >= distant_distance_in_sizes * std::max(p.size, q.size);
}

// Compiled also for AVX-512 and AVX2 (chosen by CPU features at start-up), as the far
// pairs are most of a surface fill.
__attribute__((target_clones("avx512f", "avx2", "default"))) TrianglePairIntegrals triangle_pair_integrals_distant(
    const TriangleQuadrature& p, const TriangleQuadrature& q, Real k) {
  return integrals_in_lanes<6>(p, q, p.distant, q.distant, k);
}

__attribute__((target_clones("avx512f", "avx2", "default"))) TrianglePairIntegrals triangle_pair_integrals_by_points(
    const TriangleQuadrature& p, const TriangleQuadrature& q, Real k) {
  return integrals_in_lanes<TriangleQuadrature::points>(p, q, p.far, q.far, k);
}

TrianglePairIntegrals triangle_pair_integrals(const TriangleQuadrature& p, const TriangleQuadrature& q, Real k) {
  if (triangle_pair_is_distant(p, q)) return triangle_pair_integrals_distant(p, q, k);
  if (!triangle_pair_is_near(p, q)) return triangle_pair_integrals_by_points(p, q, k);
  // As triangle_point_potentials(near) at each of P's points: the static part in closed
  // form, the smooth rest by Q's 7 points, here all 49 smooth kernels in one batch.
  std::array<Real, n * n> distance, weight, smooth_re, smooth_im;
  for (int a = 0; a < n; ++a)
    for (int b = 0; b < n; ++b) {
      distance[a * n + b] = (p.x[a] - q.x[b]).norm();
      weight[a * n + b] = q.w[b];
    }
  green_kernel_smooth_batch(k, distance.data(), weight.data(), smooth_re.data(), smooth_im.data(), n * n);
  const Vec3 normal = (q.corners[1] - q.corners[0]).cross(q.corners[2] - q.corners[0]).normalized();
  PairSums sums;
  for (int a = 0; a < n; ++a) {
    const StaticPotentials s = triangle_static_potentials(p.x[a], q.corners[0], q.corners[1], q.corners[2]);
    const Vec3 rho = p.x[a] - normal.dot(p.x[a] - q.corners[0]) * normal;
    Complex scalar = s.scalar;
    Eigen::Vector3cd moment = (s.vector + rho * s.scalar).cast<Complex>();  // ∫ r'/R = ∫ (r' − ρ)/R + ρ ∫ 1/R
    for (int b = 0; b < n; ++b) {
      const Complex g(smooth_re[a * n + b], smooth_im[a * n + b]);
      scalar += g;
      moment += g * q.x[b].cast<Complex>();
    }
    sums.add(p.x[a], p.w[a], green_scale * scalar, green_scale * moment);
  }
  return sums.integrals(p, q);
}

}  // namespace lobe
