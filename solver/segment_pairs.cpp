// Segment–segment terms of the wire fill.
#include "solver/pair_integrators.hpp"

#include "solver/fresnel.hpp"

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
    for (std::size_t i = 0; i < g.images.size(); ++i) {
      ImagePair& image = image_pairs[i];
      image.integrals = segment_pair_integrals(g.segments[s], g.images[i].segments[t], c.k);
      if (s == t) symmetrize(image.integrals);
      image.phi = image.integrals[0] + image.integrals[1] + image.integrals[2] + image.integrals[3];
      const ImageSource& source = g.images[i].image;
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
        Complex value = c.vector_factor * direct_dot * direct[ij] + c.scalar_factor * divergence * phi;
        for (const ImagePair& image : image_pairs)
          value += image.current_weight * (c.vector_factor * image.integrals[ij]) +
                   image.charge_weight * (c.scalar_factor * divergence * image.phi);
        out.push_back({pm.basis, pn.basis, s != t, value * (pm.sign * pn.sign)});
      }
  }
}

}  // namespace lobe
