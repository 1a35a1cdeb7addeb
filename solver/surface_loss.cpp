#include "solver/surface_loss.hpp"

#include <cmath>

#include "core/constants.hpp"
#include "solver/fill_geometry.hpp"
#include "solver/gauss_legendre.hpp"

namespace lobe {
namespace {

/// Duffy points per direction on a star triangle for its overlap with RWG functions.
constexpr int star_order = 8;

bool is_plate(const SurfaceShape& shape) { return shape.kind != SurfaceKind::sphere && shape.kind != SurfaceKind::box; }

/// The share of Z_s a triangle's current sees (see surface_loss_stamp).
Complex triangle_impedance(const AntennaProblem& problem, int triangle, Real frequency_hz) {
  const SurfaceShape& shape = problem.model.surfaces[problem.surfaces.region[triangle]];
  if (shape.conductivity <= 0.0) return 0.0;
  const Complex z = sheet_impedance(shape.conductivity, shape.conductor_thickness, frequency_hz);
  return is_plate(shape) && !problem.model.substrate ? 0.5 * z : z;
}

/// The radius of the wire at a star's vertex.
Real wire_radius_at(const AntennaProblem& problem, const JunctionStar& star) {
  for (std::size_t n = 0; n < problem.node_vertex.size(); ++n)
    if (problem.node_vertex[n] == star.mesh_vertex)
      return problem.mesh.segments[problem.mesh.nodes[n].ends.front().segment].radius;
  return 0.0;
}

/// ∫ |f|² dS of a star's function beyond the radius a of its wire: on each triangle, with
/// r = v + s d(t), |f|² dS = 2 A K² (1 − s²)²/(s |d|²) ds dt, and
/// ∫_{s_a}^1 (1 − s²)²/s ds = ln(1/s_a) − 3/4 + s_a² − s_a⁴/4, s_a = a/|d|.
Real star_self_overlap(const JunctionStar& star, Real radius) {
  const QuadratureRule& rule = gauss_legendre(star_order);
  Real sum = 0.0;
  for (const StarTriangle& tri : star.triangles)
    for (int i = 0; i < star_order; ++i) {
      const Vec3 d = tri.a + rule.nodes[i] * (tri.b - tri.a) - star.vertex;
      const Real s_a = std::min(1.0, radius / d.norm()), s2 = s_a * s_a;
      sum += 2 * tri.area * star.scale * star.scale * rule.weights[i] / d.squaredNorm() *
             (-std::log(s_a) - 0.75 + s2 - 0.25 * s2 * s2);
    }
  return sum;
}

}  // namespace

Complex sheet_impedance(Real conductivity, Real thickness, Real frequency_hz) {
  const Real omega = 2 * pi * frequency_hz;
  const Real surface_resistance = std::sqrt(omega * mu0 / (2 * conductivity));
  const Complex thick = Complex(1.0, 1.0) * surface_resistance;
  if (thickness <= 0.0) return thick;
  const Real skin_depth = std::sqrt(2 / (omega * mu0 * conductivity));
  const Complex x = Complex(1.0, 1.0) * (thickness / skin_depth);
  // coth x; beyond a few skin depths it is 1 to rounding.
  return std::abs(x) > 20.0 ? thick : thick / std::tanh(x);
}

std::vector<MatrixContribution> surface_loss_stamp(const AntennaProblem& problem, Real frequency_hz) {
  std::vector<MatrixContribution> terms;
  const FillGeometry& g = *problem.geometry;
  const RwgBasis& rwg = problem.rwg;
  for (int t = 0; t < static_cast<int>(g.triangles.size()); ++t) {
    const Complex z = triangle_impedance(problem, t, frequency_hz);
    if (z == 0.0) continue;
    const TriangleQuadrature& q = g.triangles[t];
    for (const RwgPiece& pm : rwg.pieces_on(t))
      for (const RwgPiece& pn : rwg.pieces_on(t)) {
        Real overlap = 0.0;  // ∫ (r − p)·(r − q) dS, exact for the degree-5 rule
        for (int i = 0; i < TriangleQuadrature::points; ++i)
          overlap += q.w[i] * (q.x[i] - q.corners[pm.free_corner]).dot(q.x[i] - q.corners[pn.free_corner]);
        terms.push_back({pm.basis, pn.basis, false, z * pm.coefficient * pn.coefficient * overlap});
      }
  }
  for (const JunctionStar& star : problem.stars) {
    const Complex z = triangle_impedance(problem, star.triangles.front().triangle, frequency_hz);
    if (z == 0.0) continue;
    const Real self = star_self_overlap(star, wire_radius_at(problem, star));
    for (int a : star.bases)
      for (int b : star.bases) terms.push_back({a, b, false, z * self});
    // Against the RWG functions on its triangles, by its Duffy samples (f_n is smooth there).
    const std::vector<StarSample> samples = star_samples(star, star_order);
    for (std::size_t k = 0; k < star.triangles.size(); ++k) {
      const StarTriangle& tri = star.triangles[k];
      const Complex zt = triangle_impedance(problem, tri.triangle, frequency_hz);
      const TriangleQuadrature& q = g.triangles[tri.triangle];
      for (const RwgPiece& piece : rwg.pieces_on(tri.triangle)) {
        Real overlap = 0.0;
        for (int i = 0; i < star_order * star_order; ++i) {
          const StarSample& s = samples[k * star_order * star_order + i];
          overlap += s.current.dot(s.r - q.corners[piece.free_corner]);
        }
        for (int basis : star.bases)
          terms.push_back({piece.basis, basis, true, zt * piece.coefficient * overlap});
      }
    }
  }
  return terms;
}

Real stamp_power(const std::vector<MatrixContribution>& stamp, const ComplexVector& coefficients) {
  Real power = 0.0;
  for (const MatrixContribution& term : stamp) {
    const Real product = (std::conj(coefficients[term.row]) * coefficients[term.column]).real();
    power += (term.mirror ? 2.0 : 1.0) * product * term.value.real();
  }
  return 0.5 * power;
}

}  // namespace lobe
