#include <gtest/gtest.h>

#include <cmath>

#include "solver/gauss_legendre.hpp"

namespace lobe {
namespace {

// An n-point Gauss–Legendre rule integrates x^k exactly for k ≤ 2n − 1 (any numerical
// analysis text, e.g. Abramowitz & Stegun 25.4.29); ∫₀¹ x^k dx = 1/(k+1).
TEST(GaussLegendre, ExactForPolynomialsUpToDegree2nMinus1) {
  for (int n : {1, 2, 4, 6, 8, 16, 64, 200}) {
    const QuadratureRule& rule = gauss_legendre(n);
    for (int k = 0; k <= std::min(2 * n - 1, 60); ++k) {
      Real sum = 0.0;
      for (int i = 0; i < n; ++i) sum += rule.weights[i] * std::pow(rule.nodes[i], k);
      EXPECT_NEAR(sum, 1.0 / (k + 1), 1e-13) << "n=" << n << " k=" << k;
    }
  }
}

TEST(GaussLegendre, NodesAreSymmetric) {
  const QuadratureRule& rule = gauss_legendre(7);
  for (int i = 0; i < 7; ++i) EXPECT_NEAR(rule.nodes[i] + rule.nodes[6 - i], 1.0, 1e-15);
}

}  // namespace
}  // namespace lobe
