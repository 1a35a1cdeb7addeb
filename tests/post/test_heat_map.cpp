// The sweep map: every case a cell coloured by how good it is, the best one outlined, and
// a document any XML parser accepts.
#include <gtest/gtest.h>

#include <cmath>

#include "post/svg_chart.hpp"
#include "support/xml_check.hpp"

namespace lobe {
namespace {

/// The fill colour of the cell whose tooltip is `tooltip`.
std::string cell_colour(const std::string& svg, const std::string& tooltip) {
  const auto title = svg.find("<title>" + tooltip + "</title>");
  if (title == std::string::npos) return "missing";
  const auto fill = svg.rfind("fill=\"", title);
  return svg.substr(fill + 6, 7);
}

HeatMap two_by_three() {
  HeatMap map;
  map.title = "worst VSWR over a band";
  map.x_label = "length";
  map.y_label = "rod";
  map.value_label = "worst VSWR";
  map.x_ticks = {"160 mm", "165 mm", "170 mm"};
  map.y_ticks = {"0.5", "2"};
  map.values = {{1.9, 1.2, 7.0}, {1.5, std::nan(""), 2.5}};
  map.colour_limit = 5.0;
  return map;
}

TEST(HeatMap, BestIsBrightWorstIsDarkAndMissingCasesAreGrey) {
  const std::string svg = heat_map_svg(two_by_three());
  EXPECT_EQ(testing::xml_error(svg), "");
  EXPECT_EQ(cell_colour(svg, "165 mm, 0.5: 1.2"), "#fde725");  // the best, top of the scale
  EXPECT_EQ(cell_colour(svg, "170 mm, 0.5: 7"), "#440154");    // beyond the limit: the worst colour
  EXPECT_EQ(cell_colour(svg, "165 mm, 2: no case"), "#e6e6e6");
  EXPECT_NE(cell_colour(svg, "170 mm, 2: 2.5"), "#440154");    // inside the limit: not the worst
  EXPECT_NE(svg.find("&#8805; 5"), std::string::npos);         // the clipped end of the colour bar
  // One outline, around the best cell (column 1 of the bottom row).
  const auto outline = svg.find("stroke-width=\"3\"");
  ASSERT_NE(outline, std::string::npos);
  EXPECT_EQ(svg.find("stroke-width=\"3\"", outline + 1), std::string::npos);
}

TEST(HeatMap, LargerIsBetterTurnsTheScaleOver) {
  HeatMap map = two_by_three();
  map.larger_is_better = true;
  map.colour_limit.reset();
  const std::string svg = heat_map_svg(map);
  EXPECT_EQ(cell_colour(svg, "170 mm, 0.5: 7"), "#fde725");
  EXPECT_EQ(cell_colour(svg, "165 mm, 0.5: 1.2"), "#440154");
  EXPECT_EQ(svg.find("&#8805;"), std::string::npos);
}

TEST(HeatMap, NamesAreEscaped) {
  HeatMap map = two_by_three();
  map.x_label = "a<b & c";
  EXPECT_EQ(testing::xml_error(heat_map_svg(map)), "");
  EXPECT_NE(testing::xml_error("<svg><g></svg>"), "");  // the checker itself can fail
}

}  // namespace
}  // namespace lobe
