#include <algorithm>
#include <cstdio>
#include <optional>
#include <thread>

#include "cli/commands.hpp"
#include "cli/interrupt.hpp"
#include "cli/progress_line.hpp"
#include "post/run_summary.hpp"
#include "post/sweep_file.hpp"
#include "solver/threads.hpp"
#include "study/process_ranks.hpp"
#include "study/sweep_study.hpp"

namespace lobe::cli {
int sweep_command(const SweepOptions& options) {
  // Processes started together on one machine share its cores unless told otherwise.
  const int cores = static_cast<int>(std::max(1u, std::thread::hardware_concurrency()));
  if (options.threads > 0)
    set_thread_count(options.threads);
  else if (processes_on_this_machine() > 1)
    set_thread_count(std::max(1, cores / processes_on_this_machine()));
  const PreparedSweep sweep = prepare_sweep(options.study);
  // Under mpirun the first process reports for the job; the others work quietly.
  const bool reporting = process_rank() == 0;
  std::optional<ProgressLine> progress;
  if (reporting) progress.emplace("case", sweep.grid.size());
  StudyControl control;
  control.cancel = &cancel_on_interrupt();
  if (reporting) {
    control.progress = [&](std::size_t done, std::size_t, std::size_t timed, const std::string&) { progress->update(done, timed); };
    control.warning = [](const MeshWarning& w, const std::string& where) {
      std::fprintf(stderr, "\n%s (%s)\n", w.formatted().c_str(), where.c_str());
    };
    control.notice = [](const std::string& text) { std::fprintf(stderr, "\n%s\n", text.c_str()); };
    control.workload = [](double unknowns, double solves) { print_long_run_estimate(unknowns, solves); };
  }
  SweepOutcome outcome;
  try {
    outcome = execute_sweep(sweep, control);
  } catch (...) {
    progress.reset();  // end the progress line before the error is printed
    throw;
  }
  progress.reset();
  if (!reporting) return outcome.finished ? 0 : 130;
  if (!outcome.finished) {
    std::fprintf(stderr, "interrupted: %zu of %zu cases are saved in %s; run the same command again to go on\n",
                 outcome.solved + outcome.skipped, sweep.grid.size(), sweep.case_directory.string().c_str());
    return 130;
  }
  std::printf("%zu cases (%zu solved now, %zu from before) in %s\n", sweep.grid.size(), outcome.solved, outcome.skipped,
              sweep.output.string().c_str());
  if (options.study.rank.empty()) return 0;
  const std::vector<RankedCase> ranked = rank_sweep(sweep, outcome.case_files);
  std::printf("\nbest cases by %s over %s (%s to %s), first port:\n", options.study.rank.c_str(), sweep.band->name.c_str(),
              frequency_text(sweep.band->low_hz).c_str(), frequency_text(sweep.band->high_hz).c_str());
  for (std::size_t k = 0; k < std::min<std::size_t>(10, ranked.size()); ++k) {
    std::printf("  %2zu. %s  %-12.4g", k + 1, case_name(ranked[k].index).c_str(), ranked[k].figure);
    for (std::size_t v = 0; v < sweep.grid.varied.size(); ++v)
      std::printf("  %s = %s", sweep.grid.varied[v].name.c_str(), sweep.grid.labels[ranked[k].index][v].c_str());
    std::printf("\n");
  }
  return 0;
}

}  // namespace lobe::cli
