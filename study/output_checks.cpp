#include "study/output_checks.hpp"

#include <fcntl.h>
#include <unistd.h>

#include <cerrno>
#include <cstring>
#include <string>

#include "core/input_error.hpp"

namespace lobe {

void check_output_directory(const std::filesystem::path& directory) {
  const SourceLocation where{"--output", 1, 1};
  std::error_code error;
  if (std::filesystem::exists(directory, error) && !std::filesystem::is_directory(directory, error))
    throw InputError(where, "'" + directory.string() + "' exists and is not a directory");
  std::filesystem::path existing = std::filesystem::absolute(directory, error);
  while (!existing.empty() && !std::filesystem::exists(existing, error)) existing = existing.parent_path();
  if (!std::filesystem::is_directory(existing, error))
    throw InputError(where, "cannot write results under '" + existing.string() + "': it is not a directory");
  // Permission bits do not tell (root passes them; /proc and read-only mounts refuse
  // anyway): create and remove a file there, before any solving.
  const auto probe = existing / (".lobe-probe-" + std::to_string(::getpid()));
  errno = 0;
  const int fd = ::open(probe.c_str(), O_WRONLY | O_CREAT | O_EXCL | O_CLOEXEC, 0600);
  if (fd < 0) throw InputError(where, "cannot write results under '" + existing.string() + "': " + std::strerror(errno));
  ::close(fd);
  ::unlink(probe.c_str());
}

void check_output_file(const std::filesystem::path& file) {
  std::error_code error;
  if (std::filesystem::is_directory(file, error))
    throw InputError({"--output", 1, 1}, "'" + file.string() + "' is a directory; name the file to write in it");
  check_output_directory(file.has_parent_path() ? file.parent_path() : std::filesystem::path("."));
}

}  // namespace lobe
