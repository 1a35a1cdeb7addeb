#include "study/frequency_loop.hpp"

#include "post/run_summary.hpp"

namespace lobe {

bool solve_each_frequency(const AntennaProblem& problem, const StudyControl& control,
                          const std::function<void(FrequencySolution&&)>& use) {
  const std::vector<Real>& frequencies = problem.model.frequencies_hz;
  for (std::size_t i = 0; i < frequencies.size(); ++i) {
    if (control.cancelled()) return false;
    use(solve_frequency(problem, frequencies[i]));
    if (control.progress) control.progress(i + 1, frequencies.size(), i + 1, frequency_text(frequencies[i]));
  }
  return true;
}

}  // namespace lobe
