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

/// Ranges of fewer frequencies are solved in full even when sampling adaptively.
constexpr std::size_t fewest_adaptive_frequencies = 21;

/// The adaptive sweep's target: interpolated S-parameters within this of the solved ones
/// (the stopping test compares successive interpolants and each new solve with its
/// prediction; the tests check 0.01 against every frequency solved in full).
constexpr Real adaptive_s_tolerance = 1e-3;

/// Solves the problem at each of its model's frequencies and hands each solution, with its
/// index in the model's frequencies, to `use`; reports progress after each. A small problem
/// (above) solves several frequencies at once: `use` is then called from several threads at
/// once and in any order, so it must store by index. With adaptive sampling of a long
/// range, some frequencies are solved in full and the others get the rational interpolant
/// of the solved ones (FrequencySolution::interpolated; see study/adaptive_frequencies).
/// Returns false when cancelled before the last (the solutions handed over so far stand).
bool solve_each_frequency(const AntennaProblem& problem, const StudyControl& control,
                          const std::function<void(std::size_t index, FrequencySolution&&)>& use,
                          FrequencySampling sampling = FrequencySampling::every);

/// Solves the frequencies of the model at `indices` (side by side when the problem is
/// small), handing each to `use` as above. Returns false when cancelled.
bool solve_frequencies(const AntennaProblem& problem, const std::vector<std::size_t>& indices,
                       const StudyControl& control, const std::function<void(std::size_t, FrequencySolution&&)>& use);

}  // namespace lobe
