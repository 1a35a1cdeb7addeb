#include "post/output_files.hpp"

#include <unistd.h>

namespace lobe {

OutputFiles::OutputFiles(std::filesystem::path directory) : m_directory(std::move(directory)) {
  std::filesystem::create_directories(m_directory);
}

OutputFiles::~OutputFiles() {
  if (m_committed) return;
  std::error_code ignored;
  for (const auto& [staging, final_path] : m_staged) std::filesystem::remove(staging, ignored);
}

std::filesystem::path OutputFiles::staging_path(const std::string& name) {
  const auto final_path = m_directory / name;
  const auto staging = m_directory / ("." + name + ".partial-" + std::to_string(::getpid()));
  m_staged.emplace_back(staging, final_path);
  return staging;
}

std::vector<std::filesystem::path> OutputFiles::commit() {
  std::vector<std::filesystem::path> written;
  for (const auto& [staging, final_path] : m_staged) {
    std::filesystem::rename(staging, final_path);
    written.push_back(final_path);
  }
  m_committed = true;
  return written;
}

}  // namespace lobe
