#pragma once
/// Integrals of the thin-wire Green's function over a pair of straight segments.
#include <array>

#include "core/types.hpp"
#include "solver/gauss_legendre.hpp"

namespace lobe {

/// A straight segment as the kernels see it.
struct SegmentGeometry {
  Vec3 start;
  Vec3 end;
  Real radius;
};

/// I[2i+j] = ∫_obs ∫_src N_i(ξ) N_j(ξ') G(R) dl dl', with N_0 = 1−ξ, N_1 = ξ along each
/// segment and the reduced thin-wire kernel G = e^{−jkR}/(4πR), R² = |r − r'|² + a²,
/// where a² is the mean of the two squared radii (symmetric in the pair). Units: m.
using PairIntegrals = std::array<Complex, 4>;

/// Evaluates the pair integrals. Near pairs (touching or within about a segment length)
/// integrate the static 1/R part analytically over the source segment and graded
/// Gauss–Legendre over the observation segment; the smooth rest (e^{−jkR}−1)/R and all
/// farther pairs use Gauss–Legendre product rules.
PairIntegrals segment_pair_integrals(const SegmentGeometry& observer, const SegmentGeometry& source, Real k);

/// A rule on [0, 1] for a segment of length `length` and radius `radius`, with
/// subintervals shrinking geometrically toward both ends, where the static kernel of a
/// touching neighbour varies over a distance of about one radius.
QuadratureRule graded_rule(Real length, Real radius);

}  // namespace lobe
