#pragma once
/// Symmetric quadrature rules on a triangle, in barycentric coordinates.
#include <array>
#include <vector>

#include "core/types.hpp"

namespace lobe {

/// Points as barycentric weights (λ1, λ2, λ3) on the vertices; weights sum to 1, so
/// ∫_T f dS ≈ A Σ w_i f(Σ λ_k v_k).
struct TriangleRule {
  std::vector<std::array<Real, 3>> points;
  std::vector<Real> weights;
};

/// The 7-point rule of degree 5 (Dunavant 1985; also Strang & Fix 1973): exact for
/// polynomials of degree ≤ 5 over the triangle.
const TriangleRule& triangle_rule_degree5();

/// The 6-point rule of degree 4 (Dunavant 1985): two orbits of three points.
const TriangleRule& triangle_rule_degree4();

/// The 7-point rule applied on each of the 4^levels congruent sub-triangles obtained by
/// joining edge midpoints: a fine rule for slow reference integrals in tests and for
/// near-singular smooth parts.
TriangleRule subdivided_triangle_rule(int levels);

}  // namespace lobe
