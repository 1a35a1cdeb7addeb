#pragma once
/// Results that could not be written: a full disk, a failing device, no permission.
#include <cerrno>
#include <cstring>
#include <stdexcept>
#include <string>

namespace lobe {

/// Not bad input and not a numerical failure: the machine refused the write. The message
/// names the path and the system's reason; earlier results are left as they were.
class OutputError : public std::runtime_error {
 public:
  using std::runtime_error::runtime_error;
};

/// "cannot write PATH: No space left on device", from the errno of the failed call. A
/// staged temporary (DIR/.NAME.partial-PID) is named by the file it was to become.
inline OutputError output_error(std::string path) {
  const std::string reason = errno ? std::strerror(errno) : "the write failed";
  const auto slash = path.rfind('/') + 1, partial = path.rfind(".partial-");
  if (partial != std::string::npos && partial > slash && path[slash] == '.')
    path = path.substr(0, slash) + path.substr(slash + 1, partial - slash - 1);
  return OutputError("cannot write " + path + ": " + reason);
}

}  // namespace lobe
