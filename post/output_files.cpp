#include "post/output_files.hpp"

#include <fcntl.h>
#include <unistd.h>

#include <fstream>
#include <stdexcept>

#include "core/output_error.hpp"

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

void OutputFiles::stage_text(const std::string& name, const std::string& text) {
  const auto path = staging_path(name);
  std::ofstream out(path, std::ios::binary);
  errno = 0;
  out << text;
  out.close();
  if (!out) throw output_error(path.string());
}

namespace {

/// Flushes a file or directory to the disk, so that a rename that follows (or preceded)
/// survives a power loss together with the data.
void flush_to_disk(const std::filesystem::path& path) {
  const int fd = ::open(path.c_str(), O_RDONLY);
  if (fd < 0) throw output_error(path.string());
  const int status = ::fsync(fd);
  ::close(fd);
  if (status != 0) throw output_error(path.string());
}

}  // namespace

std::vector<std::filesystem::path> OutputFiles::commit() {
  std::vector<std::filesystem::path> written;
  for (const auto& [staging, final_path] : m_staged) flush_to_disk(staging);
  for (const auto& [staging, final_path] : m_staged) {
    std::filesystem::rename(staging, final_path);
    written.push_back(final_path);
  }
  flush_to_disk(m_directory);
  m_committed = true;
  return written;
}

}  // namespace lobe
