// lobe report writes one self-contained page that a real browser (headless Chromium) lays
// out with every plot visible: each figure's region of the screenshot carries ink and
// colour, for a single result and for a sweep.
#include <gtest/gtest.h>

#include <algorithm>
#include <fstream>
#include <regex>

#include "cli/run_process.hpp"
#include "support/browser_render.hpp"
#include "support/xml_check.hpp"

namespace lobe::testing {
namespace {

const std::string models = std::string(LOBE_SOURCE_DIR) + "/models/";

/// Every inline SVG of the page parses on its own, and the page (written as well-formed
/// XML) parses too.
void expect_well_formed(const std::string& html) {
  EXPECT_EQ(xml_error(html), "");
  const std::regex svg("<svg[\\s\\S]*?</svg>");
  int count = 0;
  for (std::sregex_iterator m(html.begin(), html.end(), svg), end; m != end; ++m, ++count)
    EXPECT_EQ(xml_error(m->str()), "") << "figure " << count;
  EXPECT_GT(count, 0);
}

/// Each expected figure laid out at a sensible size and visibly drawn: more than 1 % of its
/// pixels inked (axes, grid, text; a blank figure has none, see the control below) and some
/// in colour (its curves or cells).
void expect_visible(const RenderedPage& page, const std::vector<std::string>& expected) {
  ASSERT_EQ(page.error, "");
  for (const auto& id : expected) {
    const auto f = std::find_if(page.figures.begin(), page.figures.end(), [&](const RenderedFigure& r) { return r.id == id; });
    ASSERT_NE(f, page.figures.end()) << id << " is not on the page";
    EXPECT_GT(f->width, 300) << id;
    EXPECT_GT(f->height, 200) << id;
    EXPECT_LE(f->y + f->height, page.page_height) << id;
    EXPECT_GT(f->ink_share, 0.01) << id;
    EXPECT_GT(f->coloured_pixels, 200u) << id;
  }
}

// The control: the measure tells a blank figure (a white SVG with only a faint frame) from
// a drawn one, so the checks below can fail.
TEST(Report, ABlankFigureIsSeenAsBlank) {
  const auto dir = fresh_directory("report-blank");
  const auto page = dir / "blank.html";
  std::ofstream(page) << "<!DOCTYPE html><html><body><figure id=\"figure-blank\"><svg xmlns=\"http://www.w3.org/2000/svg\" "
                         "width=\"720\" height=\"440\"><rect width=\"720\" height=\"440\" fill=\"white\" "
                         "stroke=\"#e4e4e4\"/></svg></figure></body></html>";
  const RenderedPage rendered = render_figures(page, dir / "browser");
  ASSERT_EQ(rendered.error, "");
  ASSERT_EQ(rendered.figures.size(), 1u);
  EXPECT_LT(rendered.figures[0].ink_share, 0.001);
  EXPECT_EQ(rendered.figures[0].coloured_pixels, 0u);
}

TEST(Report, OneResultPageShowsTheSummaryAndEveryPlot) {
  const auto dir = fresh_directory("report");
  ASSERT_EQ(run_lobe("run '" + models + "ground_plane_433.lobe' -o '" + (dir / "gp").string() + "'", dir).exit_code, 0);
  const ProcessResult r = run_lobe("report '" + (dir / "gp" / "ground_plane_433.h5").string() + "' --measured '" + models +
                                       "ground_plane_433_measured.csv' -o '" + (dir / "page").string() + "'",
                                   dir);
  ASSERT_EQ(r.exit_code, 0) << r.err;
  const auto page = dir / "page" / "ground_plane_433-report.html";
  const std::string html = read_text(page);
  expect_well_formed(html);
  // Offline: nothing is fetched from anywhere (the only address is SVG's namespace name).
  std::size_t addresses = 0, namespaces = 0;
  for (std::size_t at = html.find("http"); at != std::string::npos; at = html.find("http", at + 1)) ++addresses;
  for (std::size_t at = html.find("xmlns=\"http://www.w3.org/2000/svg\""); at != std::string::npos;
       at = html.find("xmlns=\"http://www.w3.org/2000/svg\"", at + 1))
    ++namespaces;
  EXPECT_EQ(addresses, namespaces);
  EXPECT_EQ(html.find("src="), std::string::npos);
  EXPECT_EQ(html.find("href="), std::string::npos);
  EXPECT_NE(html.find("band ism433"), std::string::npos);  // the band report, in the summary
  EXPECT_NE(html.find("Cautions:"), std::string::npos);
  expect_visible(render_figures(page, dir / "browser"),
                 {"figure-vswr", "figure-return_loss", "figure-smith", "figure-pattern_vertical", "figure-pattern_horizontal"});
}

TEST(Report, SweepPageShowsTheBestCasesAndTheMap) {
  const auto dir = fresh_directory("report-sweep");
  ASSERT_EQ(run_lobe("sweep '" + models + "half_wave_dipole_ism.lobe' --vary length=150mm:170mm:5mm --vary rod=0.5,2 -o '" +
                         (dir / "s.h5").string() + "'", dir).exit_code, 0);
  const ProcessResult r = run_lobe("report '" + (dir / "s.h5").string() + "'", dir);
  ASSERT_EQ(r.exit_code, 0) << r.err;
  const auto page = dir / "s-report.html";
  const std::string html = read_text(page);
  expect_well_formed(html);
  EXPECT_NE(html.find("Best cases by worst VSWR"), std::string::npos);
  EXPECT_NE(html.find("<td>case-0000"), std::string::npos);
  expect_visible(render_figures(page, dir / "browser"), {"figure-map"});
}

}  // namespace
}  // namespace lobe::testing
