#pragma once
/// Result files that appear all together or not at all.
#include <filesystem>
#include <optional>
#include <string>
#include <vector>

namespace lobe {

/// Hands out temporary names beside the final ones; commit() renames them into place.
/// Destroyed uncommitted (an error on the way), it removes the temporaries, so a user's
/// earlier results are never replaced by a half-written set. A set of several files is
/// published under markers (.NAME.publishing beside each) that a killed process leaves
/// behind and the readers check.
class OutputFiles {
 public:
  explicit OutputFiles(std::filesystem::path directory);
  ~OutputFiles();
  OutputFiles(const OutputFiles&) = delete;
  OutputFiles& operator=(const OutputFiles&) = delete;
  /// The temporary path to write `name` to.
  std::filesystem::path staging_path(const std::string& name);
  /// Writes `text` to the temporary path of `name`; throws when the write fails (a full disk).
  void stage_text(const std::string& name, const std::string& text);
  /// Flushes every staged file to disk, renames each to its final name and flushes the
  /// directory: after a crash or power loss each file is either whole or absent.
  /// Returns the final paths.
  std::vector<std::filesystem::path> commit();

 private:
  std::filesystem::path m_directory;
  std::vector<std::pair<std::filesystem::path, std::filesystem::path>> m_staged;
  bool m_committed = false;
};

/// The marker of an interrupted publication that names `file`, if one stands in its
/// directory: the set `file` belongs to may be part new, part old, and is not to be read.
std::optional<std::filesystem::path> publishing_marker_for(const std::filesystem::path& file);

/// Removes the temporaries (.NAME.partial-PID) in `directory` left by processes that no
/// longer run (killed, or the machine lost power); those of running processes stay.
/// Returns how many it removed.
std::size_t remove_dead_temporaries(const std::filesystem::path& directory);

/// An exclusive advisory lock (flock) on a file in `directory`, held while the object
/// lives: two sweeps writing the same cases would delete each other's work.
class DirectoryLock {
 public:
  /// Throws std::runtime_error naming the holder when another process holds the lock.
  explicit DirectoryLock(const std::filesystem::path& directory);
  ~DirectoryLock();
  DirectoryLock(const DirectoryLock&) = delete;
  DirectoryLock& operator=(const DirectoryLock&) = delete;
  /// False when another process holds the lock (nothing is held then).
  bool held() const { return m_fd >= 0; }

 private:
  int m_fd = -1;
};

}  // namespace lobe
