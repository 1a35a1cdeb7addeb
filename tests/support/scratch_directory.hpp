#pragma once
/// Scratch space for tests. ctest runs tests in parallel processes, so each process gets
/// its own directory: two tests writing "bad.csv" in one shared directory once read each
/// other's file.
#include <unistd.h>

#include <filesystem>
#include <string>

namespace lobe::testing {

/// This process's own scratch directory `name` (created if missing, contents kept).
inline std::filesystem::path scratch_directory(const std::string& name) {
  const auto dir = std::filesystem::temp_directory_path() / ("lobe-test-" + std::to_string(::getpid())) / name;
  std::filesystem::create_directories(dir);
  return dir;
}

/// A fresh empty directory `name` under this process's own scratch directory.
inline std::filesystem::path fresh_directory(const std::string& name) {
  std::filesystem::remove_all(scratch_directory(name));
  return scratch_directory(name);
}

}  // namespace lobe::testing
