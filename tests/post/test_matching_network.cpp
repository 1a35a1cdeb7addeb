// Matching-network parts: the closed-form L-sections, the cascade and standard values.
#include <gtest/gtest.h>

#include <cmath>

#include "post/matching_network.hpp"

namespace lobe {
namespace {

// Pozar, Microwave Engineering (4th ed.), example 5.1: Z_L = 200 − j100 ohm matched to a
// 100 ohm line at 500 MHz. Published solutions (to three figures): shunt C = 0.92 pF with
// series L = 38.8 nH, and shunt L = 46.1 nH with series C = 2.61 pF, the shunt part next
// to the load. Within 1 %, the rounding of the published figures.
TEST(LSectionReference, PozarExample51) {
  const Complex load(200.0, -100.0);
  const std::vector<LSection> sections = l_sections(load, 100.0);
  ASSERT_EQ(sections.size(), 2u);  // R > Z0: only the shunt-at-load form exists
  std::vector<std::vector<MatchPart>> found;
  for (const LSection& s : sections) {
    EXPECT_TRUE(s.shunt_at_load);
    found.push_back(l_section_parts(s, 500e6));
    // Each matches exactly at the design frequency (circuit law, 1e-12).
    EXPECT_LT(std::abs(through_parts(load, found.back(), 500e6) - 100.0), 1e-12 * 100.0);
  }
  const auto near = [](Real a, Real b) { return std::abs(a - b) <= 0.01 * b; };
  bool first = false, second = false;
  for (const auto& parts : found) {
    if (parts[0].kind == MatchPartKind::shunt_capacitor && parts[1].kind == MatchPartKind::series_inductor)
      first = near(parts[0].value, 0.92e-12) && near(parts[1].value, 38.8e-9);
    if (parts[0].kind == MatchPartKind::shunt_inductor && parts[1].kind == MatchPartKind::series_capacitor)
      second = near(parts[0].value, 46.1e-9) && near(parts[1].value, 2.61e-12);
  }
  EXPECT_TRUE(first);
  EXPECT_TRUE(second);
}

// Pozar eq. 5.6: a load below Z0 takes the series part next to it; both solutions match.
TEST(LSectionReference, LowResistanceTakesTheSeriesPartFirst) {
  const Complex load(20.0, 15.0);
  int series_first = 0;
  for (const LSection& s : l_sections(load, 50.0)) {
    series_first += !s.shunt_at_load;
    EXPECT_LT(std::abs(through_parts(load, l_section_parts(s, 145e6), 145e6) - 50.0), 1e-12 * 50.0);
  }
  EXPECT_EQ(series_first, 2);
}

// A line of half a wavelength in it repeats its load; an open stub of a quarter wavelength
// across it is a short circuit (Pozar §2.3); 1e-9.
TEST(MatchParts, LinesAndStubs) {
  const Complex load(30.0, -20.0);
  const Real f = 300e6, wavelength_in_line = 0.66 * 299792458.0 / f;
  const MatchPart half{MatchPartKind::line, 0.5 * wavelength_in_line, 75.0, 0.66};
  EXPECT_LT(std::abs(through_parts(load, {half}, f) - load), 1e-9 * std::abs(load));
  const MatchPart quarter_open{MatchPartKind::open_stub, 0.25 * wavelength_in_line, 50.0, 0.66};
  EXPECT_LT(std::abs(through_parts(load, {quarter_open}, f)), 1e-9 * std::abs(load));
}

// IEC 60063:2015 E12 and E24 series.
TEST(PreferredValues, E12AndE24) {
  EXPECT_EQ(preferred_neighbours(4.5e-12, 12), std::make_pair(3.9e-12, 4.7e-12));
  const auto exact = preferred_neighbours(47e-9, 12);
  EXPECT_NEAR(exact.first, 47e-9, 1e-20);
  EXPECT_NEAR(exact.second, 47e-9, 1e-20);
  const auto e24 = preferred_neighbours(5.0e-12, 24);
  EXPECT_NEAR(e24.first, 4.7e-12, 1e-24);
  EXPECT_NEAR(e24.second, 5.1e-12, 1e-24);
  const auto top = preferred_neighbours(9.0, 12);  // above 8.2: the next decade's 10
  EXPECT_NEAR(top.first, 8.2, 1e-12);
  EXPECT_NEAR(top.second, 10.0, 1e-12);
}

}  // namespace
}  // namespace lobe
