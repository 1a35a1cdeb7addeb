#include "study/memory_run.hpp"

#include "study/frequency_loop.hpp"

namespace lobe {

std::vector<FrequencyResult> solve_in_memory(const AntennaProblem& problem, FrequencySampling sampling,
                                             const FigureOptions& figures) {
  std::vector<FrequencyResult> results(problem.model.frequencies_hz.size());
  solve_each_frequency(
      problem, StudyControl{},
      [&](std::size_t index, FrequencySolution&& solution) { results[index] = evaluate_frequency(problem, solution, figures); },
      sampling);
  return results;
}

}  // namespace lobe
