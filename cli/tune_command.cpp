#include <cstdio>

#include "cli/commands.hpp"
#include "cli/interrupt.hpp"
#include "core/formatted_text.hpp"
#include "core/number_text.hpp"
#include "post/run_summary.hpp"
#include "solver/threads.hpp"
#include "study/tune_study.hpp"

namespace lobe::cli {
int tune_command(const TuneOptions& options) {
  if (options.threads > 0) set_thread_count(options.threads);
  const PreparedTuning tuning = prepare_tuning(options.study);
  StudyControl control;
  control.cancel = &cancel_on_interrupt();
  control.progress = [](std::size_t done, std::size_t, std::size_t, const std::string& detail) {
    std::fprintf(stderr, "evaluation %zu: %s\n", done, detail.c_str());
  };
  const TuneOutcome outcome = execute_tuning(tuning, control);
  if (outcome.evaluations == 0) {
    std::fprintf(stderr, "interrupted before the first evaluation finished; nothing written\n");
    return 130;
  }
  if (!outcome.finished) std::fprintf(stderr, "interrupted: the best of %d evaluations is written\n", outcome.evaluations);
  const DesignGoal& goal = tuning.goal;
  const Judgement& best = outcome.best;
  const std::string value = best.value ? formatted("%.5g", *best.value) : std::string("n/a");
  // With -o -, the tuned model goes to standard output and the report to standard error.
  const bool to_stdout = options.study.output == "-";
  std::FILE* const out = to_stdout ? stderr : stdout;
  std::fprintf(out, "best %s %s over %s (%s to %s) after %d evaluations", goal.text.c_str(), value.c_str(),
               tuning.band.name.c_str(), frequency_text(tuning.band.low_hz).c_str(),
              frequency_text(tuning.band.high_hz).c_str(), outcome.evaluations);
  if (!tuning.limits.empty()) {
    std::string limits;
    for (const auto& l : tuning.limits) limits += (limits.empty() ? "" : ", ") + l.text;
    std::fprintf(out, ", subject to %s", limits.c_str());
  }
  std::fprintf(out, ":\n");
  for (std::size_t i = 0; i < tuning.tuned.size(); ++i)
    std::fprintf(out, "  %s = %s\n", tuning.tuned[i].name.c_str(), shown_text(outcome.best_si[i], tuning.tuned[i].shown).c_str());
  if (!tuning.limits.empty() && !best.meets())
    std::fprintf(out, "! no evaluation met every limit; the nearest %s: loosen a limit, widen a range or allow more evaluations\n",
                misses_text(best, tuning.limits).c_str());
  if (!outcome.at_bounds.empty()) {
    std::string names;
    for (const auto& n : outcome.at_bounds) names += (names.empty() ? "" : ", ") + n;
    std::fprintf(out, "! the best lies on a bound of the search (%s): a better one may lie beyond; widen the range there\n",
                names.c_str());
  }
  if (to_stdout)
    std::fputs(outcome.text.c_str(), stdout);
  else
    std::fprintf(out, "written: %s\n", outcome.written.string().c_str());
  return outcome.finished ? 0 : 130;
}

}  // namespace lobe::cli
