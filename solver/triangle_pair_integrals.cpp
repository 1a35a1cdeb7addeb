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

  /// The sums from their real and imaginary parts, each times G's 1/(4π).
  static PairSums scaled_by_green(Real d_re, Real d_im, Real a_re, Real a_im, const Real* b_re, const Real* b_im,
                                  const Real* c_re, const Real* c_im) {
    PairSums sums;
    sums.d = green_scale * Complex(d_re, d_im);
    sums.a = green_scale * Complex(a_re, a_im);
    for (int i = 0; i < 3; ++i) {
      sums.b(i) = green_scale * Complex(b_re[i], b_im[i]);
      sums.c(i) = green_scale * Complex(c_re[i], c_im[i]);
    }
    return sums;
  }

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
  constexpr int distant_points = TriangleQuadrature::distant_points;
  LOBE_CHECK(static_cast<int>(distant.points.size()) == distant_points, "distant-pair rule of the wrong size");
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
    for (int b = 0; b < TriangleQuadrature::lanes; ++b) {
      const int point = b < n ? b : 0;
      q.lane_x[b] = q.x[point].x();
      q.lane_y[b] = q.x[point].y();
      q.lane_z[b] = q.x[point].z();
      q.lane_w[b] = b < n ? q.w[b] : 0.0;
    }
    for (int b = 0; b < TriangleQuadrature::lanes; ++b) {
      const int i = b < distant_points ? b : 0;
      const auto& c = distant.points[i];
      const Vec3 y = c[0] * q.corners[0] + c[1] * q.corners[1] + c[2] * q.corners[2];
      q.distant_x[b] = y.x(), q.distant_y[b] = y.y(), q.distant_z[b] = y.z();
      q.distant_w[b] = b < distant_points ? distant.weights[i] * q.area : 0.0;
    }
  }
  return all;
}

bool triangle_pair_is_near(const TriangleQuadrature& p, const TriangleQuadrature& q) {
  return (p.centroid - q.centroid).norm() < near_distance_in_sizes * std::max(p.size, q.size);
}

bool triangle_pair_is_distant(const TriangleQuadrature& p, const TriangleQuadrature& q) {
  return (p.centroid - q.centroid).norm() >= distant_distance_in_sizes * std::max(p.size, q.size);
}

__attribute__((target_clones("avx512f", "avx2", "default"))) TrianglePairIntegrals triangle_pair_integrals_distant(
    const TriangleQuadrature& p, const TriangleQuadrature& q, Real k) {
  // P's points x_a in the lanes, Q's points y_b one at a time, g_ab = w_a w_b G(|x_a − y_b|).
  // Per lane, S_a = Σ_b g_ab and T_a = Σ_b g_ab y_b; then D = Σ_a S_a, B = Σ_a S_a x_a,
  // C = Σ_a T_a and A = Σ_a x_a·T_a.
  constexpr int lanes = TriangleQuadrature::lanes, points = TriangleQuadrature::distant_points;
  alignas(64) Real distance[points * lanes], phase[points * lanes], sine[points * lanes], cosine[points * lanes];
  for (int b = 0; b < points; ++b) {
    const Real yx = q.distant_x[b], yy = q.distant_y[b], yz = q.distant_z[b];
#pragma omp simd
    for (int a = 0; a < lanes; ++a) {
      const Real dx = p.distant_x[a] - yx, dy = p.distant_y[a] - yy, dz = p.distant_z[a] - yz;
      distance[b * lanes + a] = std::sqrt(dx * dx + dy * dy + dz * dz);
      phase[b * lanes + a] = k * distance[b * lanes + a];
    }
  }
  sine_cosine(phase, sine, cosine, points * lanes);
  alignas(64) Real s_re[lanes] = {}, s_im[lanes] = {}, t_re[3][lanes] = {}, t_im[3][lanes] = {};
  for (int b = 0; b < points; ++b) {
    const Real w = q.distant_w[b], yx = q.distant_x[b], yy = q.distant_y[b], yz = q.distant_z[b];
#pragma omp simd
    for (int a = 0; a < lanes; ++a) {
      const Real g = w * p.distant_w[a] / distance[b * lanes + a];
      const Real g_re = g * cosine[b * lanes + a], g_im = -g * sine[b * lanes + a];
      s_re[a] += g_re, s_im[a] += g_im;
      t_re[0][a] += yx * g_re, t_im[0][a] += yx * g_im;
      t_re[1][a] += yy * g_re, t_im[1][a] += yy * g_im;
      t_re[2][a] += yz * g_re, t_im[2][a] += yz * g_im;
    }
  }
  Real d_re = 0, d_im = 0, a_re = 0, a_im = 0, b_re[3] = {}, b_im[3] = {}, c_re[3] = {}, c_im[3] = {};
  const Real* x[3] = {p.distant_x.data(), p.distant_y.data(), p.distant_z.data()};
  for (int a = 0; a < lanes; ++a) {
    d_re += s_re[a], d_im += s_im[a];
    for (int i = 0; i < 3; ++i) {
      b_re[i] += x[i][a] * s_re[a], b_im[i] += x[i][a] * s_im[a];
      c_re[i] += t_re[i][a], c_im[i] += t_im[i][a];
      a_re += x[i][a] * t_re[i][a], a_im += x[i][a] * t_im[i][a];
    }
  }
  return PairSums::scaled_by_green(d_re, d_im, a_re, a_im, b_re, b_im, c_re, c_im).integrals(p, q);
}

