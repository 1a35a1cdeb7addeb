// A small loop against the closed-form small-loop results (λ = 1 m).
#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>

#include "core/constants.hpp"
#include "support/solve_text.hpp"

namespace lobe::testing {
namespace {

constexpr Real circumference = 0.05;  // λ
constexpr Real wire_radius = 1e-4;    // λ
/// Polygon sides: segment length ≈ 21 radii, inside the thin-wire range.
constexpr int sides = 24;

/// A polygon of `sides` equal sides with the area of the circle of the given circumference,
/// fed at its closing joint.
Solved solve_loop() {
  const Real b = circumference / (2 * pi);
  // (n/2) r² sin(2π/n) = π b² gives the circumradius r of the equal-area polygon.
  const Real r = b * std::sqrt(2 * pi / (sides * std::sin(2 * pi / sides)));
  char text[512];
  std::snprintf(text, sizeof text,
                "units m\n"
                "arc loop center (0, 0, 0) normal (0, 0, 1) from (%.17g, 0, 0) angle 360 deg radius %.17g segments %d\n"
                "port feed on loop at start\n"
                "frequency %.17g Hz\n",
                r, wire_radius, sides, one_metre_wavelength_hz);
  return solve_text(text);
}

// Balanis, Antenna Theory (3rd ed.), eq. 5-24: R_r = 20π²(C/λ)⁴ for a small loop; ±6 %.
TEST(SmallLoopReference, RadiationResistance) {
  const Real reference = 20 * pi * pi * std::pow(circumference, 4);
  const Solved s = solve_loop();
  EXPECT_NEAR(s.port_impedance().real(), reference, 0.06 * reference);
  expect_power_balance(s);
}

// Balanis ch. 5: a loop of radius b has external inductance μ0 b (ln(8b/a) − 2), so
// X = ωμ0 b (ln(8b/a) − 2); ±3 %.
TEST(SmallLoopReference, Reactance) {
  const Real b = circumference / (2 * pi);
  const Real omega = 2 * pi * one_metre_wavelength_hz;
  const Real reference = omega * mu0 * b * (std::log(8 * b / wire_radius) - 2.0);
  EXPECT_NEAR(solve_loop().port_impedance().imag(), reference, 0.03 * reference);
}

}  // namespace
}  // namespace lobe::testing
