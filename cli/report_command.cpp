#include <algorithm>
#include <cstdio>

#include "cli/commands.hpp"
#include "cli/standard_output.hpp"
#include "core/formatted_text.hpp"
#include "post/band_report.hpp"
#include "post/output_files.hpp"
#include "post/report_page.hpp"
#include "post/result_reader.hpp"
#include "post/run_summary.hpp"
#include "post/sweep_map.hpp"
#include "study/output_checks.hpp"

namespace lobe::cli {
namespace {

/// A figure's value for a table cell: two decimals in every row, so a column lines up and
/// 1.50 is not shown as 1.5 beside 1.53; or "n/a".
std::string cell(const std::optional<Real>& value) { return value ? formatted("%.2f", *value) : std::string("n/a"); }

/// The summary section of a single result, as the run printed it.
ReportSection summary_section(const std::filesystem::path& path) {
  ReportSection section{"Summary", read_result_summary(path), {}, {}, {}};
  if (section.preformatted.empty())
    section.notes.push_back("this result stores no summary (it was written by an older lobe): run the model again");
  return section;
}

/// A sweep's page: its cases ranked by worst VSWR over the map's band, with the beam's
/// figures beside, and the map.
ReportPage sweep_page(const std::filesystem::path& path) {
  const SweepMap map = sweep_map(path, "worst-vswr", {}, {});
  const SweepTable& table = map.table;
  ReportPage page{"lobe report: " + path.stem().string(),
                  formatted("a sweep of %zu cases, from %s", table.values.size(), path.string().c_str()), {}};
  std::vector<std::size_t> order(table.values.size());
  for (std::size_t c = 0; c < order.size(); ++c) order[c] = c;
  std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return map.figures[a] < map.figures[b]; });
  ReportTable ranking{{"rank", "case"}};
  for (const auto& name : table.names) ranking.front().push_back(name);
  for (const char* heading : {"worst VSWR", "mean VSWR", "highest axial ratio (dB)", "lowest gain (dBi)", "lowest front-to-back (dB)"})
    ranking.front().push_back(heading);
  for (std::size_t k = 0; k < std::min<std::size_t>(10, order.size()); ++k) {
    const std::size_t c = order[k];
    const BandFigures f = read_result_band_figures(path, case_group(c), map.band, true);
    std::vector<std::string> row{std::to_string(k + 1), case_name(c)};
    row.insert(row.end(), table.labels[c].begin(), table.labels[c].end());
    for (const char* figure : {"worst-vswr", "mean-vswr", "worst-axial-ratio", "worst-gain", "worst-front-to-back"})
      row.push_back(cell(band_figure(f, figure)));
    ranking.push_back(row);
  }
  ReportSection best{"Best cases by worst VSWR over " + map.band.name + " (" + frequency_text(map.band.low_hz) + " to " +
                         frequency_text(map.band.high_hz) + "), first port",
                     "", {ranking}, {}, {}};
  if (const auto edge = names_at_grid_edge(table, order.front()); !edge.empty()) {
    std::string names;
    for (const auto& n : edge) names += (names.empty() ? "" : ", ") + n;
    best.notes.push_back("the best case lies on the edge of the grid (" + names + "): a better one may lie beyond");
  }
  page.sections.push_back(best);
  page.sections.push_back({"Map", "", {}, {{"map", map.svg}}, {}});
  return page;
}

}  // namespace

int report_command(const ReportOptions& options) {
  const std::filesystem::path path(options.result_path);
  ReportPage page;
  if (is_sweep_file(path)) {
    if (!options.measured_path.empty())
      throw InputError({"--measured", 1, 1}, "a measured curve is laid over a single result, not a sweep");
    page = sweep_page(path);
  } else {
    page = {"lobe report: " + path.stem().string(), "from " + path.string(), {summary_section(path)}};
    const ResultFigures figures = figures_of_result(path, {}, options.measured_path, options.measured_format);
    page.sections.push_back({"Figures", "", {}, figures.figures, figures.notes});
  }
  if (is_standard_output(options.output_directory)) {
    std::fputs(report_html(page).c_str(), stdout);
    return 0;
  }
  std::filesystem::path directory =
      options.output_directory.empty() ? path.parent_path() : std::filesystem::path(options.output_directory);
  if (directory.empty()) directory = ".";
  check_output_directory(directory);
  OutputFiles files(directory);
  files.stage_text(path.stem().string() + "-report.html", report_html(page));
  for (const auto& written : files.commit()) std::printf("%s\n", written.string().c_str());
  return 0;
}

}  // namespace lobe::cli
