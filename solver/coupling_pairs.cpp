// The terms that tie wires to surfaces: wire pieces against RWG functions, and the surface
// halves of wire-to-surface junction functions against everything. The wire current flows
// on the wire's axis (exact kernel, no reduced-kernel radius), which is accurate once the
// wire is a few radii from the surface. O(S·T) plus O(J·(S + T)) point potentials.
#include <algorithm>
#include <cmath>

#include "core/constants.hpp"
#include "solver/gauss_legendre.hpp"
#include "solver/pair_integrators.hpp"
#include "solver/segment_integrals.hpp"
#include "solver/triangle_pair_integrals.hpp"
#include "solver/triangle_rules.hpp"

namespace lobe {
namespace {

/// A pair is near when closer than this many of its larger element size: the observer
/// then needs points graded toward its ends, the source its closed-form static part.
constexpr Real near_in_sizes = 2.0;
/// Gauss points along a segment observing a far source.
constexpr int far_segment_points = 6;
/// Duffy points per direction on a triangle or star observing a junction.
constexpr int duffy_order = 8;

/// What one basis function weighs at one test point: ∇·f dS (or dl) and f dS (or dl).
struct TestWeight {
  int basis;
  Real charge;
  Vec3 current;
};

struct TestPoint {
  Vec3 r;
  std::vector<TestWeight> weights;
};

/// The potentials one source function makes at a point: Φ = ∫ G ∇·f and A = ∫ G f.
struct SourceField {
  int basis;
  Complex scalar;
  Eigen::Vector3cd vector;
};

/// The signs of one source term: (1, 1) for the direct term, an image's signs for its own.
struct TermSigns {
  Real current = 1.0;
  Real charge = 1.0;
};

/// Z terms of every test weight at `point` against the given source fields.
void add_terms(const TestPoint& point, const std::vector<SourceField>& fields, const FillContext& c, TermSigns sign,
               std::vector<MatrixContribution>& out) {
  for (const TestWeight& w : point.weights)
    for (const SourceField& s : fields) {
      const Complex vector = c.vector_factor * (w.current.cast<Complex>().transpose() * s.vector)(0);
      const Complex scalar = c.scalar_factor * w.charge * s.scalar;
      out.push_back({w.basis, s.basis, true, sign.current * vector + sign.charge * scalar});
    }
}

/// Test points of the wire pieces on a segment under a rule on [0, 1].
std::vector<TestPoint> segment_points(const Segment& seg, const std::vector<BasisPiece>& pieces, const QuadratureRule& rule) {
  constexpr Real slope[2] = {-1.0, 1.0};
  const Real length = seg.length();
  const Vec3 u = seg.direction();
  std::vector<TestPoint> points;
  for (std::size_t q = 0; q < rule.nodes.size(); ++q) {
    const Real xi = rule.nodes[q], w = rule.weights[q];
    TestPoint p{seg.start + xi * (seg.end - seg.start), {}};
    for (const BasisPiece& piece : pieces) {
      const Real shape = piece.peak_end == 1 ? xi : 1.0 - xi;
      p.weights.push_back({piece.basis, piece.sign * slope[piece.peak_end] * w, piece.sign * shape * w * length * u});
    }
    points.push_back(std::move(p));
  }
  return points;
}

/// Test points of the RWG pieces on triangle t: the 7-point rule, or, when `apex` is one of
/// its corners, Duffy points about that corner (where a junction's potential is singular).
std::vector<TestPoint> triangle_points(const SurfaceMesh& mesh, int t, const std::vector<RwgPiece>& pieces, int apex) {
  std::vector<std::pair<Vec3, Real>> samples;  // point, weight (dS)
  const Real area = mesh.area(t);
  int corner = -1;
  for (int k = 0; k < 3; ++k)
    if (mesh.triangles[t][k] == apex) corner = k;
  if (corner < 0) {
    const TriangleRule& rule = triangle_rule_degree5();
    for (std::size_t q = 0; q < rule.points.size(); ++q) {
      const auto& b = rule.points[q];
      samples.emplace_back(b[0] * mesh.corner(t, 0) + b[1] * mesh.corner(t, 1) + b[2] * mesh.corner(t, 2), rule.weights[q] * area);
    }
  } else {
    const QuadratureRule& rule = gauss_legendre(duffy_order);
    const Vec3 v = mesh.corner(t, corner), a = mesh.corner(t, (corner + 1) % 3), b = mesh.corner(t, (corner + 2) % 3);
    for (int i = 0; i < duffy_order; ++i)
      for (int j = 0; j < duffy_order; ++j) {
        const Real s = rule.nodes[j];
        samples.emplace_back(v + s * (a + rule.nodes[i] * (b - a) - v), 2 * area * s * rule.weights[i] * rule.weights[j]);
      }
  }
  std::vector<TestPoint> points;
  for (const auto& [r, w] : samples) {
    TestPoint p{r, {}};
    for (const RwgPiece& piece : pieces)  // f = c (r − v_free), ∇·f = 2c
      p.weights.push_back({piece.basis, 2 * piece.coefficient * w, piece.coefficient * w * (r - mesh.corner(t, piece.free_corner))});
    points.push_back(std::move(p));
  }
  return points;
}

std::vector<TestPoint> star_points(const JunctionStar& star) {
  std::vector<TestPoint> points;
  for (const StarSample& s : star_samples(star, duffy_order)) {
    TestPoint p{s.r, {}};
    for (int basis : star.bases) p.weights.push_back({basis, s.charge, s.current});
    points.push_back(std::move(p));
  }
  return points;
}

/// The fields of the RWG pieces on one source triangle (corners q) at r.
std::vector<SourceField> triangle_fields(const std::array<Vec3, 3>& q, Real area, const std::vector<RwgPiece>& pieces,
                                         const Vec3& r, Real k, bool near) {
  const PointPotentials p = triangle_point_potentials(r, q[0], q[1], q[2], area, k, near);
  std::vector<SourceField> fields;
  for (const RwgPiece& piece : pieces)
    fields.push_back({piece.basis, 2 * piece.coefficient * p.scalar,
                      piece.coefficient * (p.moment - q[piece.free_corner].cast<Complex>() * p.scalar)});
  return fields;
}

std::vector<SourceField> star_fields(const JunctionStar& star, const Vec3& r, Real k) {
  const StarPotentials p = star_potentials(star, r, k);
  std::vector<SourceField> fields;
  for (int basis : star.bases) fields.push_back({basis, p.scalar, p.vector});
  return fields;
}

/// On a substrate, what the slab adds to a star's fields at p beyond the quasi-static direct
/// term (which the caller has scaled): the table's remainder summed over the star's samples
/// and, near the star, its quasi-static images integrated exactly in place of their share of
/// those sums (they vary on the thickness's scale, finer than the samples).
void add_slab_star_terms(const TestPoint& p, const JunctionStar& star, const SlabStar& slab_star, const FillContext& c,
                         std::vector<MatrixContribution>& out) {
  const std::vector<StarSample>& samples = slab_star.samples;
  constexpr int batch = 64;
  Complex scalar = 0.0;
  Eigen::Vector3cd vector = Eigen::Vector3cd::Zero();
  for (std::size_t first = 0; first < samples.size(); first += batch) {
    const int count = static_cast<int>(std::min<std::size_t>(batch, samples.size() - first));
    Real distance[batch];
    SlabRemainders remainder[batch];
    for (int i = 0; i < count; ++i) distance[i] = (p.r - samples[first + i].r).norm();
    c.slab->remainders(distance, count, remainder);
    for (int i = 0; i < count; ++i) {
      scalar += samples[first + i].charge * remainder[i].scalar;
      vector += remainder[i].vector * samples[first + i].current.cast<Complex>();
    }
  }
  if ((p.r - star.vertex).norm() < 2.0 * near_in_sizes * star.radius()) {
    for (const auto& [image, lowered] : slab_star.images) {
      const StarPotentials exact = star_potentials(lowered, p.r, c.k);
      Complex by_points_scalar = 0.0;
      Eigen::Vector3cd by_points_vector = Eigen::Vector3cd::Zero();
      for (const StarSample& s : samples) {
        const Real r = (p.r - s.r + Vec3(0.0, 0.0, image.depth)).norm();
        const Complex g = std::polar(1.0 / (4.0 * pi * r), -c.k * r);
        by_points_scalar += s.charge * g;
        by_points_vector += g * s.current.cast<Complex>();
      }
      scalar += image.scalar_weight * (exact.scalar - by_points_scalar);
      vector += image.vector_weight * (exact.vector - by_points_vector);
    }
  }
  std::vector<SourceField> fields;
  for (int basis : star.bases) fields.push_back({basis, scalar, vector});
  add_terms(p, fields, c, {}, out);
}

/// Distance from point p to the segment.
Real distance_to_segment(const Vec3& p, const Segment& seg) {
  const Vec3 d = seg.end - seg.start;
  const Real t = std::clamp((p - seg.start).dot(d) / d.squaredNorm(), 0.0, 1.0);
  return (p - seg.start - t * d).norm();
}

}  // namespace

void add_segment_triangle_terms(const FillContext& c, int s, std::vector<MatrixContribution>& out) {
  const auto& pieces = c.problem.basis.pieces_on(s);
  const RwgBasis& rwg = c.problem.rwg;
  const FillGeometry& g = c.geometry;
  if (pieces.empty() || g.triangles.empty()) return;
  const Segment& seg = c.problem.mesh.segments[s];
  const auto far_points = segment_points(seg, pieces, gauss_legendre(far_segment_points));
  const auto near_points = segment_points(seg, pieces, graded_rule(seg.length(), seg.radius));
  auto add_source = [&](const TriangleQuadrature& q, int t, TermSigns sign) {
    const bool near = distance_to_segment(q.centroid, seg) < near_in_sizes * std::max(seg.length(), q.size);
    for (const TestPoint& p : near ? near_points : far_points)
      add_terms(p, triangle_fields(q.corners, q.area, rwg.pieces_on(t), p.r, c.k, near), c, sign, out);
  };
  for (int t = 0; t < static_cast<int>(g.triangles.size()); ++t) {
    if (rwg.pieces_on(t).empty()) continue;
    add_source(g.triangles[t], t, {});
    for (const ImagedElements& imaged : g.images)
      add_source(imaged.triangles[t], t, {imaged.image.current_sign, imaged.image.charge_sign});
  }
}

void add_star_source_terms(const FillContext& c, int e, std::vector<MatrixContribution>& out) {
  const std::vector<JunctionStar>& stars = c.problem.stars;
  const FillGeometry& g = c.geometry;
  const int segment_count = static_cast<int>(g.segments.size());
  const int triangle_count = static_cast<int>(g.triangles.size());
  const int star_count = static_cast<int>(stars.size());
  // The fields of star j and of its images at p, added as terms of p's test weights.
  auto add_star = [&](const TestPoint& p, int j, std::vector<MatrixContribution>& terms) {
    std::vector<SourceField> direct = star_fields(stars[j], p.r, c.k);
    if (c.slab) {
      // The free-space fields are the quasi-static term: the scalar's coefficient is 2/(εr + 1).
      for (SourceField& f : direct) f.scalar *= c.slab->quasi_static().scalar;
      add_slab_star_terms(p, stars[j], g.slab_stars[j], c, terms);
    }
    add_terms(p, direct, c, {}, terms);
    for (const ImagedElements& imaged : g.images)
      add_terms(p, star_fields(imaged.stars[j], p.r, c.k), c, {imaged.image.current_sign, imaged.image.charge_sign},
                terms);
  };
  for (int j = 0; j < star_count; ++j) {
    std::vector<TestPoint> points;
    if (e < segment_count) {
      if (c.slab) return;  // a probe's vertical part: solver/probe_pairs.cpp
      const auto& pieces = c.problem.basis.pieces_on(e);
      if (pieces.empty()) return;
      const Segment& seg = c.problem.mesh.segments[e];
      const bool near = distance_to_segment(stars[j].vertex, seg) < near_in_sizes * std::max(seg.length(), stars[j].radius());
      points = segment_points(seg, pieces, near ? graded_rule(seg.length(), seg.radius) : gauss_legendre(far_segment_points));
    } else if (e < segment_count + triangle_count) {
      const int t = e - segment_count;
      if (c.problem.rwg.pieces_on(t).empty()) return;
      points = triangle_points(c.problem.surfaces.mesh, t, c.problem.rwg.pieces_on(t), stars[j].mesh_vertex);
    } else {
      const int observer = e - segment_count - triangle_count;
      if (observer < j) continue;
      points = star_points(stars[observer]);
      // Within one star, add each unordered pair of its functions once.
      if (observer == j) {
        for (const TestPoint& p : points) {
          std::vector<MatrixContribution> terms;
          add_star(p, j, terms);
          for (auto& term : terms)
            if (term.row <= term.column) out.push_back({term.row, term.column, term.row != term.column, term.value});
        }
        continue;
      }
    }
    for (const TestPoint& p : points) add_star(p, j, out);
  }
}

}  // namespace lobe
