#pragma once
/// Where a measured reflection curve departs from the simulated one, and by how much.
#include <optional>
#include <string>
#include <vector>

#include "post/band_report.hpp"

namespace lobe {

/// A dip of |S11|: a sample below both neighbours, refined by a parabola through the
/// three return losses (dB) around it.
struct Resonance {
  Real frequency_hz = 0.0;
  Real return_loss_db = 0.0;
};

/// A dip must stand this far (dB of return loss) above the ground separating it from any
/// deeper dip, so that ripple on a measured curve does not count as resonances.
constexpr Real minimum_dip_prominence_db = 3.0;

/// Dips with at least `minimum_return_loss_db` at the bottom and the prominence above.
std::vector<Resonance> resonances(const ReflectionCurve& curve, Real minimum_return_loss_db = 3.0);

/// RMS difference of the return losses (dB, each capped at return_loss_compare_cap_db so
/// that two deep nulls of different depth do not swamp the rest) at the measured
/// frequencies in [low, high], with the simulated curve interpolated at f / scale: how
/// well the simulation matches once its frequency axis is stretched by `scale`.
/// NaN when no measured frequency falls where both curves are defined.
Real rms_return_loss_difference_db(const ReflectionCurve& simulated, const ReflectionCurve& measured, Real low_hz,
                                   Real high_hz, Real scale = 1.0);

/// Return losses deeper than this compare as this (dB).
constexpr Real return_loss_compare_cap_db = 40.0;

/// The frequency-scale factor s in [low, high] (default the search range) for which measured(f) ≈ simulated(f / s)
/// fits best over [low, high] (scan at 0.1 % steps, then golden-section refinement).
/// s < 1: the built antenna resonates lower, as if its lengths were 1/s times the model's.
Real best_frequency_scale(const ReflectionCurve& simulated, const ReflectionCurve& measured, Real low_hz, Real high_hz,
                          Real lowest_scale = 0.8, Real highest_scale = 1.25);

/// Where both curves carry phase: how far apart they lie on the Smith chart (|ΔΓ|) and in
/// impedance (measured − simulated), at the measured frequencies in [low, high] with the
/// simulated Γ interpolated linearly (complex) between its frequencies.
struct ComplexDifference {
  std::size_t count = 0;  ///< measured frequencies compared
  Real rms_reflection = 0.0, largest_reflection = 0.0, largest_reflection_hz = 0.0;
  Complex mean_impedance;  ///< ohm: a steady ΔX hints at a connector's or lead's series reactance
  Real largest_impedance = 0.0, largest_impedance_hz = 0.0;  ///< |ΔZ|, ohm
};
/// None when no measured frequency in [low, high] falls within the simulated curve.
std::optional<ComplexDifference> complex_difference(const ReflectionCurve& simulated, const ReflectionCurve& measured,
                                                    Real low_hz, Real high_hz, Real reference_ohm);

/// The frequency-scale search range: a build off by more than this is another antenna.
constexpr Real lowest_frequency_scale = 0.8, highest_frequency_scale = 1.25;

/// Dips of the two curves paired one to one: each pair is the nearest of each other (in
/// frequency ratio) within the scale search range. Every dip left unpaired says why.
struct DipPairing {
  struct Pair {
    std::size_t simulated, measured;
  };
  std::vector<Pair> pairs;
  std::vector<std::string> simulated_unpaired, measured_unpaired;  ///< per dip, empty when paired
};
DipPairing pair_dips(const std::vector<Resonance>& simulated, const std::vector<Resonance>& measured);

/// Paired dips shifted by factors further apart than this are no uniform frequency scale.
constexpr Real scale_spread_limit = 0.02;

/// The frequency scale, only where it can be told: at least one resonance clear in both
/// curves (a pair), the pairs agreeing on one factor within scale_spread_limit, and the
/// fitted factor inside the search range, not at its bound. Otherwise none, and why.
struct ScaleEstimate {
  std::optional<Real> scale;
  std::string reason;  ///< why there is none
};
ScaleEstimate frequency_scale_estimate(const ReflectionCurve& simulated, const ReflectionCurve& measured, Real low_hz,
                                       Real high_hz, const std::vector<Resonance>& simulated_dips,
                                       const std::vector<Resonance>& measured_dips, const DipPairing& pairing);

}  // namespace lobe
