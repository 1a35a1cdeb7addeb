#include <cstdio>
#include <filesystem>
#include <fstream>

#include "bench/benchmark.hpp"
#include "cli/commands.hpp"
#include "cli/standard_output.hpp"
#include "core/output_error.hpp"
#include "post/output_files.hpp"
#include "solver/threads.hpp"
#include "study/output_checks.hpp"

namespace lobe::cli {

int bench_command(const BenchOptions& options) {
  if (options.threads > 0) set_thread_count(options.threads);
  std::filesystem::path target(options.output);
  // With -o -, the CSV goes to standard output and the table to standard error.
  const bool to_stdout = is_standard_output(options.output);
  if (!to_stdout && target.extension() != ".csv") throw InputError({"--output", 1, 1}, "the benchmark's table must end in .csv");
  const std::filesystem::path directory = target.has_parent_path() ? target.parent_path() : std::filesystem::path(".");
  // Checked before the minute of measuring, not after it.
  if (!to_stdout) check_output_directory(directory);
  const BenchmarkReport report = run_benchmark(options.quick, [](const std::string& what) {
    std::fprintf(stderr, "measuring %s ...\n", what.c_str());
  });
  std::fprintf(to_stdout ? stderr : stdout, "%s", benchmark_table(report).c_str());
  if (to_stdout) {
    std::fputs(benchmark_csv(report).c_str(), stdout);
    return 0;
  }
  OutputFiles files(directory);
  const auto staging = files.staging_path(target.filename().string());
  std::ofstream(staging) << benchmark_csv(report);
  for (const auto& path : files.commit()) std::printf("\nresults:\n  %s\n", path.string().c_str());
  return 0;
}

}  // namespace lobe::cli
