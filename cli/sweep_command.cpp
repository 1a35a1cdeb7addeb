#include <algorithm>
#include <cstdio>
#include <optional>
#include <thread>

#include "cli/commands.hpp"
#include "cli/interrupt.hpp"
#include "cli/progress_line.hpp"
#include "cli/standard_output.hpp"
#include "cli/sweep_json.hpp"
#include "core/formatted_text.hpp"
#include "post/run_summary.hpp"
#include "post/sweep_file.hpp"
#include "solver/threads.hpp"
#include "study/process_ranks.hpp"
#include "study/sweep_study.hpp"

namespace lobe::cli {
namespace {

/// The best cases, best first: the goal's value, whether each meets the limits and by how
/// much the others miss, and a warning when the best lies on the edge of the grid.
void print_ranking(std::FILE* out, const PreparedSweep& sweep, const std::vector<RankedCase>& ranked) {
  const DesignGoal& goal = *sweep.goal;
  const std::string goal_text = goal.single() ? band_figure_title(goal.terms.front().figure) : goal.text + " (minimised)";
  std::fprintf(out, "\nbest cases by %s over %s (%s to %s), first port", goal_text.c_str(), sweep.band->name.c_str(),
              frequency_text(sweep.band->low_hz).c_str(), frequency_text(sweep.band->high_hz).c_str());
  if (!sweep.limits.empty()) {
    std::string limits;
    for (const auto& l : sweep.limits) limits += (limits.empty() ? "" : ", ") + l.text;
    const auto meeting = std::count_if(ranked.begin(), ranked.end(), [](const RankedCase& r) { return r.judgement.meets(); });
    std::fprintf(out, ", subject to %s: %zu of %zu cases meet them", limits.c_str(), static_cast<std::size_t>(meeting), ranked.size());
  }
  std::fprintf(out, ":\n");
  for (std::size_t k = 0; k < std::min<std::size_t>(10, ranked.size()); ++k) {
    const Judgement& j = ranked[k].judgement;
    const std::string value = j.value ? formatted("%-10.4g", *j.value) : std::string("n/a       ");
    std::fprintf(out, "  %2zu. %s  %s", k + 1, case_name(ranked[k].index).c_str(), value.c_str());
    for (std::size_t v = 0; v < sweep.grid.varied.size(); ++v)
      std::fprintf(out, "  %s = %s", sweep.grid.varied[v].name.c_str(), sweep.grid.labels[ranked[k].index][v].c_str());
    if (!sweep.limits.empty()) std::fprintf(out, "  %s", j.meets() ? "meets the limits" : misses_text(j, sweep.limits).c_str());
    std::fprintf(out, "\n");
  }
  if (ranked.empty()) return;
  const SweepTable table{sweep.grid.names(), sweep.grid.values, sweep.grid.labels, sweep.values_si};
  const auto edge = names_at_grid_edge(table, ranked.front().index);
  if (!edge.empty()) {
    std::string names;
    for (const auto& n : edge) names += (names.empty() ? "" : ", ") + n;
    std::fprintf(out, "! the best case lies on the edge of the grid (%s): a better one may lie beyond; widen the range there\n",
                names.c_str());
  }
}

}  // namespace

int sweep_command(const SweepOptions& options) {
  // Processes started together on one machine share its cores unless told otherwise.
  const int cores = static_cast<int>(std::max(1u, std::thread::hardware_concurrency()));
  if (options.threads > 0)
    set_thread_count(options.threads);
  else if (processes_on_this_machine() > 1)
    set_thread_count(std::max(1, cores / processes_on_this_machine()));
  refuse_standard_output(options.study.output, "--output", "sweep (a file and its case folder)");
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
  std::FILE* const text = options.json ? stderr : stdout;
  std::fprintf(text, "%zu cases (%zu solved now, %zu from before) in %s\n", sweep.grid.size(), outcome.solved, outcome.skipped,
               sweep.output.string().c_str());
  const std::vector<RankedCase> ranked = sweep.goal ? rank_sweep(sweep, outcome.case_files) : std::vector<RankedCase>{};
  if (sweep.goal) print_ranking(text, sweep, ranked);
  if (options.json) std::fputs(sweep_summary_json(sweep, outcome, ranked).c_str(), stdout);
  return 0;
}

}  // namespace lobe::cli
