#include "cli/standard_output.hpp"

#include <unistd.h>

#include <cstdio>
#include <fstream>

#include "core/input_error.hpp"
#include "core/output_error.hpp"

namespace lobe::cli {

void write_through_standard_output(const std::string& extension, const std::function<void(const std::filesystem::path&)>& write) {
  const std::filesystem::path temporary =
      std::filesystem::temp_directory_path() / ("lobe-standard-output-" + std::to_string(::getpid()) + extension);
  struct Removal {
    const std::filesystem::path& path;
    ~Removal() {
      std::error_code ignored;
      std::filesystem::remove(path, ignored);
    }
  } removal{temporary};
  write(temporary);
  std::ifstream in(temporary, std::ios::binary);
  char buffer[1 << 16];
  while (in.read(buffer, sizeof buffer) || in.gcount() > 0)
    if (std::fwrite(buffer, 1, static_cast<std::size_t>(in.gcount()), stdout) != static_cast<std::size_t>(in.gcount()))
      throw OutputError("standard output: the write failed");
  if (std::fflush(stdout) != 0) throw OutputError("standard output: the write failed");
}

void refuse_standard_output(const std::string& output, const std::string& option, const std::string& what) {
  if (output == "-")
    throw InputError({option, 1, 1}, "'-' sends one file to standard output, but " + what +
                                         " writes several; name a directory");
}

}  // namespace lobe::cli
