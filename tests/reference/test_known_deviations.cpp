// Reference checks that this solver is known to fail, kept at the tolerance and
// run on every build. Each asserts that the disagreement still stands, so it fails the day
// the solver agrees (and the explanation beside it must be revisited) and, unlike an
// inverted result, also when the computation itself fails or throws.
#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>

#include "reference/helix_case.hpp"

namespace lobe::testing {
namespace {

// Kraus, Antennas (2nd ed.), ch. 7: HPBW ≈ 52° / ((C/λ) √(N S/λ)) = 32.9° for C = 1 λ,
// S = 0.25 λ, N = 10; the issue asks ±20 %. The solver gives about 45°, between the
// Hansen–Woodyard (38.6°) and ordinary (69°) end-fire limits; see test_helix.cpp.
TEST(KnownDeviation, HelixBeamwidthAgainstKrausFormula) {
  const Solved solved = solve_helix();
  const Real reference = kraus_beamwidth_deg();
  const Real beamwidth = helix_beamwidth_deg(solved.result.pattern);
  ASSERT_TRUE(std::isfinite(beamwidth));
  std::printf("helix beamwidth %.1f deg, Kraus's formula %.1f deg\n", beamwidth, reference);
  EXPECT_GT(std::abs(beamwidth - reference), 0.2 * reference) << "the known deviation is gone: revisit DEVELOPERS.md";
}

}  // namespace
}  // namespace lobe::testing
