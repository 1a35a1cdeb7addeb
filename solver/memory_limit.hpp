#pragma once
/// How much memory this process can really have for its matrices.
#include <string>

namespace lobe {

/// The smallest of what the machine has free now (MemAvailable), what the process's
/// control group still allows (cgroup v2 or v1 limit less usage), and what its address-space
/// limit (ulimit -v) leaves; bytes, with the name of the one that binds.
struct MemoryBudget {
  double bytes = 0.0;
  std::string source;
};
MemoryBudget usable_memory();

}  // namespace lobe
