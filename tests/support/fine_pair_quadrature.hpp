#pragma once
// Slow, fine reference quadratures of triangle-pair integrals for the error studies of the
// fill's product rules.
#include <functional>

#include "solver/triangle_pair_integrals.hpp"

namespace lobe {

/// The two kernels a pair integral takes at one distance: the vector potential's K_A and
/// the scalar potential's K_V.
struct PairKernels {
  Complex vector, scalar;
};

/// vector(i, j) = ∫∫ K_A (r − p_i)·(r' − q_j) and scalar = ∫∫ K_V over the pair, by the
/// degree-5 rule on 4³ sub-triangles of each: converged to about 1e-9 for pairs two sizes
/// apart and more.
TrianglePairIntegrals fine_pair_integrals(const TriangleQuadrature& p, const TriangleQuadrature& q,
                                          const std::function<PairKernels(Real distance)>& kernels);

/// The same for the free-space kernel G = e^{−jkR}/(4πR) in both potentials.
TrianglePairIntegrals fine_pair_integrals(const TriangleQuadrature& p, const TriangleQuadrature& q, Real k);

/// The larger of the vector integrals' largest error (relative to their largest entry) and
/// the scalar integral's relative error.
Real relative_error(const TrianglePairIntegrals& x, const TrianglePairIntegrals& reference);

}  // namespace lobe
