#pragma once
/// The axial-mode helix reference case, shared by its tests (λ = 1 m).
#include <cmath>
#include <cstdio>

#include "core/constants.hpp"
#include "support/solve_text.hpp"

namespace lobe::testing {

constexpr Real circumference = 1.0;  // λ
constexpr Real spacing = 0.25;       // pitch, λ
constexpr int turns = 10;

/// A right-hand helix, fed through a short vertical wire from the ground plane, wire
/// radius 5e-3 λ, 24 segments a turn (segment ≈ 8.6 radii).
inline Solved solve_helix() {
  const Real diameter = circumference / pi;
  const Real feed_height = 0.03;
  char text[768];
  std::snprintf(text, sizeof text,
                "units m\nground perfect\n"
                "wire feed from (%.17g, 0, 0) to (%.17g, 0, %.17g) radius 5e-3 segments 2\n"
                "helix coil base (0, 0, %.17g) axis (0, 0, 1) diameter %.17g pitch %.17g turns %d hand right "
                "radius 5e-3 segments %d\n"
                "port p on feed at start\nfrequency %.17g Hz\n"
                "pattern theta 0 to 90 step 0.5 phi 0 to 90 step 90\n",
                diameter / 2, diameter / 2, feed_height, feed_height, diameter, spacing, turns, 24 * turns,
                one_metre_wavelength_hz);
  return solve_text(text);
}

/// Angle from the axis at which the total gain falls 3 dB below its on-axis value.
inline Real half_power_angle(const PatternResult& p, int phi_index) {
  const Real axis = p.gain_dbi(0, phi_index);
  for (std::size_t i = 1; i < p.thetas.size(); ++i)
    if (p.gain_dbi(i, phi_index) < axis - 3.0) {
      const Real g0 = p.gain_dbi(i - 1, phi_index), g1 = p.gain_dbi(i, phi_index);
      const Real t = (axis - 3.0 - g0) / (g1 - g0);
      return p.thetas[i - 1] + t * (p.thetas[i] - p.thetas[i - 1]);
    }
  return pi / 2;
}

/// The half-power beamwidth, degrees: twice the mean half-angle of the φ = 0° and 90° planes.
inline Real helix_beamwidth_deg(const PatternResult& p) {
  return (half_power_angle(p, 0) + half_power_angle(p, 1)) * 180.0 / pi;
}

/// Kraus, Antennas (2nd ed.), ch. 7: HPBW ≈ 52° / ((C/λ) √(N S/λ)).
inline Real kraus_beamwidth_deg() { return 52.0 / (circumference * std::sqrt(turns * spacing)); }

}  // namespace lobe::testing
