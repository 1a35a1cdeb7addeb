// A quarter-wave monopole at the centre of a square ground plate, against the same monopole
// on an infinite perfect ground. Lengths are in wavelengths (λ = 1 m).
#include <gtest/gtest.h>

#include <cstdio>

#include "support/solve_text.hpp"

namespace lobe::testing {
namespace {

constexpr Real height = 0.2367;
constexpr Real radius = 1.0 / 300;
/// About eight triangle edges per wavelength away from the feed (the mesher halves it
/// around the attachment point), to keep the 4 λ plate near 5,000 unknowns.
constexpr Real plate_mesh = 0.125;

std::string monopole_text(Real side) {
  char text[512];
  if (side == 0.0) {
    std::snprintf(text, sizeof text,
                  "ground perfect\nwire whip from (0, 0, 0) to (0, 0, %.17g) radius %.17g segments 5\n"
                  "port feed on whip at start\nfrequency %.17g Hz\n",
                  height, radius, one_metre_wavelength_hz);
  } else {
    std::snprintf(text, sizeof text,
                  "plate floor rectangle corner (%.17g, %.17g, 0) size (%.17g, %.17g)\nmesh floor size %.17g\n"
                  "wire whip from (0, 0, 0) to (0, 0, %.17g) radius %.17g segments 5\n"
                  "port feed on whip at start\nfrequency %.17g Hz\n",
                  -side / 2, -side / 2, side, side, plate_mesh, height, radius, one_metre_wavelength_hz);
  }
  return text;
}

// Image theory: a monopole over an infinite perfect ground has half the impedance of the
// dipole it forms with its image, and a finite plate tends to that as it grows. The issue's
// tolerance: within 10 % at a side of 4 λ, the difference shrinking with size.
TEST(MonopoleOnPlateReference, TendsToTheInfiniteGroundAsThePlateGrows) {
  const Solved infinite = solve_text(monopole_text(0.0));
  const Complex z_infinite = infinite.port_impedance();
  std::printf("infinite ground: %.3f %+.3fj ohm\n", z_infinite.real(), z_infinite.imag());
  Real previous = 1e300;
  for (Real side : {1.0, 2.0, 4.0}) {
    const Solved plate = solve_text(monopole_text(side));
    expect_power_balance(plate);
    const Complex z = plate.port_impedance();
    const Real difference = std::abs(z - z_infinite) / std::abs(z_infinite);
    std::printf("plate %.0f lambda: %.3f %+.3fj ohm, %.2f %% from the infinite ground\n", side, z.real(), z.imag(),
                100 * difference);
    EXPECT_LT(difference, previous) << "side " << side;
    previous = difference;
  }
  EXPECT_LT(previous, 0.10);
}

}  // namespace
}  // namespace lobe::testing
