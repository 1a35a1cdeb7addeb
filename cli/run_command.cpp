#include <fcntl.h>
#include <unistd.h>

#include <cerrno>
#include <cstdio>
#include <cstring>
#include <filesystem>

#include "cli/commands.hpp"
#include "cli/progress_line.hpp"
#include "cli/model_loading.hpp"
#include "geometry/model_parser.hpp"
#include "post/csv_writer.hpp"
#include "post/hdf5_writer.hpp"
#include "post/output_files.hpp"
#include "post/run_summary.hpp"
#include "post/vtk_writer.hpp"
#include "solver/threads.hpp"

namespace lobe::cli {

void check_output_directory(const std::filesystem::path& directory) {
  const SourceLocation where{"--output", 1, 1};
  std::error_code error;
  if (std::filesystem::exists(directory, error) && !std::filesystem::is_directory(directory, error))
    throw InputError(where, "'" + directory.string() + "' exists and is not a directory");
  std::filesystem::path existing = std::filesystem::absolute(directory, error);
  while (!existing.empty() && !std::filesystem::exists(existing, error)) existing = existing.parent_path();
  if (!std::filesystem::is_directory(existing, error))
    throw InputError(where, "cannot write results under '" + existing.string() + "': it is not a directory");
  // Permission bits do not tell (root passes them; /proc and read-only mounts refuse
  // anyway): create and remove a file there, before any solving.
  const auto probe = existing / (".lobe-probe-" + std::to_string(::getpid()));
  errno = 0;
  const int fd = ::open(probe.c_str(), O_WRONLY | O_CREAT | O_EXCL | O_CLOEXEC, 0600);
  if (fd < 0) throw InputError(where, "cannot write results under '" + existing.string() + "': " + std::strerror(errno));
  ::close(fd);
  ::unlink(probe.c_str());
}

void check_output_file(const std::filesystem::path& file) {
  std::error_code error;
  if (std::filesystem::is_directory(file, error))
    throw InputError({"--output", 1, 1}, "'" + file.string() + "' is a directory; name the file to write in it");
  check_output_directory(file.has_parent_path() ? file.parent_path() : std::filesystem::path("."));
}

std::filesystem::path output_directory(const RunOptions& options) {
  const std::string stem = std::filesystem::path(options.model_path).stem().string();
  return options.output_directory.empty() ? std::filesystem::path(stem + "-results")
                                          : std::filesystem::path(options.output_directory);
}

int run_command(const RunOptions& options) {
  if (options.threads > 0) set_thread_count(options.threads);
  Model model = load_model(options.model_path, options.set_options);
  for (std::size_t i = 0; i < options.band_options.size(); ++i)
    model.bands.push_back(parse_band_option(options.band_options[i], static_cast<int>(i) + 1));
  if (model.wave) return run_scattering(options, model);
  const AntennaProblem problem(model);
  require_solvable(problem);
  print_warnings(problem.mesh.warnings);
  print_warnings(problem.surfaces.warnings);
  const std::filesystem::path model_path(options.model_path);
  const std::string stem = model_path.stem().string();
  const std::filesystem::path directory =
      options.output_directory.empty() ? std::filesystem::path(stem + "-results") : std::filesystem::path(options.output_directory);

  check_output_directory(directory);
  remove_dead_temporaries(directory);  // left by a run that was killed

  std::printf("lobe %s: %s\n", LOBE_VERSION, options.model_path.c_str());
  std::printf("configuration: %s, %s, %s, %s, %s, ground %s, reference %.6g ohm, %s, %s\n",
              count_text(problem.mesh.segments.size(), "segment").c_str(),
              count_text(problem.surfaces.mesh.triangles.size(), "triangle").c_str(),
              count_text(problem.unknowns(), "unknown").c_str(), count_text(model.ports.size(), "port").c_str(),
              count_text(model.loads.size(), "load").c_str(), model.ground_perfect ? "perfect" : "none",
              model.reference_ohm, count_text(model.frequencies_hz.size(), "frequency", "frequencies").c_str(),
              count_text(thread_count(), "thread").c_str());
  for (const auto& v : model.values)
    if (v.overridden) std::printf("set %s = %.10g %s\n", v.name.c_str(), v.value, v.unit.c_str());
  print_long_run_estimate(problem.unknowns(), static_cast<double>(model.frequencies_hz.size()));
  std::printf("\n");

  RunRecord run{problem, {}, {LOBE_VERSION, thread_count(), options.command_line, options.tx_power_w}};
  {
    ProgressLine progress("frequency", model.frequencies_hz.size());
    for (std::size_t i = 0; i < model.frequencies_hz.size(); ++i) {
      run.results.push_back(evaluate_frequency(problem, solve_frequency(problem, model.frequencies_hz[i])));
      progress.update(i + 1, i + 1, frequency_text(model.frequencies_hz[i]));
    }
  }

  OutputFiles files(directory);
  write_hdf5(files.staging_path(stem + ".h5"), run);
  write_ports_csv(files.staging_path(stem + "_ports.csv"), run);
  write_pattern_csv(files.staging_path(stem + "_pattern.csv"), run);
  write_currents_csv(files.staging_path(stem + "_currents.csv"), run);
  std::vector<CellValues> currents;
  for (const auto& r : run.results) currents.push_back(current_cells(r.frequency_hz, r.segment_currents, r.surface_currents));
  write_model_vtu(files.staging_path(stem + "_currents.vtu"), problem.mesh, problem.surfaces, currents);
  const auto written = files.commit();

  std::printf("%s\n", run_summary(run).c_str());
  std::printf("results:\n");
  for (const auto& path : written) std::printf("  %s\n", path.string().c_str());
  return 0;
}

}  // namespace lobe::cli
