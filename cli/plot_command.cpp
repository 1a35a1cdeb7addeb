#include <algorithm>
#include <cmath>
#include <cstdio>
#include <filesystem>

#include "cli/commands.hpp"
#include "study/output_checks.hpp"
#include "core/input_error.hpp"
#include "geometry/model_parser.hpp"
#include "post/measured_csv.hpp"
#include "post/output_files.hpp"
#include "post/port_quantities.hpp"
#include "post/result_reader.hpp"
#include "post/run_summary.hpp"
#include "post/svg_chart.hpp"
#include "post/sweep_file.hpp"

namespace lobe::cli {
namespace {

/// Index of the value in `values` nearest to `x`.
std::size_t nearest(const std::vector<Real>& values, Real x) {
  std::size_t best = 0;
  for (std::size_t i = 1; i < values.size(); ++i)
    if (std::abs(values[i] - x) < std::abs(values[best] - x)) best = i;
  return best;
}

/// The cut through φ = phi and φ = phi + 180° at frequency index f, as polar series of the
/// total, RHCP and LHCP gains (θ on the right half, the opposite side on the left).
std::string pattern_cut_svg(const PatternData& d, std::size_t f, Real phi, const std::string& frequency) {
  const std::size_t p = nearest(d.phi_deg, phi), q = nearest(d.phi_deg, phi + 180);
  const bool opposite = std::abs(d.phi_deg[q] - (phi + 180)) < 1e-6;
  std::vector<PolarSeries> series{{"total gain", {}, {}, series_colour(0), false},
                                  {"RHCP gain", {}, {}, series_colour(1), false},
                                  {"LHCP gain", {}, {}, series_colour(2), true}};
  Real peak = -1e9;
  auto add = [&](std::size_t t, std::size_t column, Real angle) {
    const std::size_t k = d.at(f, t, column);
    series[0].angle_deg.push_back(angle), series[0].value_db.push_back(d.gain_dbi[k]);
    series[1].angle_deg.push_back(angle), series[1].value_db.push_back(d.rhcp_dbi[k]);
    series[2].angle_deg.push_back(angle), series[2].value_db.push_back(d.lhcp_dbi[k]);
    peak = std::max(peak, d.gain_dbi[k]);
  };
  for (std::size_t t = 0; t < d.theta_deg.size(); ++t) add(t, p, d.theta_deg[t]);
  if (opposite)
    for (std::size_t t = d.theta_deg.size(); t-- > 0;) add(t, q, 360 - d.theta_deg[t]);
  const Real ceiling = 5 * std::ceil(peak / 5);
  char title[128];
  std::snprintf(title, sizeof title, "Gain in the plane phi = %g deg%s at %s", d.phi_deg[p],
                opposite ? " (and its opposite side)" : "", frequency.c_str());
  return polar_chart_svg(title, ceiling - 40, ceiling, series);
}

}  // namespace

int plot_command(const PlotOptions& options) {
  if (is_sweep_file(options.result_path)) return plot_sweep(options);
  if (!options.figure.empty() || !options.axes.empty())
    throw InputError({options.figure.empty() ? "--axes" : "--figure", 1, 1},
                     "'" + options.result_path + "' is a single result; --figure and --axes map a sweep file");
  const NetworkData network = read_result_network(options.result_path);
  const std::vector<std::string> names = read_result_port_names(options.result_path);
  std::vector<Band> bands = read_result_bands(options.result_path);
  for (std::size_t b = 0; b < options.band_options.size(); ++b)
    bands.push_back(parse_band_option(options.band_options[b], static_cast<int>(b) + 1));
  std::optional<MeasuredCurve> measured;
  if (!options.measured_path.empty()) measured = read_measured(options.measured_path, network.reference_ohm, options.measured_format);
  std::filesystem::path directory = options.output_directory.empty()
                                        ? std::filesystem::path(options.result_path).parent_path()
                                        : std::filesystem::path(options.output_directory);
  if (directory.empty()) directory = ".";
  check_output_directory(directory);

  const bool gigahertz = network.frequency_hz.back() >= 1e9;
  const Real unit = gigahertz ? 1e9 : 1e6;
  const std::string axis = gigahertz ? "frequency (GHz)" : "frequency (MHz)";
  LineChart vswr{"VSWR", axis, "VSWR", {}, {}, 1.0, std::nullopt, {{2.0, "VSWR 2"}}};
  LineChart loss{"Return loss", axis, "return loss (dB)", {}, {}, 0.0, std::nullopt, {{10.0, "10 dB"}}};
  std::vector<SmithSeries> smith;
  Real highest_vswr = 2.0;
  auto add = [&](const std::string& label, const std::vector<Real>& f, const std::vector<Complex>& gamma,
                 const std::string& colour, bool dashed, bool phase_known) {
    ChartSeries v{label, {}, {}, colour, dashed}, l = v;
    for (std::size_t k = 0; k < f.size(); ++k) {
      const Real g = std::abs(gamma[k]);
      v.x.push_back(f[k] / unit), v.y.push_back(vswr_from_reflection(g));
      l.x.push_back(f[k] / unit), l.y.push_back(std::min(return_loss_db(g), 60.0));
      highest_vswr = std::max(highest_vswr, v.y.back());
    }
    vswr.series.push_back(v);
    loss.series.push_back(l);
    if (phase_known) smith.push_back({label, gamma, colour, dashed});
  };
  for (int p = 0; p < network.ports(); ++p) {
    std::vector<Complex> gamma;
    for (const auto& s : network.s) gamma.push_back(s(p, p));
    add("simulated, port " + names[p], network.frequency_hz, gamma, series_colour(p), false, true);
  }
  if (measured)
    add("measured (" + measured->quantity + ")", measured->curve.frequency_hz, measured->curve.reflection, "#333333", true,
        measured->phase_known);
  vswr.y_max = std::min(highest_vswr * 1.05, 10.0);
  for (const auto& b : bands) {
    vswr.shades.push_back({b.low_hz / unit, b.high_hz / unit, b.name});
    loss.shades.push_back(vswr.shades.back());
  }
  // Patterns at the computed frequency nearest the first band's centre (else the middle
  // one); axial ratio in the direction of peak gain at every frequency.
  const PatternData pattern = read_result_pattern(options.result_path);
  const std::size_t f = bands.empty() ? pattern.frequency_hz.size() / 2
                                      : nearest(pattern.frequency_hz, 0.5 * (bands.front().low_hz + bands.front().high_hz));
  const std::string at = frequency_text(pattern.frequency_hz[f]);
  LineChart axial{"Axial ratio in the direction of peak gain", axis, "axial ratio (dB)", {}, vswr.shades, 0.0,
                  std::nullopt, {{3.0, "3 dB"}}};
  ChartSeries ratio{"axial ratio", {}, {}, series_colour(0), false};
  for (std::size_t k = 0; k < pattern.frequency_hz.size(); ++k) {
    std::size_t best = pattern.at(k, 0, 0);
    for (std::size_t i = pattern.at(k, 0, 0); i < pattern.at(k + 1, 0, 0); ++i)
      if (pattern.gain_dbi[i] > pattern.gain_dbi[best]) best = i;
    ratio.x.push_back(pattern.frequency_hz[k] / unit);
    ratio.y.push_back(std::min(pattern.axial_ratio_db[best], 40.0));
  }
  axial.series.push_back(ratio);
  axial.y_max = std::max(6.0, *std::max_element(ratio.y.begin(), ratio.y.end()) * 1.05);

  const std::string stem = std::filesystem::path(options.result_path).stem().string();
  OutputFiles files(directory);
  files.stage_text(stem + "_pattern_phi0.svg", pattern_cut_svg(pattern, f, 0.0, at));
  files.stage_text(stem + "_pattern_phi90.svg", pattern_cut_svg(pattern, f, 90.0, at));
  files.stage_text(stem + "_axial_ratio.svg", line_chart_svg(axial));
  files.stage_text(stem + "_vswr.svg", line_chart_svg(vswr));
  files.stage_text(stem + "_return_loss.svg", line_chart_svg(loss));
  files.stage_text(stem + "_smith.svg", smith_chart_svg("Impedance (Smith chart)", network.reference_ohm, smith));
  for (const auto& path : files.commit()) std::printf("%s\n", path.string().c_str());
  return 0;
}

}  // namespace lobe::cli
