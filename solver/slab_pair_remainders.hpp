#pragma once
/// The grounded slab's remainder kernels integrated over a triangle pair.
#include "solver/slab_kernel_table.hpp"
#include "solver/triangle_pair_integrals.hpp"

namespace lobe {

/// The pair integrals of the slab's remainder kernels (the kernels less their quasi-static
/// direct term, which the free-space integrals carry), with f = (r − p_i) on the observer P
/// and (r' − q_j) on the source Q: vector(i, j) = ∫∫ R_A (r − p_i)·(r' − q_j), scalar = ∫∫ R_V.
/// The remainders are smooth and finite at ρ = 0, so a product rule serves every pair: the
/// 7 × 7 rule, and for a distant pair (triangle_pair_is_distant) the 6 × 6 rule of degree 4
/// that such a pair takes in free space. The remainders vary no faster than the free-space
/// kernel at the same distance (their quasi-static images 1/√(ρ² + (2nh)²) are smoother
/// than 1/ρ, the rest varies on the dielectric wavelength), so the smaller rule keeps them
/// as accurate as it keeps G; tests/solver/test_slab_pair_remainders.cpp measures it.
TrianglePairIntegrals slab_remainder_integrals(const SlabKernelTable& table, const TriangleQuadrature& p,
                                               const TriangleQuadrature& q);

}  // namespace lobe
