#include <algorithm>
#include <cstdio>

#include "cli/commands.hpp"
#include "core/input_error.hpp"
#include "post/output_files.hpp"
#include "post/sweep_map.hpp"
#include "study/output_checks.hpp"

namespace lobe::cli {

int plot_sweep(const PlotOptions& options) {
  const std::filesystem::path path(options.result_path);
  const std::string figure = options.figure.empty() ? "worst-vswr" : options.figure;
  if (!options.measured_path.empty())
    throw InputError({"--measured", 1, 1}, "a measured curve is laid over a single result; re-run the chosen case with "
                                           "`lobe run --set ...` and plot that");
  const SweepMap map = sweep_map(path, figure, options.band_options, options.axes);
  std::filesystem::path directory = options.output_directory.empty() ? path.parent_path()
                                                                     : std::filesystem::path(options.output_directory);
  if (directory.empty()) directory = ".";
  check_output_directory(directory);
  std::string figure_stem = figure;
  std::replace(figure_stem.begin(), figure_stem.end(), '-', '_');
  OutputFiles files(directory);
  files.stage_text(path.stem().string() + "_" + figure_stem + "_map.svg", map.svg);
  for (const auto& written : files.commit()) std::printf("%s\n", written.string().c_str());
  std::printf("best case by %s: %s %.4g with", figure.c_str(), case_name(map.best).c_str(), map.figures[map.best]);
  for (std::size_t v = 0; v < map.table.names.size(); ++v) std::printf(" %s = %s", map.table.names[v].c_str(), map.table.labels[map.best][v].c_str());
  std::printf("\n");
  return 0;
}

}  // namespace lobe::cli
