#include <cstdio>
#include <filesystem>

#include "cli/commands.hpp"
#include "cli/standard_output.hpp"
#include "study/output_checks.hpp"
#include "core/input_error.hpp"
#include "geometry/model_parser.hpp"
#include "post/measured_csv.hpp"
#include "post/output_files.hpp"
#include "post/result_reader.hpp"
#include "post/run_summary.hpp"
#include "post/result_figures.hpp"
#include "post/sweep_file.hpp"

namespace lobe::cli {

ResultFigures figures_of_result(const std::filesystem::path& path, const std::vector<Band>& bands,
                                const std::string& measured_path, const std::string& measured_format) {
  if (is_scattering_result(path)) {
    if (!measured_path.empty())
      throw InputError({"--measured", 1, 1}, "a measured reflection is laid over an antenna's result, not a scatterer's");
    return scattering_figures(path);
  }
  std::optional<MeasuredCurve> measured;
  if (!measured_path.empty()) measured = read_measured(measured_path, read_result_network(path).reference_ohm, measured_format);
  return antenna_figures(path, bands, measured);
}

int plot_command(const PlotOptions& options) {
  refuse_standard_output(options.output_directory, "--output", "plot");
  if (is_sweep_file(options.result_path)) return plot_sweep(options);
  if (!options.figure.empty() || !options.axes.empty())
    throw InputError({options.figure.empty() ? "--axes" : "--figure", 1, 1},
                     "'" + options.result_path + "' is a single result; --figure and --axes map a sweep file");
  const std::filesystem::path path(options.result_path);
  std::vector<Band> bands;
  for (std::size_t b = 0; b < options.band_options.size(); ++b)
    bands.push_back(parse_band_option(options.band_options[b], static_cast<int>(b) + 1));
  const ResultFigures figures = figures_of_result(path, bands, options.measured_path, options.measured_format);
  std::filesystem::path directory =
      options.output_directory.empty() ? path.parent_path() : std::filesystem::path(options.output_directory);
  if (directory.empty()) directory = ".";
  check_output_directory(directory);
  OutputFiles files(directory);
  for (const auto& f : figures.figures) files.stage_text(path.stem().string() + "_" + f.name + ".svg", f.svg);
  for (const auto& written : files.commit()) std::printf("%s\n", written.string().c_str());
  for (const auto& note : figures.notes) std::printf("%s\n", note.c_str());
  return 0;
}

}  // namespace lobe::cli
