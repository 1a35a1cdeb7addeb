#pragma once
/// Where a measured reflection curve departs from the simulated one, and by how much.
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

/// The frequency-scale factor s in [0.8, 1.25] for which measured(f) ≈ simulated(f / s)
/// fits best over [low, high] (scan at 0.1 % steps, then golden-section refinement).
/// s < 1: the built antenna resonates lower, as if its lengths were 1/s times the model's.
Real best_frequency_scale(const ReflectionCurve& simulated, const ReflectionCurve& measured, Real low_hz, Real high_hz);

}  // namespace lobe