// Compiled also for AVX-512 and AVX2 (chosen by CPU features at start-up), as the far
// pairs are most of a surface fill.
__attribute__((target_clones("avx512f", "avx2", "default"))) TrianglePairIntegrals triangle_pair_integrals_by_points(
    const TriangleQuadrature& p, const TriangleQuadrature& q, Real k) {
  // Every loop runs over Q's points in the eight lanes, so that it compiles to whole-
  // register operations: the distances, the 56 phases' sines and cosines in one call,
  // then, with u_a = w_a of P's points x_a and G_ab the kernel times Q's weight,
  //   W_b = Σ_a u_a G_ab  and  V_b = Σ_a u_a x_a G_ab,
  // from which PairSums' four sums follow as D = Σ_b W_b, C = Σ_b W_b y_b, B = Σ_b V_b and
  // A = Σ_b y_b·V_b, y_b being Q's points.
  constexpr int lanes = TriangleQuadrature::lanes;
  alignas(64) Real distance[n * lanes], phase[n * lanes], sine[n * lanes], cosine[n * lanes];
  for (int a = 0; a < n; ++a) {
#pragma omp simd
    for (int b = 0; b < lanes; ++b) {
      const Real dx = p.x[a].x() - q.lane_x[b], dy = p.x[a].y() - q.lane_y[b], dz = p.x[a].z() - q.lane_z[b];
      distance[a * lanes + b] = std::sqrt(dx * dx + dy * dy + dz * dz);
      phase[a * lanes + b] = k * distance[a * lanes + b];
    }
  }
  sine_cosine(phase, sine, cosine, n * lanes);
  alignas(64) Real w_re[lanes] = {}, w_im[lanes] = {}, v_re[3][lanes] = {}, v_im[3][lanes] = {};
  for (int a = 0; a < n; ++a) {
    const Real u = p.w[a], ux = u * p.x[a].x(), uy = u * p.x[a].y(), uz = u * p.x[a].z();
#pragma omp simd
    for (int b = 0; b < lanes; ++b) {
      const Real g = q.lane_w[b] / distance[a * lanes + b];
      const Real g_re = g * cosine[a * lanes + b], g_im = -g * sine[a * lanes + b];
      w_re[b] += u * g_re;
      w_im[b] += u * g_im;
      v_re[0][b] += ux * g_re;
      v_im[0][b] += ux * g_im;
      v_re[1][b] += uy * g_re;
      v_im[1][b] += uy * g_im;
      v_re[2][b] += uz * g_re;
      v_im[2][b] += uz * g_im;
    }
  }
  Real d_re = 0.0, d_im = 0.0, a_re = 0.0, a_im = 0.0;
  Real b_re[3] = {}, b_im[3] = {}, c_re[3] = {}, c_im[3] = {};
  const Real* y[3] = {q.lane_x.data(), q.lane_y.data(), q.lane_z.data()};
  for (int b = 0; b < lanes; ++b) {
    d_re += w_re[b];
    d_im += w_im[b];
    for (int i = 0; i < 3; ++i) {
      c_re[i] += w_re[b] * y[i][b];
      c_im[i] += w_im[b] * y[i][b];
      b_re[i] += v_re[i][b];
      b_im[i] += v_im[i][b];
      a_re += y[i][b] * v_re[i][b];
      a_im += y[i][b] * v_im[i][b];
    }
  }
  return PairSums::scaled_by_green(d_re, d_im, a_re, a_im, b_re, b_im, c_re, c_im).integrals(p, q);
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
