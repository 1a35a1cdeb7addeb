#pragma once
/// Renders an HTML page in a real browser (headless Chromium, from Debian) and measures what
/// each <figure> shows, so a test can tell that every plot is on the page and not blank.
#include <filesystem>
#include <string>
#include <vector>

namespace lobe::testing {

struct RenderedFigure {
  std::string id;
  int x = 0, y = 0, width = 0, height = 0;  ///< the figure's SVG box on the page, CSS px
  double ink_share = 0.0;                   ///< of its pixels, those clearly not white
  std::size_t coloured_pixels = 0;          ///< pixels of a saturated colour (the curves, the map)
};

struct RenderedPage {
  std::string error;  ///< empty when the browser ran and the screenshot was read
  int page_height = 0;
  std::vector<RenderedFigure> figures;
};

/// Lays out `page` at 1100 px wide in headless Chromium, reads each figure's box from the
/// laid-out page (a copy with a measuring script appended, in `scratch`), takes a
/// screenshot of the whole page and measures each box in it (libpng).
RenderedPage render_figures(const std::filesystem::path& page, const std::filesystem::path& scratch);

}  // namespace lobe::testing
