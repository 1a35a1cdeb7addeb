// Goals and limits of sweeps and tuning on crafted designs: which meet the limits, the
// order of those that do not, weighted sums, and refusals of malformed text.
#include <gtest/gtest.h>

#include <algorithm>

#include "core/input_error.hpp"
#include "study/design_goal.hpp"

namespace lobe {
namespace {

/// A design with these band figures (worst VSWR; worst axial ratio and front-to-back, the
/// latter undefined when negative).
BandFigures design(Real worst_vswr, Real worst_axial_ratio, Real front_to_back) {
  BandFigures f;
  f.port.highest_vswr.value = worst_vswr;
  f.beam["axial-ratio"] = {worst_axial_ratio, worst_axial_ratio, 0.0};
  if (front_to_back >= 0) f.beam["front-to-back"] = {front_to_back, front_to_back, 0.0};
  return f;
}

// The example: lowest worst-VSWR subject to axial ratio ≤ 3 dB and front-to-back
// ≥ 15 dB. The best match (1.1) fails the axial ratio and ranks behind every design that
// meets both; failing designs follow by how far they miss (relative to each bound).
TEST(DesignGoal, ConstrainedRankingPutsDesignsMeetingTheLimitsFirst) {
  const DesignGoal goal = parse_design_goal("worst-vswr", "--rank");
  const std::vector<DesignLimit> limits{parse_design_limit("worst-axial-ratio<=3", 1),
                                        parse_design_limit("worst-front-to-back >= 15", 2)};
  const std::vector<BandFigures> designs{
      design(1.1, 8.0, 20.0),   // 0: best match, axial ratio misses by 5 (5/3)
      design(1.6, 2.5, 18.0),   // 1: meets both
      design(1.4, 2.9, 16.0),   // 2: meets both, better match
      design(1.3, 3.3, 15.0),   // 3: misses by 0.3 (0.1)
      design(1.2, 2.0, -1.0),   // 4: front-to-back not defined
      design(1.5, 4.0, 10.0)};  // 5: misses by 1 (1/3) and 5 (5/15)
  std::vector<std::size_t> order{0, 1, 2, 3, 4, 5};
  std::vector<Judgement> judged;
  for (const auto& d : designs) judged.push_back(judge(goal, limits, d));
  std::stable_sort(order.begin(), order.end(),
                   [&](std::size_t a, std::size_t b) { return judged_better(judged[a], judged[b], limits); });
  EXPECT_EQ(order, (std::vector<std::size_t>{2, 1, 3, 5, 0, 4}));
  EXPECT_TRUE(judged[2].meets());
  EXPECT_FALSE(judged[3].meets());
  EXPECT_NEAR(*judged[3].misses[0], 0.3, 1e-12);
  EXPECT_EQ(misses_text(judged[3], limits), "misses worst-axial-ratio<=3 by 0.3");
  EXPECT_EQ(misses_text(judged[4], limits), "misses worst-front-to-back >= 15 (not defined)");
  EXPECT_NEAR(*limits[0].excess(designs[2]), -0.1, 1e-12);  // met, with 0.1 dB to spare
}

TEST(DesignGoal, ALargerIsBetterFigureRanksLargestFirst) {
  const DesignGoal goal = parse_design_goal("worst-front-to-back", "--rank");
  EXPECT_LT(*goal.cost(design(2, 1, 20)), *goal.cost(design(2, 1, 10)));
  EXPECT_EQ(*goal.value(design(2, 1, 20)), 20.0);
}

TEST(DesignGoal, AWeightedSumIsMinimisedWithItsSigns) {
  const DesignGoal goal = parse_design_goal("worst-vswr + 0.5*worst-axial-ratio - 0.1*worst-front-to-back", "--goal");
  ASSERT_EQ(goal.terms.size(), 3u);
  EXPECT_TRUE(goal.needs_beam());
  EXPECT_NEAR(*goal.cost(design(1.5, 2.0, 20.0)), 1.5 + 1.0 - 2.0, 1e-12);
  EXPECT_FALSE(goal.value(design(1.5, 2.0, -1.0)).has_value());
  EXPECT_FALSE(parse_design_goal("mean-vswr", "--goal").needs_beam());
}

TEST(DesignGoal, MalformedGoalsAndLimitsAreInputErrorsAtTheirOption) {
  auto location = [](auto parse) {
    try {
      parse();
    } catch (const InputError& e) {
      return e.formatted();
    }
    return std::string("accepted");
  };
  EXPECT_EQ(location([] { parse_design_goal("worst-vswr + x*mean-vswr", "--goal"); }).rfind("--goal:1:1: ", 0), 0u);
  EXPECT_NE(location([] { parse_design_goal("best-vswr", "--rank"); }).find("not a band figure"), std::string::npos);
  EXPECT_NE(location([] { parse_design_goal("2*worst-vswr", "--rank"); }).find("takes no weight"), std::string::npos);
  EXPECT_EQ(location([] { parse_design_limit("worst-axial-ratio<3", 2); }).rfind("--limit:2:1: ", 0), 0u);
  EXPECT_NE(location([] { parse_design_limit("worst-axial-ratio<=nan", 1); }).find("not a number"), std::string::npos);
  EXPECT_NE(location([] { parse_design_limit("axial-ratio<=3", 1); }).find("not a band figure"), std::string::npos);
}

}  // namespace
}  // namespace lobe
