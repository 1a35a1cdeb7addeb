// Segment–segment terms of the wire fill.
#include "solver/pair_integrators.hpp"

namespace lobe {
namespace {

/// d_i: the slope of N_i along the segment, N_0 = 1−ξ falls, N_1 = ξ rises.
constexpr Real slope[2] = {-1.0, 1.0};

/// The self pair is symmetric in (i, j); average away the quadrature's asymmetry.
void symmetrize(PairIntegrals& integrals) { integrals[1] = integrals[2] = 0.5 * (integrals[1] + integrals[2]); }

/// One image term of a pair: its integrals, their sum (the scalar-potential term) and the
/// dot product of the observer's direction with the imaged source's, worked out once per
/// pair rather than per pair of basis pieces.
struct ImagePair {
  PairIntegrals integrals;
  Complex phi;
  Real dot;
};

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
      image.dot = g.directions[s].dot(g.images[i].directions[t]);
    }
    const Real direct_dot = g.directions[s].dot(g.directions[t]);
    const Complex phi = direct[0] + direct[1] + direct[2] + direct[3];
    for (const BasisPiece& pm : basis.pieces_on(s))
      for (const BasisPiece& pn : basis.pieces_on(t)) {
        const int ij = 2 * pm.peak_end + pn.peak_end;
        const Real divergence = slope[pm.peak_end] * slope[pn.peak_end] / (g.lengths[s] * g.lengths[t]);
        Complex value = c.vector_factor * direct_dot * direct[ij] + c.scalar_factor * divergence * phi;
        for (std::size_t i = 0; i < g.images.size(); ++i) {
          const ImageSource& source = g.images[i].image;
          const ImagePair& image = image_pairs[i];
          value += source.current_sign * (c.vector_factor * image.dot * image.integrals[ij]) +
                   source.charge_sign * (c.scalar_factor * divergence * image.phi);
        }
        out.push_back({pm.basis, pn.basis, s != t, value * (pm.sign * pn.sign)});
      }
  }
}

}  // namespace lobe
