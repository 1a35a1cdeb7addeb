// A flat strip dipole driven across a line on the plate, against the project's own wire
// solver at the equivalent radius. Lengths are in wavelengths (λ = 1 m).
#include <gtest/gtest.h>

#include <cstdio>
#include <functional>

#include "support/solve_text.hpp"

namespace lobe::testing {
namespace {

constexpr Real strip_width = 0.01;
constexpr Real equivalent_radius = strip_width / 4;

std::string strip_text(Real length) {
  char text[512];
  std::snprintf(text, sizeof text,
                "plate s rectangle corner (%.17g, %.17g, 0) size (%.17g, %.17g)\n"
                "mesh s size %.17g\n"
                "port feed on s along (0, %.17g, 0) to (0, %.17g, 0)\n"
                "frequency %.17g Hz\n",
                -length / 2, -strip_width / 2, length, strip_width, strip_width / 2, -strip_width / 2,
                strip_width / 2, one_metre_wavelength_hz);
  return text;
}

Complex strip_impedance(Real length) {
  const Solved s = solve_text(strip_text(length));
  expect_power_balance(s);
  return s.port_impedance();
}

Complex wire_impedance(Real length) {
  // 24 segments keep each above 8 radii (about 8 a at 0.48 λ).
  const Solved s = solve_text(dipole_text(length, equivalent_radius, 24));
  return s.port_impedance();
}

/// The length at which the input reactance crosses zero, by the secant method.
Real resonant_length(const std::function<Complex(Real)>& impedance) {
  Real l0 = 0.46, l1 = 0.49;
  Real x0 = impedance(l0).imag(), x1 = impedance(l1).imag();
  for (int i = 0; i < 20 && std::abs(l1 - l0) > 1e-6; ++i) {
    const Real l2 = l1 - x1 * (l1 - l0) / (x1 - x0);
    l0 = l1;
    x0 = x1;
    l1 = l2;
    x1 = impedance(l1).imag();
  }
  return l1;
}

// A flat strip of width w radiates like a round wire of radius a = w/4 (Balanis, Antenna
// Theory, ch. 9, equivalent radius of a thin strip; from memory). The tolerances:
// resonant length ±2 %, resistance at resonance ±5 %.
TEST(StripDipoleReference, ResonatesLikeTheEquivalentWire) {
  const Real strip = resonant_length(strip_impedance), wire = resonant_length(wire_impedance);
  std::printf("resonant length: strip %.5f, wire (a = w/4) %.5f wavelengths\n", strip, wire);
  EXPECT_NEAR(strip, wire, 0.02 * wire);
  const Real r_strip = strip_impedance(strip).real(), r_wire = wire_impedance(wire).real();
  std::printf("R at resonance: strip %.3f, wire %.3f ohm\n", r_strip, r_wire);
  EXPECT_NEAR(r_strip, r_wire, 0.05 * r_wire);
}

std::string strip_at(const std::string& name, Real length, Real height) {
  char text[512];
  std::snprintf(text, sizeof text,
                "plate %s rectangle corner (%.17g, %.17g, %.17g) size (%.17g, %.17g)\n"
                "mesh %s size %.17g\n"
                "port %s_feed on %s along (0, %.17g, %.17g) to (0, %.17g, %.17g)\n",
                name.c_str(), -length / 2, -strip_width / 2, height, length, strip_width, name.c_str(), strip_width / 2,
                name.c_str(), name.c_str(), -strip_width / 2, height, strip_width / 2, height);
  return text;
}

// Image theory for plates: a horizontal strip a quarter wavelength over a perfect ground
// sees its image as a second strip at −h carrying the opposite current, so its impedance
// is Z11 − Z12 of the pair in free space. 1e-3 relative: the two solutions mesh the same
// rectangle and differ only by rounding and the mesher's placement of the second strip.
TEST(StripDipoleReference, OverGroundEqualsThePairWithItsImage) {
  constexpr Real length = 0.47, height = 0.25;
  char frequency[64];
  std::snprintf(frequency, sizeof frequency, "frequency %.17g Hz\n", one_metre_wavelength_hz);
  const Solved over_ground = solve_text("ground perfect\n" + strip_at("s", length, height) + frequency);
  expect_power_balance(over_ground);
  const Solved pair = solve_text(strip_at("s", length, height) + strip_at("image", length, -height) + frequency);
  const Complex z_ground = over_ground.port_impedance(), z_pair = pair.result.z_matrix(0, 0) - pair.result.z_matrix(0, 1);
  std::printf("over ground %.4f %+.4fj ohm; Z11 - Z12 of the pair %.4f %+.4fj ohm\n", z_ground.real(), z_ground.imag(),
              z_pair.real(), z_pair.imag());
  EXPECT_LT(std::abs(z_ground - z_pair), 1e-3 * std::abs(z_pair));
}

}  // namespace
}  // namespace lobe::testing
