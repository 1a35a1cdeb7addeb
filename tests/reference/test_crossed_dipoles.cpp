// Circular polarisation of crossed dipoles in quadrature, and its hand.
#include <gtest/gtest.h>

#include <cstdio>

#include "core/constants.hpp"
#include "support/solve_text.hpp"

namespace lobe::testing {
namespace {

Solved crossed_dipoles(const char* y_phase) {
  char text[640];
  std::snprintf(text, sizeof text,
                "units m\n"
                "wire x from (-0.24, 0, 0) to (0.24, 0, 0) radius 1e-3 segments 24\n"
                "wire y from (0, -0.24, 0) to (0, 0.24, 0) radius 1e-3 segments 24\n"
                "port px on x at middle\n"
                "port py on y at middle phase %s\n"
                "frequency %.17g Hz\n"
                "pattern theta 0 to 180 step 180 phi 0 to 0 step 1\n",
                y_phase, one_metre_wavelength_hz);
  Solved s = solve_text(text);
  expect_power_balance(s);
  return s;
}

// IEEE Std 145-2013 (definitions of terms for antennas): right-hand polarisation rotates
// clockwise seen looking in the direction of propagation. With exp(+jωt), E = x̂ − jŷ
// (y fed 90° behind x) rotates from x toward y: right-hand toward +z, left-hand toward −z.
// Two identical orthogonal dipoles do not couple, so the axial ratio at zenith is ~0 dB
// (the bound: < 0.05 dB).
TEST(CrossedDipolesReference, QuadratureFeedGivesRightHandUpward) {
  const Solved s = crossed_dipoles("-90 deg");
  const PatternResult& p = s.result.pattern;
  EXPECT_EQ(static_cast<Hand>(p.hand(0, 0)), Hand::right);  // θ = 0, toward +z
  EXPECT_EQ(static_cast<Hand>(p.hand(1, 0)), Hand::left);   // θ = 180°, toward −z
  EXPECT_LT(p.axial_ratio_db(0, 0), 0.05);
  EXPECT_GT(p.rhcp_dbi(0, 0) - p.lhcp_dbi(0, 0), 30.0);
}

// Feeding y ahead of x instead reverses both hands.
TEST(CrossedDipolesReference, OppositeQuadratureGivesLeftHandUpward) {
  const Solved s = crossed_dipoles("90 deg");
  EXPECT_EQ(static_cast<Hand>(s.result.pattern.hand(0, 0)), Hand::left);
  EXPECT_EQ(static_cast<Hand>(s.result.pattern.hand(1, 0)), Hand::right);
}

}  // namespace
}  // namespace lobe::testing
