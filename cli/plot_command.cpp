#include <cstdio>
#include <filesystem>
#include <fstream>

#include "cli/commands.hpp"
#include "post/measured_csv.hpp"
#include "post/output_files.hpp"
#include "post/port_quantities.hpp"
#include "post/result_reader.hpp"
#include "post/svg_chart.hpp"

namespace lobe::cli {
namespace {

void write_text(const std::filesystem::path& path, const std::string& text) {
  std::ofstream out(path);
  out << text;
  out.close();
  if (!out) throw std::runtime_error("writing " + path.string() + " failed");
}

}  // namespace

int plot_command(const PlotOptions& options) {
  const NetworkData network = read_result_network(options.result_path);
  const std::vector<std::string> names = read_result_port_names(options.result_path);
  const std::vector<Band> bands = read_result_bands(options.result_path);
  std::optional<MeasuredCurve> measured;
  if (!options.measured_path.empty()) measured = read_measured(options.measured_path, network.reference_ohm);
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
  const std::string stem = std::filesystem::path(options.result_path).stem().string();
  OutputFiles files(directory);
  write_text(files.staging_path(stem + "_vswr.svg"), line_chart_svg(vswr));
  write_text(files.staging_path(stem + "_return_loss.svg"), line_chart_svg(loss));
  write_text(files.staging_path(stem + "_smith.svg"),
             smith_chart_svg("Impedance (Smith chart)", network.reference_ohm, smith));
  for (const auto& path : files.commit()) std::printf("%s\n", path.string().c_str());
  return 0;
}

}  // namespace lobe::cli
