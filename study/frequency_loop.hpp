#pragma once
/// The one frequency loop: every study (a run, a sweep's case, a tuning evaluation)
/// solves its frequencies through it.
#include <functional>

#include "solver/antenna_problem.hpp"
#include "study/study_control.hpp"

namespace lobe {

/// Solves the problem at each of its model's frequencies in order and hands each solution
/// to `use`; reports progress after each. Returns false when cancelled before the last
/// (the solutions handed over so far stand).
bool solve_each_frequency(const AntennaProblem& problem, const StudyControl& control,
                          const std::function<void(FrequencySolution&&)>& use);

}  // namespace lobe
