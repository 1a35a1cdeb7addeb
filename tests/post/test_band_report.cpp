// Band figures on a series RLC resonance, whose reflection is known in closed form.
#include <gtest/gtest.h>

#include <cmath>

#include "core/constants.hpp"
#include "post/band_report.hpp"
#include "post/port_quantities.hpp"
#include "post/run_summary.hpp"

namespace lobe {
namespace {

constexpr Real z0 = 50.0, resistance = 50.0, f0 = 1e9, quality = 10.0;
const Real inductance = quality * resistance / (2 * pi * f0);
const Real capacitance = 1.0 / ((2 * pi * f0) * (2 * pi * f0) * inductance);

Complex impedance(Real f) {
  const Real w = 2 * pi * f;
  return {resistance, w * inductance - 1.0 / (w * capacitance)};
}
Real magnitude(Real f) { return std::abs(reflection_coefficient(impedance(f), z0)); }

/// Where the reactance equals x: ωL − 1/(ωC) = x solved for ω > 0.
Real frequency_of_reactance(Real x) {
  const Real w = (x + std::sqrt(x * x + 4 * inductance / capacitance)) / (2 * inductance);
  return w / (2 * pi);
}

/// The band edges where |Γ| = g: with R = Z0, |Γ| = |X| / √(4R² + X²), so |X| = 2Rg/√(1 − g²).
std::array<Real, 2> where_magnitude_is(Real g) {
  const Real x = 2 * resistance * g / std::sqrt(1 - g * g);
  return {frequency_of_reactance(-x), frequency_of_reactance(x)};
}

/// ∫ h(f) df / (b − a) by the composite midpoint rule with a million points.
template <class F>
Real average(F h, Real a, Real b) {
  constexpr int n = 1000000;
  Real sum = 0.0;
  for (int i = 0; i < n; ++i) sum += h(a + (i + 0.5) * (b - a) / n);
  return sum / n;
}

ReflectionCurve sampled(Real low, Real high, int intervals) {
  ReflectionCurve curve;
  for (int i = 0; i <= intervals; ++i) {
    const Real f = low + (high - low) * i / intervals;
    curve.frequency_hz.push_back(f);
    curve.reflection.push_back(reflection_coefficient(impedance(f), z0));
  }
  return curve;
}

TEST(BandReport, MatchesTheClosedFormOfASeriesResonance) {
  const Real low = 0.97e9, high = 1.03e9;
  const PortBandReport r = band_report(sampled(0.9e9, 1.1e9, 1200), low, high, 2.0);
  EXPECT_NEAR(r.lowest_vswr.value, 1.0, 1e-12);
  EXPECT_NEAR(r.lowest_vswr.frequency_hz, f0, 1.0);
  const Real edge = std::max(vswr_from_reflection(magnitude(low)), vswr_from_reflection(magnitude(high)));
  EXPECT_NEAR(r.highest_vswr.value, edge, 1e-9 * edge);
  const auto within = where_magnitude_is(1.0 / 3.0);
  EXPECT_NEAR(r.fraction_within, (std::min(high, within[1]) - std::max(low, within[0])) / (high - low), 1e-4);
  ASSERT_TRUE(r.return_loss_10db.has_value());
  const auto ten_db = where_magnitude_is(std::pow(10.0, -0.5));
  EXPECT_NEAR(r.return_loss_10db->low_hz, ten_db[0], 1e-5 * f0);
  EXPECT_NEAR(r.return_loss_10db->high_hz, ten_db[1], 1e-5 * f0);
  EXPECT_FALSE(r.return_loss_10db->open_low || r.return_loss_10db->open_high);
  const Real mean_vswr = average([](Real f) { return vswr_from_reflection(magnitude(f)); }, low, high);
  const Real mean_loss = average([](Real f) { return mismatch_loss_db(magnitude(f)); }, low, high);
  EXPECT_NEAR(r.mean_vswr, mean_vswr, 1e-4 * mean_vswr);
  EXPECT_NEAR(r.mean_mismatch_loss_db, mean_loss, 1e-3 * mean_loss);
}

// Coarse, uneven sampling still reports the same band within the interpolation error, and
// a band reaching past the samples is reported over the covered part only.
TEST(BandReport, UnevenSamplesAndPartialCover) {
  ReflectionCurve curve = sampled(0.9e9, 1.1e9, 80);
  curve.frequency_hz.erase(curve.frequency_hz.begin() + 41, curve.frequency_hz.begin() + 45);
  curve.reflection.erase(curve.reflection.begin() + 41, curve.reflection.begin() + 45);
  const PortBandReport r = band_report(curve, 0.97e9, 1.03e9);
  const Real exact = average([](Real f) { return vswr_from_reflection(magnitude(f)); }, 0.97e9, 1.03e9);
  EXPECT_NEAR(r.mean_vswr, exact, 0.02 * exact);
  const PortBandReport partial = band_report(curve, 1.05e9, 1.2e9);
  EXPECT_DOUBLE_EQ(partial.covered_low_hz, 1.05e9);
  EXPECT_DOUBLE_EQ(partial.covered_high_hz, 1.1e9);
  // The share under VSWR 2 is of the covered third and says so on its line, never "of the band".
  EXPECT_NEAR(partial.covered_share, 1.0 / 3.0, 1e-12);
  const std::string share = share_within_text(partial);
  EXPECT_NE(share.find("of the covered 33% of the band"), std::string::npos) << share;
  EXPECT_EQ(share_within_text(r).find("covered"), std::string::npos) << share_within_text(r);
  EXPECT_THROW(band_report(curve, 1.2e9, 1.3e9), std::invalid_argument);
  // Sampled only where the return loss exceeds 10 dB: the stretch is open at both ends.
  const PortBandReport narrow = band_report(sampled(0.999e9, 1.001e9, 10), 0.9995e9, 1.0005e9);
  ASSERT_TRUE(narrow.return_loss_10db.has_value());
  EXPECT_TRUE(narrow.return_loss_10db->open_low && narrow.return_loss_10db->open_high);
}

}  // namespace
}  // namespace lobe
