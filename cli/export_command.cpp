#include <cstdio>
#include <filesystem>

#include "cli/commands.hpp"
#include "cli/standard_output.hpp"
#include "study/output_checks.hpp"
#include "post/output_files.hpp"
#include "post/result_reader.hpp"
#include "post/sweep_file.hpp"

namespace lobe::cli {

std::string result_group(const std::string& path, const std::string& case_option) {
  if (!is_sweep_file(path)) {
    if (!case_option.empty())
      throw InputError({"--case", 1, 1}, "'" + path + "' is a single result; --case picks a case of a sweep file");
    return "";
  }
  const SweepTable table = read_sweep_table(path);
  if (case_option.empty())
    throw InputError({path, 1, 1}, "this is a sweep file of " + std::to_string(table.values.size()) +
                                       " cases; pick one with --case case-000001 (`lobe sweep --rank` and `lobe plot` "
                                       "name the best), or re-run it with `lobe run --set ...`");
  for (std::size_t c = 0; c < table.values.size(); ++c)
    if (case_name(c) == case_option) return case_group(c);
  throw InputError({"--case", 1, 1}, "the sweep has no case '" + case_option + "'; its cases are case-000001 to " +
                                         case_name(table.values.size() - 1));
}

int export_command(const ExportOptions& options) {
  const std::string group = result_group(options.result_path, options.case_name);
  const NetworkData network = read_result_network(options.result_path, group);
  const std::string extension = ".s" + std::to_string(network.ports()) + "p";
  std::filesystem::path stem = std::filesystem::path(options.result_path).stem();
  if (!group.empty()) stem += "_" + options.case_name;
  std::filesystem::path target = std::filesystem::path(options.result_path).parent_path() / (stem.string() + extension);
  TouchstoneStyle style;
  style.version = options.version;
  style.format = options.format == "ma"   ? TouchstoneFormat::magnitude_angle
                 : options.format == "db" ? TouchstoneFormat::decibel_angle
                                          : TouchstoneFormat::real_imaginary;
  style.unit_hz = options.unit == "Hz" ? 1.0 : options.unit == "kHz" ? 1e3 : options.unit == "MHz" ? 1e6 : 1e9;
  const std::string comment = "S-parameters computed by lobe " LOBE_VERSION " from " + options.result_path + "\n(simulated, not measured)";
  if (is_standard_output(options.output)) {
    write_through_standard_output(extension, [&](const std::filesystem::path& path) { write_touchstone(path, network, style, comment); });
    return 0;
  }
  // -o names the file, or a directory to write the default name into.
  if (!options.output.empty())
    target = std::filesystem::is_directory(options.output) ? std::filesystem::path(options.output) / target.filename()
                                                           : std::filesystem::path(options.output);
  if (options.version == 1 && target.extension() != extension)
    throw InputError({"--output", 1, 1}, "a version 1 Touchstone file of " + std::to_string(network.ports()) +
                                             " ports must end in " + extension);
  const std::filesystem::path directory = target.has_parent_path() ? target.parent_path() : std::filesystem::path(".");
  check_output_directory(directory);
  OutputFiles files(directory);
  write_touchstone(files.staging_path(target.filename().string()), network, style, comment);
  for (const auto& path : files.commit()) std::printf("%s\n", path.string().c_str());
  return 0;
}

}  // namespace lobe::cli
