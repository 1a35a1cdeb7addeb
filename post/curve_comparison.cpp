#include "post/curve_comparison.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include "post/port_quantities.hpp"

namespace lobe {
namespace {

Real capped_return_loss(Real magnitude) { return std::min(return_loss_db(magnitude), return_loss_compare_cap_db); }

/// |Γ| interpolated linearly at f; nullopt-like NaN outside the curve.
Real magnitude_at(const ReflectionCurve& c, Real f) {
  const auto& x = c.frequency_hz;
  if (f < x.front() || f > x.back()) return std::numeric_limits<Real>::quiet_NaN();
  const std::size_t i = std::min<std::size_t>(std::upper_bound(x.begin(), x.end(), f) - x.begin(), x.size() - 1);
  if (i == 0) return std::abs(c.reflection.front());
  const Real t = (f - x[i - 1]) / (x[i] - x[i - 1]);
  return (1 - t) * std::abs(c.reflection[i - 1]) + t * std::abs(c.reflection[i]);
}

}  // namespace

std::vector<Resonance> resonances(const ReflectionCurve& curve, Real minimum_return_loss_db) {
  std::vector<Resonance> found;
  const auto& f = curve.frequency_hz;
  std::vector<Real> loss;
  for (const Complex& g : curve.reflection) loss.push_back(return_loss_db(std::abs(g)));
  // A dip's prominence: how far it rises above the higher of the lowest points between it
  // and the nearest deeper dip on either side (or the curve's end).
  auto prominence = [&](std::size_t i) {
    Real left = loss[i], right = loss[i];
    for (std::size_t j = i; j-- > 0 && loss[j] <= loss[i];) left = std::min(left, loss[j]);
    for (std::size_t j = i + 1; j < loss.size() && loss[j] <= loss[i]; ++j) right = std::min(right, loss[j]);
    return loss[i] - std::max(left, right);
  };
  for (std::size_t i = 1; i + 1 < f.size(); ++i) {
    const Real a = loss[i - 1], b = loss[i], c = loss[i + 1];
    if (!(b > a && b >= c) || b < minimum_return_loss_db || prominence(i) < minimum_dip_prominence_db) continue;
    // Vertex of the parabola through the three points (unequal spacing allowed).
    const Real x0 = f[i - 1] - f[i], x2 = f[i + 1] - f[i];
    const Real denominator = x0 * x2 * (x0 - x2);
    const Real p = ((a - b) * x2 - (c - b) * x0) / denominator;  // curvature term
    const Real q = ((c - b) * x0 * x0 - (a - b) * x2 * x2) / denominator;
    const Real shift = p != 0.0 ? std::clamp(-q / (2 * p), x0, x2) : 0.0;
    found.push_back({f[i] + shift, b + q * shift + p * shift * shift});
  }
  return found;
}

Real rms_return_loss_difference_db(const ReflectionCurve& simulated, const ReflectionCurve& measured, Real low_hz,
                                   Real high_hz, Real scale) {
  Real sum = 0.0;
  int count = 0;
  for (std::size_t i = 0; i < measured.frequency_hz.size(); ++i) {
    const Real f = measured.frequency_hz[i];
    if (f < low_hz || f > high_hz) continue;
    const Real g = magnitude_at(simulated, f / scale);
    if (std::isnan(g)) continue;
    const Real d = capped_return_loss(g) - capped_return_loss(std::abs(measured.reflection[i]));
    sum += d * d;
    ++count;
  }
  return count ? std::sqrt(sum / count) : std::numeric_limits<Real>::quiet_NaN();
}

Real best_frequency_scale(const ReflectionCurve& simulated, const ReflectionCurve& measured, Real low_hz, Real high_hz) {
  auto cost = [&](Real s) {
    const Real r = rms_return_loss_difference_db(simulated, measured, low_hz, high_hz, s);
    return std::isnan(r) ? std::numeric_limits<Real>::infinity() : r;
  };
  Real best = 1.0, best_cost = cost(1.0);
  for (Real s = 0.8; s <= 1.25; s *= 1.001)
    if (const Real c = cost(s); c < best_cost) best = s, best_cost = c;
  // Golden section on the bracket around the best scan point.
  const Real golden = 0.5 * (std::sqrt(5.0) - 1);
  Real a = best / 1.001, b = best * 1.001;
  Real x1 = b - golden * (b - a), x2 = a + golden * (b - a), c1 = cost(x1), c2 = cost(x2);
  for (int i = 0; i < 40; ++i) {
    if (c1 < c2) b = x2, x2 = x1, c2 = c1, x1 = b - golden * (b - a), c1 = cost(x1);
    else a = x1, x1 = x2, c1 = c2, x2 = a + golden * (b - a), c2 = cost(x2);
  }
  const Real refined = 0.5 * (a + b);
  return cost(refined) <= best_cost ? refined : best;
}

}  // namespace lobe
