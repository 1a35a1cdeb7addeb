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

/// Balanis's design (eqs. 14-6 to 14-8): W = c/(2f) √(2/(εr + 1)), L from the
/// transmission-line model; and the resonance the same model gives for that L. Metres, Hz.
struct PatchDesign {
  Real width, length, predicted_hz;
};
inline PatchDesign transmission_line_design(Real permittivity, Real height, Real design_hz) {
  const Real width = speed_of_light / (2 * design_hz) * std::sqrt(2 / (permittivity + 1));
  const Real effective = effective_permittivity(width, height, permittivity);
  const Real length =
      speed_of_light / (2 * design_hz * std::sqrt(effective)) - 2 * fringing_extension(width, height, permittivity);
  return {width, length, transmission_line_resonance_hz(length, width, height, permittivity)};
}

/// ∫₀^π f(θ) dθ by the composite Simpson rule on 2000 panels (the integrands below are smooth).
template <class F>
Real integral_over_half_turn(F f) {
  constexpr int panels = 2000;
  const Real step = pi / panels;
  Real sum = f(0.0) + f(pi);
  for (int i = 1; i < panels; ++i) sum += (i % 2 ? 4.0 : 2.0) * f(i * step);
  return sum * step / 3.0;
}

/// sin(x cos θ)/cos θ, with its limit x at θ = 90°.
inline Real slot_factor(Real x, Real theta) {
  const Real c = std::cos(theta);
  return std::abs(c) < 1e-12 ? x : std::sin(x * c) / c;
}

/// The conductance of one radiating slot of width W (eq. 14-12): G1 = I1/(120π²),
/// I1 = ∫₀^π sin²(k0 W cos θ/2)/cos² θ sin³ θ dθ.
inline Real slot_conductance(Real width, Real frequency_hz) {
  const Real k0 = 2 * pi * frequency_hz / speed_of_light;
  return integral_over_half_turn([&](Real t) {
           const Real s = slot_factor(0.5 * k0 * width, t), st = std::sin(t);
           return s * s * st * st * st;
         }) /
         (120 * pi * pi);
}

/// The mutual conductance of the two slots L apart (eq. 14-18a):
/// G12 = (1/(120π²)) ∫₀^π [sin(k0 W cos θ/2)/cos θ]² J0(k0 L sin θ) sin³ θ dθ.
inline Real slot_mutual_conductance(Real width, Real length, Real frequency_hz) {
  const Real k0 = 2 * pi * frequency_hz / speed_of_light;
  return integral_over_half_turn([&](Real t) {
           const Real s = slot_factor(0.5 * k0 * width, t), st = std::sin(t);
           return s * s * std::cyl_bessel_j(0.0, k0 * length * st) * st * st * st;
         }) /
         (120 * pi * pi);
}

/// The cavity model's resonant input resistance of the dominant mode at the distance y0
/// from a radiating edge (eqs. 14-17 and 14-20a): cos²(π y0/L)/(2 (G1 + G12)).
inline Real cavity_input_resistance(Real width, Real length, Real frequency_hz, Real inset) {
  const Real c = std::cos(pi * inset / length);
  return c * c / (2 * (slot_conductance(width, frequency_hz) + slot_mutual_conductance(width, length, frequency_hz)));
}

/// The cavity model's radiation Q (eq. 14-88c): Q_rad = 2ωε K/(h G_t/l) with K = L/4 for the
/// dominant mode and the radiating edges' conductance per unit length G_t/l = 2 (G1 + G12)/W
/// (the conductance the input-resistance formula sees).
inline Real cavity_radiation_q(Real width, Real length, Real height, Real permittivity, Real frequency_hz) {
  const Real omega = 2 * pi * frequency_hz;
  const Real conductance =
      2 * (slot_conductance(width, frequency_hz) + slot_mutual_conductance(width, length, frequency_hz)) / width;
  return 2 * omega * eps0 * permittivity * (length / 4) / (height * conductance);
}

/// The radiation efficiency of the cavity model with dielectric loss (eqs. 14-88a, b):
/// 1/Q = 1/Q_rad + 1/Q_d, Q_d = 1/tan δ, efficiency Q/Q_rad. Surface waves and conductor
/// loss are not counted.
inline Real cavity_radiation_efficiency(Real width, Real length, Real height, Real permittivity, Real loss_tangent,
                                        Real frequency_hz) {
  return 1 / (1 + cavity_radiation_q(width, length, height, permittivity, frequency_hz) * loss_tangent);
}

/// The cavity model's conductor Q (eq. 14-88b), Q_c = h √(π f μ0 σ), counts the patch and
/// the ground alike; the patch's own share of the loss is half, Q_c,patch = 2 Q_c.
inline Real cavity_patch_conductor_q(Real height, Real conductivity, Real frequency_hz) {
  return 2 * height * std::sqrt(pi * frequency_hz * mu0 * conductivity);
}

}  // namespace lobe::testing
