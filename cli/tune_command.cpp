#include <cstdio>

#include "cli/commands.hpp"
#include "cli/interrupt.hpp"
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
  std::printf("best %s %.5g over %s (%s to %s) after %d evaluations:\n", options.study.goal.c_str(), outcome.best,
              tuning.band.name.c_str(), frequency_text(tuning.band.low_hz).c_str(),
              frequency_text(tuning.band.high_hz).c_str(), outcome.evaluations);
  for (std::size_t i = 0; i < tuning.tuned.size(); ++i)
    std::printf("  %s = %s\n", tuning.tuned[i].name.c_str(), shown_text(outcome.best_si[i], tuning.tuned[i].shown).c_str());
  std::printf("written: %s\n", outcome.written.string().c_str());
  return outcome.finished ? 0 : 130;
}

}  // namespace lobe::cli
