// Axial-mode helix over a ground plane against Kraus's design formulas (λ = 1 m).
#include <gtest/gtest.h>

#include "reference/helix_case.hpp"

namespace lobe::testing {
namespace {

class HelixReference : public ::testing::Test {
 protected:
  static void SetUpTestSuite() { solved = new Solved(solve_helix()); }
  static void TearDownTestSuite() { delete solved; }
  static Solved* solved;
};
Solved* HelixReference::solved = nullptr;

// Kraus, Antennas (2nd ed.), ch. 7: an axial-mode helix radiates circular polarisation of
// the hand of its winding along its axis, with axial ratio (2N+1)/2N (0.42 dB for N = 10);
// the issue accepts < 1.5 dB.
TEST_F(HelixReference, RightHandCircularOnAxis) {
  const PatternResult& p = solved->result.pattern;
  EXPECT_EQ(static_cast<Hand>(p.hand(0, 0)), Hand::right);
  EXPECT_LT(p.axial_ratio_db(0, 0), 1.5);
}

// Kraus ch. 7: terminal resistance R ≈ 140 (C/λ) Ω; ±25 %.
TEST_F(HelixReference, TerminalResistance) {
  EXPECT_NEAR(solved->port_impedance().real(), 140.0 * circumference, 0.25 * 140.0 * circumference);
}

// Beamwidth. Kraus's empirical HPBW formula (52° / ((C/λ) √(N S/λ)) = 32.9° here) is checked
// at the issue's ±20 % in test_known_deviations, where it is recorded as failing: this
// solver finds about 45°. The disagreement is physical, not numerical: the result is
// converged in segments per turn, and Kraus's formula asks for a beam narrower than a
// uniform end-fire array of the helix's length can make even under the Hansen–Woodyard
// condition (38.6°); it is the beamwidth counterpart of his gain formula 15 N S (C/λ)²,
// which is known to promise several dB more than helices deliver. What physics does
// bound: the beam of a traveling-wave helix lies between the Hansen–Woodyard and the
// ordinary end-fire beamwidths of an array of length L = N S (Balanis, Antenna Theory,
// ch. 6, end-fire arrays: 2 acos(1 − 0.1398 λ/L) and 2 acos(1 − 0.4428 λ/L); from memory).
TEST_F(HelixReference, BeamwidthBetweenEndFireLimits) {
  const Real length = turns * spacing;
  const Real hansen_woodyard = 2 * std::acos(1 - 0.1398 / length) * 180 / pi;
  const Real ordinary = 2 * std::acos(1 - 0.4428 / length) * 180 / pi;
  const Real hpbw = helix_beamwidth_deg(solved->result.pattern);
  EXPECT_GT(hpbw, hansen_woodyard);
  EXPECT_LT(hpbw, ordinary);
}

TEST_F(HelixReference, PowerBalance) { expect_power_balance(*solved); }

}  // namespace
}  // namespace lobe::testing
