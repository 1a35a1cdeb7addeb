#pragma once
/// One self-contained HTML page of a result: its summary, tables and every figure inline,
/// readable offline in any browser and printable.
#include <string>
#include <vector>

#include "post/result_figures.hpp"

namespace lobe {

/// A table of text cells; the first row is the header.
using ReportTable = std::vector<std::vector<std::string>>;

struct ReportSection {
  std::string heading;
  std::string preformatted;          ///< shown as it is (a printed summary)
  std::vector<ReportTable> tables;
  std::vector<NamedFigure> figures;  ///< each in a <figure id="figure-NAME">
  std::vector<std::string> notes;
};

struct ReportPage {
  std::string title;
  std::string subtitle;
  std::vector<ReportSection> sections;
};

/// The page as HTML5: no script, no external file; every SVG inline, its ids made unique so
/// that several charts on one page keep their own clip paths.
std::string report_html(const ReportPage& page);

}  // namespace lobe
