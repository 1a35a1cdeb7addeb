#include "solver/memory_limit.hpp"

#include <sys/resource.h>
#include <unistd.h>

#include <cmath>
#include <fstream>
#include <sstream>

namespace lobe {
namespace {

/// The first number in a file such as /sys/fs/cgroup/memory.max; none for "max" or absent.
bool read_number(const char* path, double& value) {
  std::ifstream in(path);
  std::string word;
  if (!(in >> word) || word == "max") return false;
  std::istringstream number(word);
  return static_cast<bool>(number >> value) && value > 0.0;
}

/// MemAvailable in /proc/meminfo, bytes: free memory plus what the kernel can reclaim.
bool memory_available(double& bytes) {
  std::ifstream in("/proc/meminfo");
  std::string key, unit;
  double kib = 0.0;
  while (in >> key >> kib >> unit)
    if (key == "MemAvailable:") {
      bytes = kib * 1024.0;
      return true;
    }
  return false;
}

}  // namespace

MemoryBudget usable_memory() {
  MemoryBudget budget{static_cast<double>(sysconf(_SC_PHYS_PAGES)) * static_cast<double>(sysconf(_SC_PAGE_SIZE)),
                      "this machine's memory"};
  auto consider = [&](double bytes, const char* source) {
    if (bytes < budget.bytes) budget = {std::max(0.0, bytes), source};
  };
  double value = 0.0, used = 0.0;
  if (memory_available(value)) consider(value, "the memory free now");
  if (read_number("/sys/fs/cgroup/memory.max", value)) {
    read_number("/sys/fs/cgroup/memory.current", used);
    consider(value - used, "the control group's memory limit");
  } else if (read_number("/sys/fs/cgroup/memory/memory.limit_in_bytes", value) && value < 1e18) {
    read_number("/sys/fs/cgroup/memory/memory.usage_in_bytes", used);
    consider(value - used, "the control group's memory limit");
  }
  rlimit limit{};
  if (getrlimit(RLIMIT_AS, &limit) == 0 && limit.rlim_cur != RLIM_INFINITY) {
    double pages = 0.0;
    std::ifstream statm("/proc/self/statm");
    statm >> pages;
    consider(static_cast<double>(limit.rlim_cur) - pages * static_cast<double>(sysconf(_SC_PAGE_SIZE)),
             "the address-space limit (ulimit -v)");
  }
  return budget;
}

}  // namespace lobe
