#include "support/browser_render.hpp"

#include <png.h>

#include <algorithm>
#include <cstdio>
#include <cstdlib>
#include <fstream>
#include <memory>
#include <regex>
#include <sstream>

namespace lobe::testing {
namespace {

constexpr int page_width = 1100;

std::string text_of(const std::filesystem::path& path) {
  std::ifstream in(path, std::ios::binary);
  std::ostringstream s;
  s << in.rdbuf();
  return s.str();
}

/// Runs headless Chromium with `arguments`, standard output to `out`; its exit status.
int chromium(const std::string& arguments, const std::filesystem::path& out) {
  const std::string command = "timeout 120 chromium --headless --no-sandbox --disable-gpu --hide-scrollbars "
                              "--force-device-scale-factor=1 " + arguments + " > '" + out.string() + "' 2>/dev/null";
  return std::system(command.c_str());
}

struct Image {
  int width = 0, height = 0;
  std::vector<unsigned char> rgba;
};

/// The screenshot decoded to 8-bit RGBA by libpng's simplified API.
bool read_png(const std::filesystem::path& path, Image& image) {
  png_image png{};
  png.version = PNG_IMAGE_VERSION;
  if (!png_image_begin_read_from_file(&png, path.c_str())) return false;
  png.format = PNG_FORMAT_RGBA;
  image.width = static_cast<int>(png.width), image.height = static_cast<int>(png.height);
  image.rgba.resize(PNG_IMAGE_SIZE(png));
  if (!png_image_finish_read(&png, nullptr, image.rgba.data(), 0, nullptr)) return false;
  return true;
}

}  // namespace

RenderedPage render_figures(const std::filesystem::path& page, const std::filesystem::path& scratch) {
  RenderedPage result;
  std::filesystem::create_directories(scratch);
  // A copy that reports each figure's box, and the page's height, once laid out.
  std::string html = text_of(page);
  const std::string script =
      "<script>\n"
      "const lines = [];\n"
      "for (const f of document.querySelectorAll('figure')) {\n"
      "  const r = f.querySelector('svg').getBoundingClientRect();\n"
      "  lines.push(['box', f.id, Math.round(r.left), Math.round(r.top + window.scrollY), Math.round(r.width), "
      "Math.round(r.height)].join(' '));\n"
      "}\n"
      "lines.push('height ' + document.documentElement.scrollHeight);\n"
      "const pre = document.createElement('pre'); pre.id = 'layout'; pre.textContent = lines.join('\\n');\n"
      "document.body.appendChild(pre);\n"
      "</script>\n";
  const auto end = html.rfind("</body>");
  if (end == std::string::npos) return {"the page has no </body>", 0, {}};
  html.insert(end, script);
  const auto measured = scratch / "measured.html";
  std::ofstream(measured) << html;
  const auto dom = scratch / "dom.html";
  if (chromium("--window-size=" + std::to_string(page_width) + ",1000 --dump-dom 'file://" + measured.string() + "'", dom) != 0)
    return {"chromium could not lay out the page (is it installed? scripts/setup installs it)", 0, {}};
  const std::string laid_out = text_of(dom);
  const std::regex box(R"(box (\S+) (-?\d+) (-?\d+) (\d+) (\d+))"), height(R"(height (\d+))");
  for (std::sregex_iterator m(laid_out.begin(), laid_out.end(), box), stop; m != stop; ++m)
    result.figures.push_back({(*m)[1], std::stoi((*m)[2]), std::stoi((*m)[3]), std::stoi((*m)[4]), std::stoi((*m)[5]), 0.0, 0});
  std::smatch h;
  if (!std::regex_search(laid_out, h, height)) return {"the laid-out page did not report its height", 0, {}};
  result.page_height = std::stoi(h[1]);
  // The whole page in one screenshot: a window as tall as the page (the layout depends on
  // the width alone).
  const auto png = scratch / "page.png";
  std::filesystem::remove(png);
  chromium("--window-size=" + std::to_string(page_width) + "," + std::to_string(result.page_height) + " --screenshot='" +
               png.string() + "' 'file://" + std::filesystem::absolute(page).string() + "'",
           scratch / "screenshot.txt");
  Image image;
  if (!read_png(png, image)) return {"no screenshot could be read from " + png.string(), result.page_height, {}};
  for (auto& f : result.figures) {
    std::size_t ink = 0, total = 0;
    for (int y = std::max(0, f.y); y < std::min(image.height, f.y + f.height); ++y)
      for (int x = std::max(0, f.x); x < std::min(image.width, f.x + f.width); ++x) {
        const unsigned char* p = &image.rgba[4 * (static_cast<std::size_t>(y) * image.width + x)];
        const int low = std::min({p[0], p[1], p[2]}), high = std::max({p[0], p[1], p[2]});
        ++total;
        ink += low < 200;
        f.coloured_pixels += high - low > 60;
      }
    f.ink_share = total ? static_cast<double>(ink) / total : 0.0;
  }
  return result;
}

}  // namespace lobe::testing
