#pragma once
/// A frequency's solution as a flat run of doubles and back, to pass between the processes
/// that share a case's frequencies. Exact: every value travels as its own bits.
#include <vector>

#include "solver/antenna_problem.hpp"

namespace lobe {

/// Appends `solution` to `out`.
void pack_solution(const FrequencySolution& solution, std::vector<double>& out);

/// Reads one solution at `at` (as pack_solution wrote it) and moves `at` past it; throws
/// std::runtime_error when the run ends too soon.
FrequencySolution unpack_solution(const std::vector<double>& in, std::size_t& at);

}  // namespace lobe
