// The charts' geometry: axes hold every curve, legends fit their labels, curves of several
// ports differ in colour, dash and marker, and a curve past fixed limits is named.
#include <gtest/gtest.h>

#include <regex>
#include <set>

#include "post/svg_chart.hpp"
#include "support/xml_check.hpp"

namespace lobe {
namespace {

/// Every "x,y" pair of every polyline of the document.
std::vector<std::pair<double, double>> polyline_points(const std::string& svg) {
  std::vector<std::pair<double, double>> points;
  const std::regex polyline("<polyline[^>]* points=\"([^\"]*)\"");
  const std::regex pair(R"((-?[0-9.]+),(-?[0-9.]+))");
  for (std::sregex_iterator p(svg.begin(), svg.end(), polyline), end; p != end; ++p) {
    const std::string list = (*p)[1];
    for (std::sregex_iterator q(list.begin(), list.end(), pair); q != end; ++q)
      points.emplace_back(std::stod((*q)[1]), std::stod((*q)[2]));
  }
  return points;
}

// A measured curve wider and higher than the simulated one still lies wholly inside the
// plot box (78..696 by 44..384 in the 720 × 440 document): the axes take every curve.
TEST(SvgChart, AxesHoldEveryCurve) {
  LineChart chart{"model: return loss", "frequency (MHz)", "return loss (dB)", {}, {}, std::nullopt, std::nullopt, {}};
  chart.series.push_back({"simulated, port feed", {430, 435, 440}, {5, 30, 5}, series_style(0)});
  chart.series.push_back({"measured (return loss)", {400, 435, 470}, {1, 45, 2}, {"#333333", "3 3", ""}});
  const std::string svg = line_chart_svg(chart);
  EXPECT_EQ(testing::xml_error(svg), "");
  const auto points = polyline_points(svg);
  ASSERT_EQ(points.size(), 6u);
  for (const auto& [x, y] : points) {
    EXPECT_GE(x, 78.0 - 1e-6);
    EXPECT_LE(x, 696.0 + 1e-6);
    EXPECT_GE(y, 44.0 - 1e-6);
    EXPECT_LE(y, 384.0 + 1e-6);
  }
  EXPECT_EQ(svg.find("beyond the axis"), std::string::npos);
}

// With fixed limits (VSWR drawn up to 10), a curve that leaves them is named above the plot.
TEST(SvgChart, ACurvePastFixedLimitsIsNamed) {
  LineChart chart{"model: VSWR", "frequency (MHz)", "VSWR", {}, {}, 1.0, 10.0, {}};
  chart.series.push_back({"measured", {1, 2, 3}, {30, 1.5, 2}, series_style(0)});
  EXPECT_NE(line_chart_svg(chart).find("beyond the axis at some frequencies: measured"), std::string::npos);
}

// The legend's card is as wide as its longest label needs (7.2 px a character at 13 px,
// plus the sample line) and stays inside the document.
TEST(SvgChart, LegendFitsItsLabels) {
  LineChart chart{"model: VSWR", "f", "VSWR", {}, {}, std::nullopt, std::nullopt, {}};
  const std::string label = "measured (complex S11 (Touchstone)), a long label from an analyser";
  chart.series.push_back({label, {1, 2}, {1, 2}, series_style(0)});
  const std::string svg = line_chart_svg(chart);
  const std::regex card("<rect x=\"([0-9.]+)\" y=\"[0-9.]+\" width=\"([0-9.]+)\" height=\"[0-9.]+\" fill=\"white\" fill-opacity");
  std::smatch m;
  ASSERT_TRUE(std::regex_search(svg, m, card));
  EXPECT_GE(std::stod(m[2]), 7.2 * label.size());
  EXPECT_GE(std::stod(m[1]), 0.0);
  EXPECT_LE(std::stod(m[1]) + std::stod(m[2]), 720.0);
}

TEST(SvgChart, SeriesStylesDifferInColourDashAndMarker) {
  std::set<std::string> colours, dashes, markers;
  for (std::size_t i = 0; i < 4; ++i) {
    const CurveStyle s = series_style(i);
    colours.insert(s.colour), dashes.insert(s.dash), markers.insert(s.marker);
  }
  EXPECT_EQ(colours.size(), 4u);
  EXPECT_EQ(dashes.size(), 4u);
  EXPECT_EQ(markers.size(), 4u);
}

}  // namespace
}  // namespace lobe
