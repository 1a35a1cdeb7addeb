#pragma once
/// Gauss–Legendre quadrature rules on [0, 1].
#include <vector>

#include "core/types.hpp"

namespace lobe {

constexpr int max_gauss_legendre_order = 256;

struct QuadratureRule {
  std::vector<Real> nodes;    ///< in [0, 1]
  std::vector<Real> weights;  ///< sum to 1
};

/// The n-point Gauss–Legendre rule mapped to [0, 1]; exact for polynomials of degree 2n−1.
/// Rules are computed once and cached; n from 1 to max_gauss_legendre_order.
const QuadratureRule& gauss_legendre(int n);

}  // namespace lobe
