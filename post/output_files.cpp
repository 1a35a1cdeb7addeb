#include "post/output_files.hpp"

#include <fcntl.h>
#include <signal.h>
#include <sys/file.h>
#include <unistd.h>

#include <cerrno>
#include <fstream>
#include <optional>
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

/// The marker that stands beside `file` while the set it belongs to is published.
std::filesystem::path marker_of(const std::filesystem::path& file) {
  return file.parent_path() / ("." + file.filename().string() + ".publishing");
}

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
  // Everything that could stop the renames halfway is checked before the first: a
  // directory standing where a file goes once left new and old files mixed.
  for (const auto& [staging, final_path] : m_staged) {
    std::error_code error;
    if (std::filesystem::is_directory(final_path, error))
      throw OutputError("cannot write " + final_path.string() + ": a directory stands where the file goes");
  }
  for (const auto& [staging, final_path] : m_staged) flush_to_disk(staging);
  // A set of more than one file cannot appear in one rename. Beside each of its files a
  // marker (.NAME.publishing) is on disk before the first rename and gone after the last:
  // a process killed in between leaves them behind, and the readers refuse the files they
  // stand beside (publishing_marker_for, one look-up per file read).
  const bool several = m_staged.size() > 1;
  if (several) {
    std::string names;
    for (const auto& [staging, final_path] : m_staged) names += final_path.filename().string() + "\n";
    for (const auto& [staging, final_path] : m_staged) {
      const auto marker = marker_of(final_path);
      errno = 0;
      std::ofstream out(marker, std::ios::binary);
      out << "published together, interrupted if this file remains:\n" << names;
      out.close();
      if (!out) throw output_error(marker.string());
    }
    flush_to_disk(m_directory);
  }
  for (const auto& [staging, final_path] : m_staged) {
    std::filesystem::rename(staging, final_path);
    written.push_back(final_path);
  }
  flush_to_disk(m_directory);
  if (several) {
    for (const auto& path : written) std::filesystem::remove(marker_of(path));
    flush_to_disk(m_directory);
  }
  m_committed = true;
  return written;
}

std::optional<std::filesystem::path> publishing_marker_for(const std::filesystem::path& file) {
  std::error_code error;
  const auto marker = marker_of(file);
  if (std::filesystem::exists(marker, error)) return marker;
  return std::nullopt;
}

std::size_t remove_dead_temporaries(const std::filesystem::path& directory) {
  std::size_t removed = 0;
  std::error_code error;
  for (const auto& entry : std::filesystem::directory_iterator(directory, error)) {
    const std::string name = entry.path().filename().string();
    const auto at = name.rfind(".partial-");
    if (name.empty() || name[0] != '.' || at == std::string::npos) continue;
    const std::string digits = name.substr(at + 9);
    if (digits.empty() || digits.size() > 9 || digits.find_first_not_of("0123456789") != std::string::npos) continue;
    const pid_t pid = static_cast<pid_t>(std::stol(digits));
    // kill(pid, 0) sends nothing; ESRCH says no such process exists.
    if (pid == ::getpid() || ::kill(pid, 0) == 0 || errno != ESRCH) continue;
    std::error_code ignored;
    removed += std::filesystem::remove(entry.path(), ignored) ? 1 : 0;
  }
  return removed;
}

DirectoryLock::DirectoryLock(const std::filesystem::path& directory) {
  const auto path = directory / ".lock";
  const int fd = ::open(path.c_str(), O_RDWR | O_CREAT | O_CLOEXEC, 0644);
  if (fd < 0) throw output_error(path.string());
  if (::flock(fd, LOCK_EX | LOCK_NB) != 0) {
    ::close(fd);
    return;
  }
  m_fd = fd;
}

DirectoryLock::~DirectoryLock() {
  if (m_fd >= 0) ::close(m_fd);  // closing releases the lock
}

}  // namespace lobe
