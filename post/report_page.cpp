#include "post/report_page.hpp"

#include "core/formatted_text.hpp"
#include "post/svg_chart.hpp"

namespace lobe {
namespace {

std::string escaped(const std::string& s) { return xml_escaped(s); }

/// Every `from` in `text` replaced by `to`.
std::string replaced(std::string text, const std::string& from, const std::string& to) {
  for (std::size_t at = text.find(from); at != std::string::npos; at = text.find(from, at + to.size()))
    text.replace(at, from.size(), to);
  return text;
}

/// The figure's SVG with its ids (and the references to them) prefixed by `prefix`.
std::string unique_ids(const std::string& svg, const std::string& prefix) {
  return replaced(replaced(svg, "id=\"", "id=\"" + prefix), "url(#", "url(#" + prefix);
}

const char* style_sheet = R"(body { font-family: sans-serif; margin: 2em auto; max-width: 1000px; color: #222; }
h1 { font-size: 1.5em; margin-bottom: 0.2em; }
p.subtitle { color: #555; margin-top: 0; }
h2 { font-size: 1.2em; border-bottom: 1px solid #ccc; padding-bottom: 0.2em; margin-top: 2em; }
pre { background: #f6f6f6; padding: 0.8em; overflow-x: auto; font-size: 12px; line-height: 1.35; }
table { border-collapse: collapse; margin: 0.8em 0; font-size: 13px; }
th, td { border: 1px solid #ccc; padding: 0.25em 0.6em; text-align: right; }
th { background: #eee; }
figure { margin: 1.2em 0; }
figure svg { max-width: 100%; height: auto; border: 1px solid #e4e4e4; }
figcaption { color: #555; font-size: 12px; }
p.note { color: #7a5c00; }
)";

}  // namespace

std::string report_html(const ReportPage& page) {
  std::string html = "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\"/>\n<title>" + escaped(page.title) +
                     "</title>\n<style>\n" + style_sheet + "</style>\n</head>\n<body>\n";
  html += "<h1>" + escaped(page.title) + "</h1>\n<p class=\"subtitle\">" + escaped(page.subtitle) + "</p>\n";
  std::size_t figure_count = 0;
  for (const auto& section : page.sections) {
    html += "<h2>" + escaped(section.heading) + "</h2>\n";
    if (!section.preformatted.empty()) html += "<pre>" + escaped(section.preformatted) + "</pre>\n";
    for (const auto& table : section.tables) {
      html += "<table>\n";
      for (std::size_t r = 0; r < table.size(); ++r) {
        html += "<tr>";
        for (const auto& cell : table[r]) html += (r == 0 ? "<th>" : "<td>") + escaped(cell) + (r == 0 ? "</th>" : "</td>");
        html += "</tr>\n";
      }
      html += "</table>\n";
    }
    for (const auto& figure : section.figures) {
      const std::string prefix = formatted("f%zu-", ++figure_count);
      html += "<figure id=\"figure-" + escaped(figure.name) + "\">\n" + unique_ids(figure.svg, prefix) + "<figcaption>" +
              escaped(figure.name) + "</figcaption>\n</figure>\n";
    }
    for (const auto& note : section.notes) html += "<p class=\"note\">" + escaped(note) + "</p>\n";
  }
  return html + "</body>\n</html>\n";
}

}  // namespace lobe
