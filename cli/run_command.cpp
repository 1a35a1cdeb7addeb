#include <cstdio>
#include <string>
#include <vector>

#include "cli/commands.hpp"
#include "cli/progress_line.hpp"
#include "cli/standard_output.hpp"
#include "core/formatted_text.hpp"
#include "core/input_error.hpp"
#include "post/run_summary.hpp"
#include "solver/threads.hpp"
#include "study/run_study.hpp"

namespace lobe::cli {
namespace {

/// The run's configuration on `out` (standard error when standard output carries JSON).
void print_configuration(const RunOptions& options, const PreparedRun& run, std::FILE* out) {
  const Model& model = *run.model;
  const AntennaProblem& problem = *run.problem;
  std::fprintf(out, "lobe %s: %s\n", LOBE_VERSION, options.study.model_path.c_str());
  std::vector<std::string> parts{count_text(problem.mesh.segments.size(), "segment"),
                                 count_text(problem.surfaces.mesh.triangles.size(), "triangle"),
                                 count_text(problem.unknowns(), "unknown")};
  if (!model.wave) parts.push_back(count_text(model.ports.size(), "port"));
  parts.push_back(count_text(model.loads.size(), "load"));
  if (!model.network.empty()) parts.push_back(count_text(model.network.size(), "feed-network part"));
  parts.push_back("ground " + problem.medium.name() +
                  (problem.medium.has_real_ground() ? " (" + problem.medium.ground_method() + ")" : ""));
  if (!model.wave) parts.push_back(formatted("reference %.6g ohm", model.reference_ohm));
  parts.push_back(count_text(model.frequencies_hz.size(), "frequency", "frequencies"));
  parts.push_back(count_text(thread_count(), "thread"));
  std::string line = "configuration:";
  for (std::size_t i = 0; i < parts.size(); ++i) line += (i ? ", " : " ") + parts[i];
  std::fprintf(out, "%s\n", line.c_str());
  for (const auto& v : model.values)
    if (v.overridden) std::fprintf(out, "set %s = %.10g %s\n", v.name.c_str(), v.value, v.unit.c_str());
  print_long_run_estimate(problem.unknowns(), static_cast<double>(model.frequencies_hz.size()), 1.0, out);
  std::fprintf(out, "\n");
}

}  // namespace

int run_command(const RunOptions& options) {
  if (options.threads > 0) set_thread_count(options.threads);
  refuse_standard_output(options.study.output_directory, "--output", "run");
  const PreparedRun run = prepare_run(options.study);
  if (options.json && run.model->wave)
    throw InputError({"--json", 1, 1}, "the JSON summary covers antennas; a scatterer's cross-sections are in its HDF5 file");
  std::FILE* const text = options.json ? stderr : stdout;
  print_warnings(run.problem->mesh.warnings);
  print_warnings(run.problem->surfaces.warnings);
  print_configuration(options, run, text);
  RunOutcome outcome;
  {
    ProgressLine progress("frequency", run.model->frequencies_hz.size());
    StudyControl control;
    control.progress = [&](std::size_t done, std::size_t, std::size_t timed, const std::string& detail) {
      progress.update(done, timed, detail);
    };
    outcome = execute_run(run, {LOBE_VERSION, thread_count(), options.command_line, options.tx_power_w}, control);
  }
  if (options.json)
    std::fputs(outcome.json.c_str(), stdout);
  else
    std::printf("%s\n", outcome.summary.c_str());
  std::fflush(stdout);
  std::fprintf(text, "results:\n");
  for (const auto& path : outcome.written) std::fprintf(text, "  %s\n", path.string().c_str());
  return 0;
}

}  // namespace lobe::cli
