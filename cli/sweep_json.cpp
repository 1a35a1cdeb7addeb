#include "cli/sweep_json.hpp"

#include <nlohmann/json.hpp>

#include "post/result_reader.hpp"
#include "post/sweep_file.hpp"

namespace lobe::cli {
namespace {

using Json = nlohmann::ordered_json;

Json optional_number(const std::optional<Real>& value) { return value ? Json(*value) : Json(nullptr); }

/// The band the figures are taken over: the ranking band, else the model's first.
std::optional<Band> figures_band(const PreparedSweep& sweep, const SweepOutcome& outcome) {
  if (sweep.band) return sweep.band;
  if (outcome.case_files.empty()) return std::nullopt;
  const std::vector<Band> bands = read_result_bands(outcome.case_files.front(), "");
  return bands.empty() ? std::nullopt : std::optional<Band>(bands.front());
}

}  // namespace

std::string sweep_summary_json(const PreparedSweep& sweep, const SweepOutcome& outcome, const std::vector<RankedCase>& ranked) {
  Json doc{{"schema", sweep_summary_schema},
           {"schema_version", sweep_summary_schema_version},
           {"lobe_version", LOBE_VERSION},
           {"model", sweep.request.model_path},
           {"file", sweep.output.string()},
           {"solved_now", outcome.solved},
           {"from_before", outcome.skipped},
           {"variables", sweep.grid.names()}};
  const std::optional<Band> band = figures_band(sweep, outcome);
  doc["band"] = band ? Json{{"name", band->name}, {"low_hz", band->low_hz}, {"high_hz", band->high_hz}} : Json(nullptr);
  Json cases = Json::array();
  for (std::size_t c = 0; c < outcome.case_files.size(); ++c) {
    Json values = Json::object();
    for (std::size_t v = 0; v < sweep.grid.varied.size(); ++v)
      values[sweep.grid.varied[v].name] = {{"label", sweep.grid.labels[c][v]}, {"si", sweep.values_si[c][v]}};
    Json entry{{"case", case_name(c)}, {"values", values}};
    if (band) {
      const BandFigures figures = read_result_band_figures(outcome.case_files[c], "", *band, true);
      Json named = Json::object();
      for (const auto& name : band_figure_names()) named[name] = optional_number(band_figure(figures, name));
      entry["figures"] = named;
    }
    cases.push_back(entry);
  }
  doc["cases"] = cases;
  if (sweep.goal) {
    Json limits = Json::array(), order = Json::array();
    for (const auto& l : sweep.limits) limits.push_back(l.text);
    for (const auto& r : ranked)
      order.push_back({{"case", case_name(r.index)}, {"value", optional_number(r.judgement.value)}, {"meets_limits", r.judgement.meets()}});
    doc["ranking"] = {{"goal", sweep.goal->text}, {"limits", limits}, {"order", order}};
  } else {
    doc["ranking"] = nullptr;
  }
  return doc.dump(2) + "\n";
}

}  // namespace lobe::cli
