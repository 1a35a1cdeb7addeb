#pragma once
/// Reading a whole input file, bounded, from a path the user gave.
#include <fcntl.h>
#include <sys/stat.h>
#include <unistd.h>

#include <cerrno>
#include <cstring>
#include <string>

#include "core/input_error.hpp"

namespace lobe {

/// The contents of the regular file at `path`, at most `limit` bytes. Refuses a directory,
/// a device or a FIFO (which may never end or never answer), a file larger than the limit
/// (reading stops at limit + 1 bytes, whatever the file claims) and unreadable files, each
/// as an InputError located at the path; `what` names the file in messages ("the model file").
inline std::string read_text_file(const std::string& path, std::size_t limit, const std::string& what) {
  const SourceLocation where{path, 1, 1};
  // O_NONBLOCK so that opening a FIFO with no writer does not hang before fstat can refuse it.
  const int fd = ::open(path.c_str(), O_RDONLY | O_NONBLOCK | O_CLOEXEC);
  if (fd < 0) throw InputError(where, "cannot open " + what + ": " + std::strerror(errno));
  struct Closer {
    int fd;
    ~Closer() { ::close(fd); }
  } closer{fd};
  struct stat info {};
  if (::fstat(fd, &info) != 0) throw InputError(where, "cannot read " + what + ": " + std::strerror(errno));
  if (S_ISDIR(info.st_mode)) throw InputError(where, what + " is a directory");
  if (!S_ISREG(info.st_mode)) throw InputError(where, what + " is not a regular file (a device, FIFO or socket)");
  std::string text;
  char buffer[1 << 16];
  while (text.size() <= limit) {
    const ssize_t n = ::read(fd, buffer, sizeof buffer);
    if (n < 0 && errno == EINTR) continue;
    if (n < 0) throw InputError(where, "cannot read " + what + ": " + std::strerror(errno));
    if (n == 0) return text;
    text.append(buffer, static_cast<std::size_t>(n));
  }
  throw InputError(where, what + " is larger than " + std::to_string(limit >> 20) + " MiB, the most lobe reads");
}

}  // namespace lobe
