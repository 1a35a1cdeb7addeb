// Mutual impedance of two parallel side-by-side half-wave dipoles (λ = 1 m).
#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>

#include "support/solve_text.hpp"

namespace lobe::testing {
namespace {

Complex mutual_impedance(Real spacing) {
  char text[512];
  std::snprintf(text, sizeof text,
                "units m\n"
                "wire one from (0, 0, -0.25) to (0, 0, 0.25) radius 1e-4 segments 50\n"
                "wire two from (%.17g, 0, -0.25) to (%.17g, 0, 0.25) radius 1e-4 segments 50\n"
                "port p1 on one at middle\n"
                "port p2 on two at middle voltage 0 V\n"
                "frequency %.17g Hz\n",
                spacing, spacing, one_metre_wavelength_hz);
  const Solved s = solve_text(text);
  expect_power_balance(s);
  // Reciprocity: Z₁₂ = Z₂₁ to 1e-6 relative (the tolerance).
  EXPECT_LE(std::abs(s.result.z_matrix(0, 1) - s.result.z_matrix(1, 0)), 1e-6 * std::abs(s.result.z_matrix(0, 1)));
  return s.result.z_matrix(1, 0);
}

/// Within 20 % of |Z| of the induced-EMF value, and with the same signs of R and X.
void expect_close(Complex computed, Complex reference) {
  EXPECT_LE(std::abs(computed - reference), 0.2 * std::abs(reference)) << computed;
  EXPECT_EQ(std::signbit(computed.real()), std::signbit(reference.real())) << computed;
  EXPECT_EQ(std::signbit(computed.imag()), std::signbit(reference.imag())) << computed;
}

// Balanis, Antenna Theory (3rd ed.), Fig. 8.19 / eq. 8-71 (induced EMF, side by side):
// Z₂₁ = −12.5 − j29.9 Ω at d = 0.5 λ.
TEST(MutualImpedanceReference, HalfWavelengthSpacing) { expect_close(mutual_impedance(0.5), {-12.5, -29.9}); }

// Same source: Z₂₁ = 4.0 + j17.7 Ω at d = 1.0 λ.
TEST(MutualImpedanceReference, OneWavelengthSpacing) { expect_close(mutual_impedance(1.0), {4.0, 17.7}); }

}  // namespace
}  // namespace lobe::testing
