#pragma once
/// A finished run: the problem, the results at every frequency, and how it was run.
#include <string>
#include <vector>

#include "post/frequency_result.hpp"

namespace lobe {

struct RunInfo {
  std::string version;
  int threads = 1;
  std::string command_line;
};

struct RunRecord {
  const AntennaProblem& problem;
  std::vector<FrequencyResult> results;
  RunInfo info;
};

}  // namespace lobe
