#include "post/curve_comparison.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include "core/formatted_text.hpp"
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

Real best_frequency_scale(const ReflectionCurve& simulated, const ReflectionCurve& measured, Real low_hz, Real high_hz,
                          Real lowest_scale, Real highest_scale) {
  auto cost = [&](Real s) {
    if (s < lowest_scale || s > highest_scale) return std::numeric_limits<Real>::infinity();
    const Real r = rms_return_loss_difference_db(simulated, measured, low_hz, high_hz, s);
    return std::isnan(r) ? std::numeric_limits<Real>::infinity() : r;
  };
  Real best = std::clamp(1.0, lowest_scale, highest_scale), best_cost = cost(best);
  for (Real s = lowest_scale; s <= highest_scale; s *= 1.001)
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

std::optional<ComplexDifference> complex_difference(const ReflectionCurve& simulated, const ReflectionCurve& measured,
                                                    Real low_hz, Real high_hz, Real reference_ohm) {
  const auto& x = simulated.frequency_hz;
  auto impedance = [&](Complex g) { return reference_ohm * (1.0 + g) / (1.0 - g); };
  ComplexDifference d;
  Real sum = 0.0;
  for (std::size_t i = 0; i < measured.frequency_hz.size(); ++i) {
    const Real f = measured.frequency_hz[i];
    if (f < low_hz || f > high_hz || f < x.front() || f > x.back()) continue;
    const std::size_t k = std::min<std::size_t>(std::upper_bound(x.begin(), x.end(), f) - x.begin(), x.size() - 1);
    const Real t = k == 0 ? 0.0 : (f - x[k - 1]) / (x[k] - x[k - 1]);
    const Complex g_sim = k == 0 ? simulated.reflection.front() : (1 - t) * simulated.reflection[k - 1] + t * simulated.reflection[k];
    const Complex g_meas = measured.reflection[i];
    const Real dg = std::abs(g_meas - g_sim);
    sum += dg * dg;
    if (dg > d.largest_reflection) d.largest_reflection = dg, d.largest_reflection_hz = f;
    // |Γ| = 1 (a short or open in the data) has no finite impedance to compare.
    if (std::abs(1.0 - g_sim) > 1e-9 && std::abs(1.0 - g_meas) > 1e-9) {
      const Complex dz = impedance(g_meas) - impedance(g_sim);
      d.mean_impedance += dz;
      if (std::abs(dz) > d.largest_impedance) d.largest_impedance = std::abs(dz), d.largest_impedance_hz = f;
    }
    ++d.count;
  }
  if (d.count == 0) return std::nullopt;
  d.rms_reflection = std::sqrt(sum / d.count);
  d.mean_impedance /= static_cast<Real>(d.count);
  return d;
}

DipPairing pair_dips(const std::vector<Resonance>& simulated, const std::vector<Resonance>& measured) {
  DipPairing pairing;
  pairing.simulated_unpaired.assign(simulated.size(), "");
  pairing.measured_unpaired.assign(measured.size(), "");
  auto distance = [&](std::size_t s, std::size_t m) {
    return std::abs(std::log(measured[m].frequency_hz / simulated[s].frequency_hz));
  };
  auto in_range = [&](std::size_t s, std::size_t m) {
    const Real ratio = measured[m].frequency_hz / simulated[s].frequency_hz;
    return ratio >= lowest_frequency_scale && ratio <= highest_frequency_scale;
  };
  auto nearest_simulated = [&](std::size_t m) {
    std::size_t best = simulated.size();
    for (std::size_t s = 0; s < simulated.size(); ++s)
      if (in_range(s, m) && (best == simulated.size() || distance(s, m) < distance(best, m))) best = s;
    return best;
  };
  auto nearest_measured = [&](std::size_t s) {
    std::size_t best = measured.size();
    for (std::size_t m = 0; m < measured.size(); ++m)
      if (in_range(s, m) && (best == measured.size() || distance(s, m) < distance(s, best))) best = m;
    return best;
  };
  for (std::size_t m = 0; m < measured.size(); ++m) {
    const std::size_t s = nearest_simulated(m);
    if (s == simulated.size())
      pairing.measured_unpaired[m] = "no simulated dip within a factor 0.8 to 1.25 of its frequency";
    else if (nearest_measured(s) != m)
      pairing.measured_unpaired[m] = "the simulated dip nearest it lies nearer another measured dip";
    else
      pairing.pairs.push_back({s, m});
  }
  for (std::size_t s = 0; s < simulated.size(); ++s) {
    if (std::any_of(pairing.pairs.begin(), pairing.pairs.end(), [&](const DipPairing::Pair& p) { return p.simulated == s; }))
      continue;
    pairing.simulated_unpaired[s] = nearest_measured(s) == measured.size()
                                        ? "no measured dip within a factor 0.8 to 1.25 of its frequency"
                                        : "the measured dip nearest it lies nearer another simulated dip";
  }
  return pairing;
}

ScaleEstimate frequency_scale_estimate(const ReflectionCurve& simulated, const ReflectionCurve& measured, Real low_hz,
                                       Real high_hz, const std::vector<Resonance>& simulated_dips,
                                       const std::vector<Resonance>& measured_dips, const DipPairing& pairing) {
  if (pairing.pairs.empty())
    return {std::nullopt, "no resonance stands out clearly in both curves, so a shift of frequency cannot be told "
                          "from a difference of shape"};
  Real lowest = highest_frequency_scale, highest = lowest_frequency_scale;
  for (const auto& p : pairing.pairs) {
    const Real ratio = measured_dips[p.measured].frequency_hz / simulated_dips[p.simulated].frequency_hz;
    lowest = std::min(lowest, ratio), highest = std::max(highest, ratio);
  }
  if (highest / lowest - 1 > scale_spread_limit)
    return {std::nullopt, formatted("the paired dips shift by factors from %.4f to %.4f: no single scale explains them", lowest,
                                        highest)};
  // Fit the whole curve near what the dips say, and refuse a fit that runs to the bound.
  const Real search_low = std::max(lowest_frequency_scale, lowest / (1 + scale_spread_limit));
  const Real search_high = std::min(highest_frequency_scale, highest * (1 + scale_spread_limit));
  const Real scale = best_frequency_scale(simulated, measured, low_hz, high_hz, search_low, search_high);
  if (scale <= search_low * 1.0005 || scale >= search_high / 1.0005)
    return {std::nullopt, "the curves fit best at the edge of the range the dips allow, so the fit does not "
                          "confirm them"};
  return {scale, ""};
}

}  // namespace lobe
