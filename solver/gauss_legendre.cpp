#include "solver/gauss_legendre.hpp"

#include <array>
#include <cmath>
#include <mutex>

#include "core/check.hpp"
#include "core/constants.hpp"

namespace lobe {
namespace {

/// Newton iteration on P_n from the Chebyshev-like first guess (Abramowitz & Stegun 25.4.29).
QuadratureRule compute_rule(int n) {
  QuadratureRule rule;
  rule.nodes.resize(n);
  rule.weights.resize(n);
  for (int i = 0; i < n; ++i) {
    Real x = std::cos(pi * (i + 0.75) / (n + 0.5));
    Real derivative = 0.0;
    for (int iteration = 0; iteration < 100; ++iteration) {
      Real p0 = 1.0, p1 = x;
      for (int k = 2; k <= n; ++k) {
        const Real p2 = ((2 * k - 1) * x * p1 - (k - 1) * p0) / k;
        p0 = p1;
        p1 = p2;
      }
      if (n == 1) p0 = 1.0;
      derivative = n * (x * p1 - p0) / (x * x - 1.0);
      const Real step = p1 / derivative;
      x -= step;
      if (std::abs(step) < 1e-16) break;
    }
    rule.nodes[i] = 0.5 * (1.0 - x);
    rule.weights[i] = 1.0 / ((1.0 - x * x) * derivative * derivative);
  }
  return rule;
}

}  // namespace

const QuadratureRule& gauss_legendre(int n) {
  LOBE_CHECK(n >= 1 && n <= max_gauss_legendre_order, "Gauss-Legendre order out of range");
  static std::array<QuadratureRule, max_gauss_legendre_order + 1> rules;
  static std::array<std::once_flag, max_gauss_legendre_order + 1> once;
  std::call_once(once[n], [n] { rules[n] = compute_rule(n); });
  return rules[n];
}

}  // namespace lobe
