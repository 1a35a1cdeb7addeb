#include <algorithm>
#include <cstdio>
#include <filesystem>

#include "cli/commands.hpp"
#include "cli/standard_output.hpp"
#include "core/formatted_text.hpp"
#include "geometry/model_parser.hpp"
#include "post/output_files.hpp"
#include "post/result_reader.hpp"
#include "post/run_summary.hpp"
#include "study/match_design.hpp"
#include "study/matched_model.hpp"
#include "study/output_checks.hpp"

namespace lobe::cli {
namespace {

std::string parts_text(const std::vector<MatchPart>& parts) {
  std::string text;
  for (const MatchPart& p : parts) text += (text.empty() ? "" : ", ") + part_text(p);
  return text;
}

std::string report_line(const PortBandReport& r) {
  return formatted("worst VSWR %.2f at %s, mean %.2f, mean mismatch loss %.2f dB; %s",
                   r.highest_vswr.value, frequency_text(r.highest_vswr.frequency_hz).c_str(), r.mean_vswr,
                   r.mean_mismatch_loss_db, share_within_text(r).c_str());
}

Band chosen_band(const MatchOptions& options, const std::string& group) {
  if (!options.band.empty()) return parse_band_option(options.band, 1);
  const std::vector<Band> bands = read_result_bands(options.result_path, group);
  if (bands.empty())
    throw InputError({options.result_path, 1, 1}, "the model behind this result names no band; give one with --band LOW:HIGH");
  return bands.front();
}

}  // namespace

int match_command(const MatchOptions& options) {
  // CLI11's range check lets NaN through (every comparison with it is false).
  if (!(options.velocity_factor >= 0.1 && options.velocity_factor <= 1.0))
    throw InputError({"--velocity", 1, 1}, "the velocity factor must be from 0.1 to 1");
  const std::string group = result_group(options.result_path, options.case_name);
  const std::vector<std::string> names = read_result_port_names(options.result_path, group);
  std::size_t port = 0;
  if (!options.port.empty()) {
    const auto found = std::find(names.begin(), names.end(), options.port);
    if (found == names.end()) throw InputError({"--port", 1, 1}, "the result has no port named '" + options.port + "'");
    port = static_cast<std::size_t>(found - names.begin());
  }
  const PortImpedanceCurve curve = read_result_port_impedance(options.result_path, group, port);
  const ResultModel source = read_result_model(options.result_path, group);
  std::vector<Override> overrides;
  for (std::size_t i = 0; i < source.set_options.size(); ++i)
    overrides.push_back(parse_override(source.set_options[i], static_cast<int>(i) + 1, "the result's --set"));
  const Model model = parse_model(source.source, options.result_path, overrides);

  MatchRequest request;
  request.frequency_hz = curve.frequency_hz;
  request.antenna_impedance = curve.impedance;
  request.reference_ohm = curve.reference_ohm;
  request.band = chosen_band(options, group);
  request.goal = options.goal;
  request.preferred_series = options.series == "E24" ? 24 : 12;
  request.velocity_factor = options.velocity_factor;

  std::filesystem::path output = options.output.empty()
                                     ? std::filesystem::path(std::filesystem::path(options.result_path).stem().string() + "-matched.lobe")
                                     : std::filesystem::path(options.output);
  // With -o -, the matched model goes to standard output and every message to standard error.
  const bool to_stdout = is_standard_output(options.output);
  const std::filesystem::path directory = output.has_parent_path() ? output.parent_path() : std::filesystem::path(".");
  if (!to_stdout) check_output_directory(directory);
  std::FILE* const text = to_stdout ? stderr : stdout;

  const std::vector<MatchDesign> designs = design_matches(request, {"--band", 1, 1});
  const auto chosen = options.topology.empty()
                          ? designs.begin()
                          : std::find_if(designs.begin(), designs.end(), [&](const MatchDesign& d) { return d.topology == options.topology; });
  const std::string heading = formatted("matching network ('%s', as built) designed by lobe match for %s to %s: %s",
                                        chosen->topology.c_str(), frequency_text(request.band.low_hz).c_str(),
                                        frequency_text(request.band.high_hz).c_str(), report_line(chosen->built_report).c_str());
  // Made before anything is printed: a port the network cannot join is refused first.
  const std::string matched = matched_model_text(model, port, chosen->built, heading);
  std::fprintf(text, "lobe match: %s, port '%s' against %.6g ohm over %s to %s; goal: %s\n", options.result_path.c_str(),
              names[port].c_str(), request.reference_ohm, frequency_text(request.band.low_hz).c_str(),
              frequency_text(request.band.high_hz).c_str(), band_figure_title(request.goal).c_str());
  std::fprintf(text, "antenna alone: %s\n\n", report_line(unmatched_report(request)).c_str());
  std::fprintf(text, "%-13s %12s %12s %11s  %s\n", "network", "worst VSWR", "as built", "mean VSWR", "parts as built, from the antenna");
  for (const MatchDesign& d : designs)
    std::fprintf(text, "%-13s %12.2f %12.2f %11.2f  %s\n", d.topology.c_str(), d.designed_report.highest_vswr.value,
                d.built_report.highest_vswr.value, d.built_report.mean_vswr, parts_text(d.built).c_str());
  std::fprintf(text, "\n(inductors and capacitors: %s values; lines and stubs: %.6g ohm, velocity factor %.3g, to 0.1 mm)\n",
              options.series.c_str(), request.reference_ohm, request.velocity_factor);

  if (to_stdout) {
    std::fputs(matched.c_str(), stdout);
    std::fprintf(text, "\nthe model with the '%s' network as built is on standard output; its band report:\n  %s\n",
                 chosen->topology.c_str(), report_line(chosen->built_report).c_str());
  } else {
    OutputFiles files(directory);
    files.stage_text(output.filename().string(), matched);
    files.commit();
    std::fprintf(text, "\nwritten: %s with the '%s' network as built; its band report:\n  %s\n", output.string().c_str(),
                 chosen->topology.c_str(), report_line(chosen->built_report).c_str());
    std::fprintf(text, "`lobe run %s` confirms it.\n", output.string().c_str());
  }
  std::fprintf(text, "\nCautions:\n"
              "  - Parasitics of real components are not modelled: a capacitor's lead inductance and self-resonance, an\n"
              "    inductor's self-capacitance and loss. Choose parts that self-resonate well above the band (common practice).\n"
              "  - Lines and stubs are lossless here; the written model takes any loss you add to them.\n"
              "  - At transmit power, check every part's voltage and current rating before transmitting.\n");
  return 0;
}

}  // namespace lobe::cli
