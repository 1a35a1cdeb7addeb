#pragma once
/// A finished run: the problem, the results at every frequency, and how it was run.
#include <optional>
#include <string>
#include <vector>

#include "post/frequency_result.hpp"

namespace lobe {

struct RunInfo {
  std::string version;
  int threads = 1;
  std::string command_line;
  std::optional<Real> tx_power_w;  ///< forward power at each driven port, for reflected-power figures
  int processes = 1;               ///< MPI processes that shared the frequencies (a sweep's case)
};

struct RunRecord {
  const AntennaProblem& problem;
  std::vector<FrequencyResult> results;
  RunInfo info;
};

}  // namespace lobe
