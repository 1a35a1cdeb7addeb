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

/// ∫ G and ∫ G r' over Q at each of P's points, by 7 × 7 points.
void far_inner(const TriangleQuadrature& p, const TriangleQuadrature& q, Real k, std::array<Complex, n>& scalar,
               std::array<Eigen::Vector3cd, n>& moment) {
  std::array<Real, n * n> distance, weight, kernel_re, kernel_im;
  for (int a = 0; a < n; ++a)
    for (int b = 0; b < n; ++b) {
      distance[a * n + b] = (p.x[a] - q.x[b]).norm();
      weight[a * n + b] = q.w[b] * green_scale;
    }
  green_kernel_batch(k, distance.data(), weight.data(), kernel_re.data(), kernel_im.data(), n * n);
  for (int a = 0; a < n; ++a) {
    scalar[a] = 0.0;
    moment[a].setZero();
    for (int b = 0; b < n; ++b) {
      const Complex g(kernel_re[a * n + b], kernel_im[a * n + b]);
      scalar[a] += g;
      moment[a] += g * q.x[b].cast<Complex>();
    }
  }
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

namespace {

/// The outer 7-point integral over P of the inner potentials at P's points.
TrianglePairIntegrals outer_integral(const TriangleQuadrature& p, const TriangleQuadrature& q,
                                     const std::array<Complex, n>& inner_scalar,
                                     const std::array<Eigen::Vector3cd, n>& inner_moment) {
  TrianglePairIntegrals result;
  for (int a = 0; a < n; ++a) {
    result.scalar += p.w[a] * inner_scalar[a];
    for (int i = 0; i < 3; ++i) {
      const Eigen::Vector3cd from_corner = (p.x[a] - p.corners[i]).cast<Complex>();
      for (int j = 0; j < 3; ++j)
        // (r − p_i)·∫ G (r' − q_j) = (r − p_i)·(∫ G r' − q_j ∫ G)
        result.vector(i, j) += p.w[a] * from_corner.dot(inner_moment[a] - q.corners[j].cast<Complex>() * inner_scalar[a]);
    }
  }
  return result;
}

}  // namespace

TrianglePairIntegrals triangle_pair_integrals_by_points(const TriangleQuadrature& p, const TriangleQuadrature& q,
                                                        Real k) {
  std::array<Complex, n> inner_scalar;
  std::array<Eigen::Vector3cd, n> inner_moment;
  far_inner(p, q, k, inner_scalar, inner_moment);
  return outer_integral(p, q, inner_scalar, inner_moment);
}

TrianglePairIntegrals triangle_pair_integrals(const TriangleQuadrature& p, const TriangleQuadrature& q, Real k) {
  if (!triangle_pair_is_near(p, q)) return triangle_pair_integrals_by_points(p, q, k);
  std::array<Complex, n> inner_scalar;
  std::array<Eigen::Vector3cd, n> inner_moment;
  for (int a = 0; a < n; ++a) {
    const PointPotentials inner = triangle_point_potentials(p.x[a], q.corners[0], q.corners[1], q.corners[2], q.area, k, true);
    inner_scalar[a] = inner.scalar;
    inner_moment[a] = inner.moment;
  }
  return outer_integral(p, q, inner_scalar, inner_moment);
}

}  // namespace lobe
