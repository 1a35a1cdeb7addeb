#pragma once
/// Handbook formulas for rectangular microstrip patches (Balanis, Antenna Theory, 3rd ed.,
/// ch. 14), for the reference tests. Lengths in metres.
#include <cmath>

#include "core/constants.hpp"
#include "core/types.hpp"

namespace lobe::testing {

/// Hammerstad's effective permittivity of a patch of width W on height h (eq. 14-1).
inline Real effective_permittivity(Real width, Real height, Real permittivity) {
  return 0.5 * (permittivity + 1) + 0.5 * (permittivity - 1) / std::sqrt(1 + 12 * height / width);
}

/// Hammerstad's fringing extension ΔL of each radiating edge (eq. 14-2).
inline Real fringing_extension(Real width, Real height, Real permittivity) {
  const Real effective = effective_permittivity(width, height, permittivity);
  return 0.412 * height * (effective + 0.3) * (width / height + 0.264) / ((effective - 0.258) * (width / height + 0.8));
}

/// Resonance of the transmission-line model with Hammerstad's fringing extension (eqs. 14-1,
/// 14-2, 14-6, 14-7): f_r = c / (2 (L + 2ΔL) √ε_reff).
inline Real transmission_line_resonance_hz(Real length, Real width, Real height, Real permittivity) {
  const Real extension = fringing_extension(width, height, permittivity);
  return speed_of_light / (2 * (length + 2 * extension) * std::sqrt(effective_permittivity(width, height, permittivity)));
}

}  // namespace lobe::testing
