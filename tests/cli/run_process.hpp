#pragma once
/// Runs the lobe executable as a user would and captures what it prints.
#include <sys/wait.h>
#include <unistd.h>

#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>

#include "support/scratch_directory.hpp"

namespace lobe::testing {

struct ProcessResult {
  int exit_code = -1;
  std::string out;
  std::string err;
};

inline std::string read_text(const std::filesystem::path& path) {
  std::ifstream in(path, std::ios::binary);
  std::ostringstream s;
  s << in.rdbuf();
  return s.str();
}

/// Runs `lobe ARGS` with a 120 s limit (a hang shows as exit code 124). With
/// `file_size_kib`, no file the process writes may grow beyond that (writes past it fail
/// with EFBIG, as on a full disk). A `launcher` (mpirun and its options) starts lobe.
inline ProcessResult run_lobe(const std::string& args, const std::filesystem::path& scratch, int file_size_kib = 0,
                              const std::string& launcher = "") {
  std::filesystem::create_directories(scratch);
  const auto out = scratch / "stdout.txt", err = scratch / "stderr.txt";
  // std::system runs /bin/sh, whose ulimit -f counts 512-byte blocks (POSIX).
  const std::string limit =
      file_size_kib > 0 ? "ulimit -f " + std::to_string(2 * file_size_kib) + "; trap '' XFSZ; " : std::string();
  const std::string command = limit + "timeout 120 " + launcher + " " + std::string(LOBE_EXECUTABLE) + " " + args + " > '" + out.string() +
                              "' 2> '" + err.string() + "' < /dev/null";
  const int status = std::system(command.c_str());
  ProcessResult r;
  r.exit_code = WIFEXITED(status) ? WEXITSTATUS(status) : -1;
  r.out = read_text(out);
  r.err = read_text(err);
  return r;
}

}  // namespace lobe::testing
