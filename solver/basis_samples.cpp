#include "solver/basis_samples.hpp"

#include "solver/gauss_legendre.hpp"
#include "solver/triangle_rules.hpp"

namespace lobe {
namespace {

constexpr int points_per_segment = 6;
constexpr int points_per_star_direction = 6;

}  // namespace

std::vector<BasisSample> basis_samples(const WireMesh& wires, const WireBasis& basis, const SurfaceMesh& surface,
                                       const RwgBasis& rwg, const std::vector<JunctionStar>& stars) {
  std::vector<BasisSample> samples;
  const QuadratureRule& rule = gauss_legendre(points_per_segment);
  for (std::size_t s = 0; s < wires.segments.size(); ++s) {
    const Segment& seg = wires.segments[s];
    const auto& pieces = basis.pieces_on(static_cast<int>(s));
    if (pieces.empty()) continue;
    const Vec3 u = seg.direction();
    for (int q = 0; q < points_per_segment; ++q) {
      const Real xi = rule.nodes[q];
      BasisSample sample{seg.start + xi * (seg.end - seg.start), {}};
      for (const BasisPiece& piece : pieces) {
        const Real shape = piece.peak_end == 1 ? xi : 1.0 - xi;
        sample.weights.push_back({piece.basis, (piece.sign * shape * rule.weights[q] * seg.length()) * u});
      }
      samples.push_back(std::move(sample));
    }
  }
  const TriangleRule& area_rule = triangle_rule_degree5();
  for (std::size_t t = 0; t < surface.triangles.size(); ++t) {
    const int ti = static_cast<int>(t);
    const auto& pieces = rwg.pieces_on(ti);
    if (pieces.empty()) continue;
    for (std::size_t q = 0; q < area_rule.points.size(); ++q) {
      const auto& b = area_rule.points[q];
      const Vec3 r = b[0] * surface.corner(ti, 0) + b[1] * surface.corner(ti, 1) + b[2] * surface.corner(ti, 2);
      const Real w = area_rule.weights[q] * surface.area(ti);
      BasisSample sample{r, {}};
      for (const RwgPiece& piece : pieces)  // f = c (r − v_free)
        sample.weights.push_back({piece.basis, (piece.coefficient * w) * (r - surface.corner(ti, piece.free_corner))});
      samples.push_back(std::move(sample));
    }
  }
  for (const JunctionStar& star : stars)
    for (const StarSample& s : star_samples(star, points_per_star_direction)) {
      BasisSample sample{s.r, {}};
      for (int b : star.bases) sample.weights.push_back({b, s.current});
      samples.push_back(std::move(sample));
    }
  return samples;
}

}  // namespace lobe
