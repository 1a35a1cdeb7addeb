#pragma once
/// The one frequency loop: every study (a run, a sweep's case, a tuning evaluation)
/// solves its frequencies through it.
#include <functional>

#include "solver/antenna_problem.hpp"
#include "study/study_control.hpp"

namespace lobe {

/// Problems of at most this many unknowns solve their frequencies side by side, one thread
/// each, when several threads are free: threads inside a solve of a few hundred unknowns
/// cost more than they save. Sweeps use the same bound for their cases.
constexpr int largest_problem_side_by_side = 1000;

/// Solves the problem at each of its model's frequencies and hands each solution, with its
/// index in the model's frequencies, to `use`; reports progress after each. A small problem
/// (above) solves several frequencies at once: `use` is then called from several threads at
/// once and in any order, so it must store by index. Returns false when cancelled before
/// the last (the solutions handed over so far stand).
bool solve_each_frequency(const AntennaProblem& problem, const StudyControl& control,
                          const std::function<void(std::size_t index, FrequencySolution&&)>& use);

}  // namespace lobe
