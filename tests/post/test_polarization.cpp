#include <gtest/gtest.h>

#include <cmath>

#include "core/constants.hpp"
#include "post/polarization.hpp"

namespace lobe {
namespace {

// IEEE Std 145: with exp(+jωt), E_θ = 1, E_φ = −j rotates from θ̂ toward φ̂, i.e.
// counter-clockwise about the direction of travel r̂ = θ̂ × φ̂: right-hand circular.
TEST(Polarization, RightHandCircular) {
  const CircularComponents c = circular_components(1.0, -j_unit);
  EXPECT_NEAR(std::abs(c.left), 0.0, 1e-15);
  EXPECT_NEAR(std::abs(c.right), std::sqrt(2.0), 1e-15);
  EXPECT_EQ(polarization_hand(c), Hand::right);
  EXPECT_NEAR(axial_ratio_db(c), 0.0, 1e-12);
}

TEST(Polarization, LeftHandCircular) {
  EXPECT_EQ(polarization_hand(circular_components(1.0, j_unit)), Hand::left);
}

// An ellipse with semi-axes 1 and 0.5 has axial ratio 2, 6.02 dB (definition).
TEST(Polarization, EllipticalAxialRatio) {
  const CircularComponents c = circular_components(1.0, -0.5 * j_unit);
  EXPECT_NEAR(axial_ratio_db(c), 20 * std::log10(2.0), 1e-12);
  EXPECT_EQ(polarization_hand(c), Hand::right);
}

TEST(Polarization, LinearIsCappedAndHasNoHand) {
  const CircularComponents c = circular_components(1.0, 0.0);
  EXPECT_EQ(axial_ratio_db(c), axial_ratio_ceiling_db);
  EXPECT_EQ(polarization_hand(c), Hand::linear);
}

// Power is shared between the two hands: |E_R|² + |E_L|² = |E_θ|² + |E_φ|².
TEST(Polarization, ComponentsConservePower) {
  const Complex et(0.3, -1.2), ep(0.7, 0.4);
  const CircularComponents c = circular_components(et, ep);
  EXPECT_NEAR(std::norm(c.right) + std::norm(c.left), std::norm(et) + std::norm(ep), 1e-14);
}

}  // namespace
}  // namespace lobe
