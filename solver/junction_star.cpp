#include "solver/junction_star.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <optional>
#include <stdexcept>

#include "core/constants.hpp"
#include "solver/gauss_legendre.hpp"
#include "solver/green_function.hpp"

namespace lobe {
namespace {

/// Points beyond this many star radii from v see a smooth integrand.
constexpr Real far_in_radii = 4.0;
constexpr int far_order = 4;
constexpr int near_t_order = 8;
constexpr int near_s_order = 4;

/// ∫_0^1 s^n ds/R for n = 0, 1, 2, R = |w − s d|: the static kernel along the ray from v
/// (w = r − v) in closed form, stable on the ray's extension (log form, with the
/// cancelling differences rewritten through h² = R² − x²).
std::array<Real, 3> ray_static_integrals(const Vec3& w, const Vec3& d) {
  const Real length = d.norm();
  const Real x = w.dot(d) / length;  // coordinate of r along the ray
  const Real h2 = std::max(w.cross(d).squaredNorm() / (length * length), 1e-24 * length * length);
  const Real r0 = w.norm(), r1 = (w - d).norm();
  const Real upper = length - x >= 0.0 ? r1 + (length - x) : h2 / (r1 - (length - x));
  const Real lower = x <= 0.0 ? r0 - x : h2 / (r0 + x);
  // With u = l − x: ∫ du/R, ∫ u du/R and ∫ u² du/R over the ray.
  const Real i0 = std::log(upper / lower);
  const Real i1 = r1 - r0;
  const Real i2 = 0.5 * ((length - x) * r1 + x * r0) - 0.5 * h2 * i0;
  return {i0 / length, (i1 + x * i0) / (length * length), (i2 + 2 * x * i1 + x * x * i0) / (length * length * length)};
}

/// Adds one star triangle's contribution over t ∈ [t_low, t_high].
void add_near_range(const JunctionStar& star, const StarTriangle& tri, const Vec3& r, Real k, Real t_low, Real t_high,
                    StarPotentials& out) {
  const QuadratureRule& t_rule = gauss_legendre(near_t_order);
  const QuadratureRule& s_rule = gauss_legendre(near_s_order);
  const Vec3 w = r - star.vertex;
  const Real factor = 2 * tri.area * star.scale * green_scale;
  for (int i = 0; i < near_t_order; ++i) {
    const Real t = t_low + (t_high - t_low) * t_rule.nodes[i];
    const Real wt = (t_high - t_low) * t_rule.weights[i];
    const Vec3 d = tri.a + t * (tri.b - tri.a) - star.vertex;
    const Real d2 = d.squaredNorm();
    const auto [flat, ramp, square] = ray_static_integrals(w, d);
    Complex charge = ramp, current = flat - square;  // ∫ s G, ∫ (1 − s²) G along the ray
    for (int j = 0; j < near_s_order; ++j) {
      const Real s = s_rule.nodes[j];
      const Complex g = s_rule.weights[j] * green_kernel_smooth(k, (w - s * d).norm());
      charge += s * g;
      current += (1.0 - s * s) * g;
    }
    out.scalar -= 2.0 * factor * wt / d2 * charge;
    out.vector += (factor * wt / d2 * current) * d.cast<Complex>();
  }
}

/// The t at which the ray from v through r's projection meets the far edge, if inside (0, 1).
std::optional<Real> crossing_parameter(const JunctionStar& star, const StarTriangle& tri, const Vec3& r) {
  const Vec3 e1 = tri.a - star.vertex, e2 = tri.b - tri.a;
  const Vec3 normal = e1.cross(tri.b - star.vertex);
  const Vec3 w = r - star.vertex;
  const Vec3 rho = w - normal.dot(w) / normal.squaredNorm() * normal;
  if (rho.norm() < 1e-9 * e1.norm()) return std::nullopt;
  const Real denominator = e2.cross(rho).dot(normal);
  if (std::abs(denominator) < 1e-300) return std::nullopt;
  const Real t = -e1.cross(rho).dot(normal) / denominator;
  if (!(t > 1e-9 && t < 1 - 1e-9) || (e1 + t * e2).dot(rho) <= 0.0) return std::nullopt;
  return t;
}

}  // namespace

Real JunctionStar::radius() const {
  Real r = 0.0;
  for (const auto& t : triangles) r = std::max({r, (t.a - vertex).norm(), (t.b - vertex).norm()});
  return r;
}

JunctionStar JunctionStar::imaged(const Eigen::Matrix3d& mirror) const {
  JunctionStar m = *this;
  m.vertex = mirror * vertex;
  for (auto& t : m.triangles) {
    t.a = mirror * t.a;
    t.b = mirror * t.b;
  }
  return m;
}

JunctionStar junction_star(const SurfaceMesh& mesh, int vertex) {
  JunctionStar star;
  star.vertex = mesh.vertices[vertex];
  star.mesh_vertex = vertex;
  Real angle = 0.0;
  for (std::size_t t = 0; t < mesh.triangles.size(); ++t) {
    const auto& corners = mesh.triangles[t];
    for (int k = 0; k < 3; ++k) {
      if (corners[k] != vertex) continue;
      const Vec3 a = mesh.vertices[corners[(k + 1) % 3]], b = mesh.vertices[corners[(k + 2) % 3]];
      star.triangles.push_back({a, b, mesh.area(static_cast<int>(t)), static_cast<int>(t)});
      angle += std::acos(std::clamp((a - star.vertex).normalized().dot((b - star.vertex).normalized()), -1.0, 1.0));
    }
  }
  if (star.triangles.empty()) throw std::logic_error("junction vertex used by no triangle");
  star.scale = 1.0 / angle;
  return star;
}

StarPotentials star_potentials(const JunctionStar& star, const Vec3& r, Real k) {
  StarPotentials out;
  if ((r - star.vertex).norm() > far_in_radii * star.radius()) {
    // A star triangle's far_order² kernels in one vectorised batch (one at a time, through
    // the library's sincos, they were a twentieth of a plate-and-monopole fill).
    const QuadratureRule& rule = gauss_legendre(far_order);
    constexpr int count = far_order * far_order;
    static_assert(count <= green_batch_limit);
    for (const StarTriangle& tri : star.triangles) {
      const Real factor = 2 * tri.area * star.scale * green_scale;
      std::array<Vec3, far_order> d;
      std::array<Real, count> distance, weight, g_re, g_im;
      for (int i = 0; i < far_order; ++i) {
        d[i] = tri.a + rule.nodes[i] * (tri.b - tri.a) - star.vertex;
        for (int j = 0; j < far_order; ++j) {
          distance[i * far_order + j] = (r - star.vertex - rule.nodes[j] * d[i]).norm();
          weight[i * far_order + j] = factor * rule.weights[i] / d[i].squaredNorm() * rule.weights[j];
        }
      }
      green_kernel_batch(k, distance.data(), weight.data(), g_re.data(), g_im.data(), count);
      for (int i = 0; i < far_order; ++i)
        for (int j = 0; j < far_order; ++j) {
          const Real s = rule.nodes[j];
          const Complex g(g_re[i * far_order + j], g_im[i * far_order + j]);
          out.scalar -= 2.0 * s * g;
          out.vector += ((1.0 - s * s) * g) * d[i].cast<Complex>();
        }
    }
    return out;
  }
  for (const StarTriangle& tri : star.triangles) {
    if (const auto split = crossing_parameter(star, tri, r)) {
      add_near_range(star, tri, r, k, 0.0, *split, out);
      add_near_range(star, tri, r, k, *split, 1.0, out);
    } else {
      add_near_range(star, tri, r, k, 0.0, 1.0, out);
    }
  }
  return out;
}

std::vector<StarSample> star_samples(const JunctionStar& star, int order) {
  const QuadratureRule& rule = gauss_legendre(order);
  std::vector<StarSample> samples;
  for (const StarTriangle& tri : star.triangles)
    for (int i = 0; i < order; ++i) {
      const Vec3 d = tri.a + rule.nodes[i] * (tri.b - tri.a) - star.vertex;
      const Real weight = 2 * tri.area * star.scale * rule.weights[i] / d.squaredNorm();
      for (int j = 0; j < order; ++j) {
        const Real s = rule.nodes[j];
        samples.push_back({star.vertex + s * d, -2.0 * s * weight * rule.weights[j], weight * rule.weights[j] * (1.0 - s * s) * d});
      }
    }
  return samples;
}

}  // namespace lobe
