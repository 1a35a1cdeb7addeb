// Conductor loss and lumped loads.
#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>

#include "core/constants.hpp"
#include "support/solve_text.hpp"

namespace lobe::testing {
namespace {

constexpr Real copper = 5.8e7;  // S/m, annealed copper (common practice)

// Balanis, Antenna Theory (3rd ed.), ch. 2 (ohmic loss, averaged over a sinusoidal current): a
// half-wave dipole of radius a has loss resistance R_L = (l/(4πa)) √(ωμ0/(2σ)), referred to
// its feed current, P_loss = ½|I_in|² R_L; ±10 %. (The change of the input resistance is not
// R_L at exactly λ/2: the dipole is not resonant there, its current is not in phase along
// the wire, and the wire's internal reactance shifts the input reactance too.)
TEST(LossReference, CopperHalfWaveDipole) {
  const Real l = 0.5, a = 1e-4;
  const Solved lossy = solve_text(dipole_text(l, a, 100) + "conductor all conductivity 5.8e7 S/m\n");
  const Real omega = 2 * pi * one_metre_wavelength_hz;
  const Real reference = l / (4 * pi * a) * std::sqrt(omega * mu0 / (2 * copper));
  const Real loss_resistance = 2 * lossy.result.power.conductor_loss / std::norm(lossy.result.ports[0].current);
  EXPECT_NEAR(loss_resistance, reference, 0.1 * reference);
  // Efficiency R_r/(R_r + R_L) with R_r = R_in − R_L, and the power balance
  // accepted = radiated + conductor loss (1e-3 relative).
  const Real r_in = lossy.port_impedance().real();
  EXPECT_NEAR(lossy.result.power.efficiency(), (r_in - reference) / r_in, 0.1 * reference / r_in);
  expect_power_balance(lossy);
}

// Circuit law: a series resistor at the port adds exactly its resistance; 1e-9 relative.
TEST(LoadReference, SeriesResistorAtPortAddsItsResistance) {
  const std::string dipole = dipole_text(0.5, 1e-4, 50);
  const Complex bare = solve_text(dipole).port_impedance();
  const Complex loaded = solve_text(dipole + "load r on d at middle resistance 25 ohm\n").port_impedance();
  EXPECT_LE(std::abs(loaded - (bare + 25.0)), 1e-9 * std::abs(bare));
}

// Circuit law: a parallel RLC seen in series at the port adds 1/(1/R + 1/(jωL) + jωC).
TEST(LoadReference, ParallelRlcAtPort) {
  const std::string dipole = dipole_text(0.5, 1e-4, 50);
  const Complex bare = solve_text(dipole).port_impedance();
  const Complex loaded =
      solve_text(dipole + "load tank on d at middle resistance 300 ohm inductance 40 nH capacitance 5 pF parallel\n")
          .port_impedance();
  const Real omega = 2 * pi * one_metre_wavelength_hz;
  const Complex z_load = 1.0 / (1.0 / 300.0 + 1.0 / (j_unit * omega * 40e-9) + j_unit * omega * 5e-12);
  EXPECT_LE(std::abs(loaded - (bare + z_load)), 1e-9 * std::abs(bare));
}

// Power balance with a resistor away from the feed: accepted = radiated + load loss.
TEST(LoadReference, PowerBalanceWithOffsetResistor) {
  const Solved s = solve_text(dipole_text(0.5, 1e-4, 50) + "load r on d at 0.3 resistance 50 ohm\n");
  EXPECT_GT(s.result.power.load_loss, 0.0);
  expect_power_balance(s);
}

}  // namespace
}  // namespace lobe::testing
