// Segment–segment terms of the wire fill.
#include "solver/pair_integrators.hpp"

#include <algorithm>
#include <cmath>

#include "solver/fresnel.hpp"
#include "solver/gauss_legendre.hpp"

namespace lobe {
namespace {

/// d_i: the slope of N_i along the segment, N_0 = 1−ξ falls, N_1 = ξ rises.
constexpr Real slope[2] = {-1.0, 1.0};

/// The self pair is symmetric in (i, j); average away the quadrature's asymmetry.
void symmetrize(PairIntegrals& integrals) { integrals[1] = integrals[2] = 0.5 * (integrals[1] + integrals[2]); }

/// One image term of a pair: its integrals, their sum (the scalar-potential term), the
/// weight of the vector term (the observer's direction dotted with the image current of a
/// unit source current) and of the scalar term, worked out once per pair rather than per
/// pair of basis pieces.
struct ImagePair {
  PairIntegrals integrals;
  Complex phi;
  Complex current_weight, charge_weight;
};

Vec3 midpoint(const SegmentGeometry& s) { return 0.5 * (s.start + s.end); }

/// Points along a segment for the ground's reflected field: enough that its scale, the
/// pair's height sum, is resolved (from 3 up to 16, the most a segment as long as five
/// times its height needs).
int ground_points(const SegmentGeometry& s, const SegmentGeometry& t) {
  const Real height = std::min(s.start.z(), s.end.z()) + std::min(t.start.z(), t.end.z());
  const Real length = std::max((s.end - s.start).norm(), (t.end - t.start).norm());
  return std::clamp(static_cast<int>(std::ceil(1.5 * length / height)) + 3, 3, 16);
}

/// ∫∫ N_i(ξ) N_j(ξ') ŝ·G ŝ' dl dl' of the real ground's reflected field G
/// (solver/half_space_field) over segments s (observing) and t, by Gauss–Legendre points.
PairIntegrals ground_pair_integrals(const GroundKernelTable& table, const SegmentGeometry& s, const SegmentGeometry& t,
                                    const Vec3& ds, const Vec3& dt) {
  const QuadratureRule& rule = gauss_legendre(ground_points(s, t));
  const Real ls = (s.end - s.start).norm(), lt = (t.end - t.start).norm();
  PairIntegrals integrals{};
  for (std::size_t a = 0; a < rule.nodes.size(); ++a) {
    const Real xi = rule.nodes[a];
    const Vec3 r = s.start + xi * (s.end - s.start);
    for (std::size_t b = 0; b < rule.nodes.size(); ++b) {
      const Real eta = rule.nodes[b];
      const Vec3 r_source = t.start + eta * (t.end - t.start);
      const Real dx = r.x() - r_source.x(), dy = r.y() - r_source.y(), rho = std::hypot(dx, dy);
      const Eigen::Matrix3cd g = reflected_dyadic(table.at(rho, r.z() + r_source.z()), rho > 0.0 ? dx / rho : 1.0,
                                                  rho > 0.0 ? dy / rho : 0.0);
      const Complex value = ds.cast<Complex>().dot(g * dt.cast<Complex>()) * (rule.weights[a] * rule.weights[b] * ls * lt);
      const Real n[2][2] = {{1.0 - xi, xi}, {1.0 - eta, eta}};
      for (int i = 0; i < 2; ++i)
        for (int j = 0; j < 2; ++j) integrals[2 * i + j] += n[0][i] * n[1][j] * value;
    }
  }
  return integrals;
}

}  // namespace

void add_segment_segment_terms(const FillContext& c, int s, std::vector<MatrixContribution>& out) {
  const WireBasis& basis = c.problem.basis;
  const FillGeometry& g = c.geometry;
  if (basis.pieces_on(s).empty()) return;
  const int count = static_cast<int>(g.segments.size());
  std::vector<ImagePair> image_pairs(g.images.size());
  for (int t = s; t < count; ++t) {
    if (basis.pieces_on(t).empty()) continue;
    PairIntegrals direct = segment_pair_integrals(g.segments[s], g.segments[t], c.k);
    if (s == t) symmetrize(direct);
    PairIntegrals ground{};
    if (c.ground_table) {
      ground = ground_pair_integrals(*c.ground_table, g.segments[s], g.segments[t], g.directions[s], g.directions[t]);
      if (s == t) symmetrize(ground);
    }
    for (std::size_t i = 0; i < g.images.size(); ++i) {
      ImagePair& image = image_pairs[i];
      const ImageSource& source = g.images[i].image;
      if (source.fresnel && c.ground_table) {
        // The reflected field above stands for the whole of the ground's term.
        image = {};
        continue;
      }
      image.integrals = segment_pair_integrals(g.segments[s], g.images[i].segments[t], c.k);
      if (s == t) symmetrize(image.integrals);
      image.phi = image.integrals[0] + image.integrals[1] + image.integrals[2] + image.integrals[3];
      if (source.fresnel) {
        const GroundImageWeights w =
            ground_image_weights(c.ground_permittivity, midpoint(g.segments[s]), midpoint(g.segments[t]));
        image.current_weight = g.directions[s].cast<Complex>().dot(w.current * g.directions[t].cast<Complex>());
        image.charge_weight = w.charge;
      } else {
        image.current_weight = source.current_sign * g.directions[s].dot(g.images[i].directions[t]);
        image.charge_weight = source.charge_sign;
      }
    }
    const Real direct_dot = g.directions[s].dot(g.directions[t]);
    const Complex phi = direct[0] + direct[1] + direct[2] + direct[3];
    for (const BasisPiece& pm : basis.pieces_on(s))
      for (const BasisPiece& pn : basis.pieces_on(t)) {
        const int ij = 2 * pm.peak_end + pn.peak_end;
        const Real divergence = slope[pm.peak_end] * slope[pn.peak_end] / (g.lengths[s] * g.lengths[t]);
        Complex value = c.vector_factor * (direct_dot * direct[ij] + ground[ij]) + c.scalar_factor * divergence * phi;
        for (const ImagePair& image : image_pairs)
          value += image.current_weight * (c.vector_factor * image.integrals[ij]) +
                   image.charge_weight * (c.scalar_factor * divergence * image.phi);
        out.push_back({pm.basis, pn.basis, s != t, value * (pm.sign * pn.sign)});
      }
  }
}

}  // namespace lobe
