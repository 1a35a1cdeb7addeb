#include "post/sweep_map.hpp"

#include <algorithm>
#include <cmath>

#include "core/input_error.hpp"
#include "geometry/model_parser.hpp"
#include "post/band_report.hpp"
#include "post/result_reader.hpp"
#include "post/run_summary.hpp"

namespace lobe {
namespace {

/// The band figure of every case of a sweep file (the first port's match, the beam's
/// figures); a case where the figure is not defined is an InputError at --figure.
std::vector<Real> case_figures(const std::filesystem::path& path, std::size_t cases, const Band& band,
                               const std::string& figure) {
  std::vector<Real> figures;
  for (std::size_t c = 0; c < cases; ++c) {
    std::optional<Real> value;
    try {
      value = band_figure(read_result_band_figures(path, case_group(c), band, is_beam_figure(figure)), figure);
    } catch (const std::invalid_argument&) {
      throw InputError({"--band", 1, 1}, "the band " + frequency_text(band.low_hz) + " to " + frequency_text(band.high_hz) +
                                             " lies outside the sweep's frequencies");
    }
    if (!value)
      throw InputError({"--figure", 1, 1}, figure + " is not defined over this band for " + case_name(c) +
                                               " (the back of a beam at the zenith over a ground)");
    figures.push_back(*value);
  }
  return figures;
}

/// Where a varied name is in the table; an InputError at --axes when it is not there.
std::size_t name_index(const SweepTable& table, const std::string& name) {
  const auto at = std::find(table.names.begin(), table.names.end(), name);
  if (at == table.names.end()) {
    std::string known;
    for (const auto& n : table.names) known += (known.empty() ? "" : ", ") + n;
    throw InputError({"--axes", 1, 1}, "'" + name + "' was not varied in this sweep; its varied names are " + known);
  }
  return static_cast<std::size_t>(at - table.names.begin());
}

/// The distinct values of column `v` in order of first appearance: their texts and labels.
std::pair<std::vector<std::string>, std::vector<std::string>> distinct_values(const SweepTable& table, std::size_t v) {
  std::vector<std::string> texts, labels;
  for (std::size_t c = 0; c < table.values.size(); ++c)
    if (std::find(texts.begin(), texts.end(), table.values[c][v]) == texts.end())
      texts.push_back(table.values[c][v]), labels.push_back(table.labels[c][v]);
  return {texts, labels};
}

}  // namespace

SweepMap sweep_map(const std::filesystem::path& path, const std::string& figure, const std::vector<std::string>& band_options,
                   const std::vector<std::string>& axes) {
  const SweepTable table = read_sweep_table(path);
  if (band_options.size() > 1) throw InputError({"--band", 2, 1}, "a sweep map takes one band");
  if (axes.size() > 2) throw InputError({"--axes", 1, 1}, "--axes takes one or two varied names");
  const std::size_t x = axes.empty() ? 0 : name_index(table, axes[0]);
  // y is `none` for a map over one name (a single row).
  constexpr std::size_t none = static_cast<std::size_t>(-1);
  const std::size_t y = axes.size() == 2                       ? name_index(table, axes[1])
                        : axes.empty() && table.names.size() > 1 ? 1
                                                                 : none;
  if (y == x) throw InputError({"--axes", 1, 1}, "--axes needs two different names");

  const NetworkData first = read_result_network(path, case_group(0));
  const std::vector<Band> bands = read_result_bands(path, case_group(0));
  const Band band = band_options.empty() ? default_band(bands, first.frequency_hz.front(), first.frequency_hz.back())
                                         : parse_band_option(band_options.front(), 1);
  const std::vector<Real> figures = case_figures(path, table.values.size(), band, figure);
  const bool larger_better = larger_is_better(figure);
  std::size_t best = 0;
  for (std::size_t c = 1; c < figures.size(); ++c)
    if (larger_better ? figures[c] > figures[best] : figures[c] < figures[best]) best = c;

  // The grid over the chosen names, every other name held at the best case's value.
  const auto [x_texts, x_labels] = distinct_values(table, x);
  std::vector<std::string> y_texts{""}, y_labels{""};
  if (y != none) std::tie(y_texts, y_labels) = distinct_values(table, y);
  HeatMap map;
  map.values.assign(y_texts.size(), std::vector<Real>(x_texts.size(), std::nan("")));
  std::string held;
  for (std::size_t v = 0; v < table.names.size(); ++v)
    if (v != x && v != y) held += (held.empty() ? "" : ", ") + table.names[v] + " = " + table.labels[best][v];
  for (std::size_t c = 0; c < table.values.size(); ++c) {
    bool on_slice = true;
    for (std::size_t v = 0; v < table.names.size(); ++v)
      if (v != x && v != y && table.values[c][v] != table.values[best][v]) on_slice = false;
    if (!on_slice) continue;
    const auto column = std::find(x_texts.begin(), x_texts.end(), table.values[c][x]) - x_texts.begin();
    const auto row = y != none ? std::find(y_texts.begin(), y_texts.end(), table.values[c][y]) - y_texts.begin() : 0;
    map.values[row][column] = figures[c];
  }
  const std::vector<std::string> ports = read_result_port_names(path, case_group(0));
  map.title = path.stem().string() + ": " + band_figure_title(figure) + " over " + band.name + ", port " + ports.front();
  map.note = frequency_text(band.low_hz) + " to " + frequency_text(band.high_hz) +
             (held.empty() ? std::string() : "; other names held at the best case's values: " + held);
  map.x_label = table.names[x];
  map.x_ticks = x_labels;
  map.y_label = y != none ? table.names[y] : std::string();
  map.y_ticks = y_labels;
  map.value_label = band_figure_title(figure);
  map.larger_is_better = larger_better;
  if (figure == "worst-vswr" || figure == "mean-vswr") map.colour_limit = 5.0;
  if (figure == "mean-mismatch-loss") map.colour_limit = 3.0;

  return {heat_map_svg(map), figure, band, table, figures, best};
}

}  // namespace lobe
