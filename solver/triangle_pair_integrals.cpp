#include "solver/triangle_pair_integrals.hpp"

#include <algorithm>
#include <cmath>

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
    const Complex g = rule.weights[b] * area * (near ? green_kernel_smooth(k, distance) : green_kernel(k, distance));
    result.scalar += g;
    result.moment += g * x.cast<Complex>();
  }
  result.scalar *= green_scale;
  result.moment *= green_scale;
  return result;
}

std::vector<TriangleQuadrature> triangle_quadrature(const SurfaceMesh& mesh) {
  const TriangleRule& rule = triangle_rule_degree5();
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
  }
  return all;
}

bool triangle_pair_is_near(const TriangleQuadrature& p, const TriangleQuadrature& q) {
  return (p.centroid - q.centroid).norm() < near_distance_in_sizes * std::max(p.size, q.size);
}

// Compiled also for AVX-512 and AVX2 (chosen by CPU features at start-up), as the far
// pairs are most of a surface fill.
__attribute__((target_clones("avx512f", "avx2", "default"))) TrianglePairIntegrals triangle_pair_integrals_by_points(
    const TriangleQuadrature& p, const TriangleQuadrature& q, Real k) {
  // The 49 kernels in one vectorised batch, then per point of P the inner sums over Q's
  // points in real arithmetic.
  std::array<Real, n * n> distance, weight, kernel_re, kernel_im;
  for (int a = 0; a < n; ++a)
    for (int b = 0; b < n; ++b) {
      distance[a * n + b] = (p.x[a] - q.x[b]).norm();
      weight[a * n + b] = q.w[b] * green_scale;
    }
  green_kernel_batch(k, distance.data(), weight.data(), kernel_re.data(), kernel_im.data(), n * n);
  PairSums sums;
  for (int a = 0; a < n; ++a) {
    Real s_re = 0.0, s_im = 0.0, m_re[3] = {0.0, 0.0, 0.0}, m_im[3] = {0.0, 0.0, 0.0};
    for (int b = 0; b < n; ++b) {
      const Real g_re = kernel_re[a * n + b], g_im = kernel_im[a * n + b];
      s_re += g_re;
      s_im += g_im;
      for (int i = 0; i < 3; ++i) {
        m_re[i] += g_re * q.x[b][i];
        m_im[i] += g_im * q.x[b][i];
      }
    }
    sums.add(p.x[a], p.w[a], Complex(s_re, s_im),
             Eigen::Vector3cd(Complex(m_re[0], m_im[0]), Complex(m_re[1], m_im[1]), Complex(m_re[2], m_im[2])));
  }
  return sums.integrals(p, q);
}

TrianglePairIntegrals triangle_pair_integrals(const TriangleQuadrature& p, const TriangleQuadrature& q, Real k) {
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
