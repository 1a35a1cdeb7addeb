// Reference checks that this solver is known to fail, kept at the tolerance and
// run on every build. ctest inverts their result (WILL_FAIL): they show as passing while
// the disagreement stands, and as failing the day the solver agrees, so that the
// explanation beside each is revisited rather than silently outdated.
#include <gtest/gtest.h>

#include "reference/helix_case.hpp"

namespace lobe::testing {
namespace {

// Kraus, Antennas (2nd ed.), ch. 7: HPBW ≈ 52° / ((C/λ) √(N S/λ)) = 32.9° for C = 1 λ,
// S = 0.25 λ, N = 10; the issue asks ±20 %. The solver gives about 45°, between the
// Hansen–Woodyard (38.6°) and ordinary (69°) end-fire limits; see test_helix.cpp.
TEST(KnownDeviation, HelixBeamwidthAgainstKrausFormula) {
  const Solved solved = solve_helix();
  const Real reference = kraus_beamwidth_deg();
  EXPECT_NEAR(helix_beamwidth_deg(solved.result.pattern), reference, 0.2 * reference);
}

}  // namespace
}  // namespace lobe::testing
