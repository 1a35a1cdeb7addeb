#include <cstdio>
#include <filesystem>

#include "cli/commands.hpp"
#include "cli/progress_line.hpp"
#include "core/constants.hpp"
#include "post/hdf5_writer.hpp"
#include "post/output_files.hpp"
#include "post/run_summary.hpp"
#include "post/scattering_result.hpp"
#include "post/vtk_writer.hpp"
#include "solver/threads.hpp"

namespace lobe::cli {

int run_scattering(const RunOptions& options, const Model& model) {
  const std::string stem = std::filesystem::path(options.model_path).stem().string();
  const std::filesystem::path directory = output_directory(options);
  check_output_directory(directory);
  remove_dead_temporaries(directory);  // left by a run that was killed
  const AntennaProblem problem(model);
  require_solvable(problem);
  print_warnings(problem.mesh.warnings);
  print_warnings(problem.surfaces.warnings);
  std::printf("lobe %s: %s\n", LOBE_VERSION, options.model_path.c_str());
  std::printf("configuration: %s, %s, %s, ground %s, %s, %s\n\n",
              count_text(problem.mesh.segments.size(), "segment").c_str(),
              count_text(problem.surfaces.mesh.triangles.size(), "triangle").c_str(),
              count_text(problem.unknowns(), "unknown").c_str(), problem.medium.name().c_str(),
              count_text(model.frequencies_hz.size(), "frequency", "frequencies").c_str(),
              count_text(thread_count(), "thread").c_str());
  ScatteringRun run{problem, {}, {LOBE_VERSION, thread_count(), options.command_line, std::nullopt}};
  {
    ProgressLine progress("frequency", model.frequencies_hz.size());
    for (std::size_t i = 0; i < model.frequencies_hz.size(); ++i) {
      run.results.push_back(evaluate_scattering(problem, solve_frequency(problem, model.frequencies_hz[i])));
      progress.update(i + 1, i + 1, frequency_text(model.frequencies_hz[i]));
    }
  }
  OutputFiles files(directory);
  write_scattering_hdf5(files.staging_path(stem + ".h5"), run);
  write_scattering_csv(files.staging_path(stem + "_rcs.csv"), run);
  std::vector<CellValues> currents;
  for (const auto& r : run.results) currents.push_back(current_cells(r.frequency_hz, r.segment_currents, r.surface_currents));
  write_model_vtu(files.staging_path(stem + "_currents.vtu"), problem.mesh, problem.surfaces, currents);
  const auto written = files.commit();
  std::printf("%s\nresults:\n", scattering_summary(run).c_str());
  for (const auto& path : written) std::printf("  %s\n", path.string().c_str());
  return 0;
}

}  // namespace lobe::cli
