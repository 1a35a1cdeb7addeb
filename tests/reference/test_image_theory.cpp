// A perfect ground plane by image theory, against the equivalent free-space structures.
#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>

#include "support/solve_text.hpp"

namespace lobe::testing {
namespace {

/// Image theory is exact, and the images are integrated with the same rules as real
/// segments, so only rounding separates the two sides (the 1e-6 relative).
constexpr Real image_tolerance = 1e-6;

// Image theory: a monopole of n segments on a perfect ground is half of the free-space
// dipole of 2n segments, Z_mono = Z_dip / 2.
TEST(ImageTheoryReference, MonopoleIsHalfTheDipole) {
  const int n = 25;
  char text[512];
  std::snprintf(text, sizeof text,
                "units m\nground perfect\n"
                "wire m from (0, 0, 0) to (0, 0, 0.25) radius 1e-4 segments %d\n"
                "port feed on m at start\nfrequency %.17g Hz\n",
                n, one_metre_wavelength_hz);
  const Solved monopole_case = solve_text(text);
  expect_power_balance(monopole_case);
  const Complex monopole = monopole_case.port_impedance();
  const Complex dipole = solve_text(dipole_text(0.5, 1e-4, 2 * n)).port_impedance();
  EXPECT_LE(std::abs(monopole - dipole / 2.0), image_tolerance * std::abs(monopole)) << monopole << " " << dipole;
}

// Image theory: a horizontal dipole at height h over a perfect ground sees its image
// at −h with the opposite current, Z_in = Z₁₁ − Z₁₂ of the free-space pair at spacing 2h.
TEST(ImageTheoryReference, HorizontalDipoleOverGround) {
  const Real h = 0.2;
  char text[512];
  std::snprintf(text, sizeof text,
                "units m\nground perfect\n"
                "wire d from (-0.24, 0, %.17g) to (0.24, 0, %.17g) radius 1e-4 segments 40\n"
                "port feed on d at middle\nfrequency %.17g Hz\n",
                h, h, one_metre_wavelength_hz);
  const Solved over_ground_case = solve_text(text);
  expect_power_balance(over_ground_case);
  const Complex over_ground = over_ground_case.port_impedance();
  std::snprintf(text, sizeof text,
                "units m\n"
                "wire up from (-0.24, 0, %.17g) to (0.24, 0, %.17g) radius 1e-4 segments 40\n"
                "wire down from (-0.24, 0, %.17g) to (0.24, 0, %.17g) radius 1e-4 segments 40\n"
                "port p1 on up at middle\nport p2 on down at middle\nfrequency %.17g Hz\n",
                h, h, -h, -h, one_metre_wavelength_hz);
  const Solved pair = solve_text(text);
  const Complex expected = pair.result.z_matrix(0, 0) - pair.result.z_matrix(0, 1);
  EXPECT_LE(std::abs(over_ground - expected), image_tolerance * std::abs(expected)) << over_ground << " " << expected;
}

}  // namespace
}  // namespace lobe::testing
