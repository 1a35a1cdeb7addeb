#include <cstdio>
#include <filesystem>

#include "cli/commands.hpp"
#include "post/output_files.hpp"
#include "post/result_reader.hpp"

namespace lobe::cli {

int export_command(const ExportOptions& options) {
  const NetworkData network = read_result_network(options.result_path);
  const std::string extension = ".s" + std::to_string(network.ports()) + "p";
  std::filesystem::path target = options.output.empty()
                                     ? std::filesystem::path(options.result_path).replace_extension(extension)
                                     : std::filesystem::path(options.output);
  if (options.version == 1 && target.extension() != extension)
    throw InputError({"--output", 1, 1}, "a version 1 Touchstone file of " + std::to_string(network.ports()) +
                                             " ports must end in " + extension);
  const std::filesystem::path directory = target.has_parent_path() ? target.parent_path() : std::filesystem::path(".");
  check_output_directory(directory);
  TouchstoneStyle style;
  style.version = options.version;
  style.format = options.format == "ma"   ? TouchstoneFormat::magnitude_angle
                 : options.format == "db" ? TouchstoneFormat::decibel_angle
                                          : TouchstoneFormat::real_imaginary;
  style.unit_hz = options.unit == "Hz" ? 1.0 : options.unit == "kHz" ? 1e3 : options.unit == "MHz" ? 1e6 : 1e9;
  OutputFiles files(directory);
  write_touchstone(files.staging_path(target.filename().string()), network, style,
                   "S-parameters computed by lobe " LOBE_VERSION " from " + options.result_path +
                       "\n(simulated, not measured)");
  for (const auto& path : files.commit()) std::printf("%s\n", path.string().c_str());
  return 0;
}

}  // namespace lobe::cli
