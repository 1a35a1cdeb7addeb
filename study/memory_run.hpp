#pragma once
/// A model's frequencies solved and evaluated in memory, no files written: for callers that
/// solve many variants in one process (lobe.solve from Python optimisers).
#include <vector>

#include "post/frequency_result.hpp"
#include "study/study_control.hpp"

namespace lobe {

/// Every frequency of the problem's model, solved (or, sampling adaptively, interpolated)
/// through the one frequency loop and evaluated, in the model's order.
std::vector<FrequencyResult> solve_in_memory(const AntennaProblem& problem, FrequencySampling sampling,
                                             const FigureOptions& figures = {});

}  // namespace lobe
