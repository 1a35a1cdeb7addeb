#include <atomic>
#include <csignal>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <set>
#include <sstream>

#include "cli/commands.hpp"
#include "cli/progress_line.hpp"
#include "core/output_error.hpp"
#include "cli/model_loading.hpp"
#include "core/formatted_text.hpp"
#include "geometry/model_parser.hpp"
#include "post/band_report.hpp"
#include "post/hdf5_writer.hpp"
#include "post/output_files.hpp"
#include "post/result_reader.hpp"
#include "post/run_summary.hpp"
#include "post/sweep_file.hpp"
#include "solver/threads.hpp"

namespace lobe::cli {
namespace {

std::atomic<bool> interrupted{false};
extern "C" void on_interrupt(int) { interrupted = true; }

/// Every combination of the varied values (or of their labels), the first name varying slowest.
std::vector<std::vector<std::string>> combinations(const std::vector<VariedName>& varied,
                                                   std::vector<std::string> VariedName::*texts) {
  std::vector<std::vector<std::string>> cases{{}};
  for (const auto& v : varied) {
    std::vector<std::vector<std::string>> next;
    for (const auto& c : cases)
      for (const auto& value : v.*texts) {
        next.push_back(c);
        next.back().push_back(value);
      }
    cases = std::move(next);
  }
  return cases;
}

/// What identifies a sweep: the model text, the fixed overrides and every case. A case
/// directory left by another sweep must not be mixed into this one.
std::string manifest(const std::string& model_text, const SweepOptions& o, const std::vector<VariedName>& varied,
                     const std::vector<std::vector<std::string>>& cases) {
  std::ostringstream m;
  m << "lobe sweep cases\nmodel:\n" << model_text << "\nfixed:";
  for (const auto& s : o.set_options) m << ' ' << s;
  m << "\nvaried:";
  for (const auto& v : varied) m << ' ' << v.name;
  m << '\n';
  for (std::size_t c = 0; c < cases.size(); ++c) {
    m << case_name(c);
    for (const auto& value : cases[c]) m << ' ' << value;
    m << '\n';
  }
  return m.str();
}

}  // namespace

int sweep_command(const SweepOptions& options) {
  if (options.threads > 0) set_thread_count(options.threads);
  std::vector<VariedName> varied;
  for (std::size_t i = 0; i < options.vary_options.size(); ++i)
    varied.push_back(parse_vary_option(options.vary_options[i], static_cast<int>(i) + 1));
  // Count the combinations before making them: a product of large lists must not be built
  // only to be refused.
  double count = 1.0;
  for (const auto& v : varied) count *= static_cast<double>(v.values.size());
  if (count > max_sweep_values)
    throw InputError({"--vary", 1, 1}, "the sweep has " + formatted("%.3g", count) + " cases; at most " +
                                           std::to_string(max_sweep_values) + " are allowed");
  const auto cases = combinations(varied, &VariedName::values);
  const auto labels = combinations(varied, &VariedName::labels);
  std::vector<std::string> varied_names;
  for (const auto& v : varied) varied_names.push_back(v.name);
  auto overrides_of = [&](const std::vector<std::string>& values) {
    return overrides_with(options.set_options, varied_names, values);
  };
  // Every case must load before any is solved: a bad value is an input error now, not
  // hours into the night.
  std::vector<std::vector<Real>> si;
  std::string model_text;
  std::optional<Band> band;
  for (const auto& c : cases) {
    const Model model = load_model(options.model_path, overrides_of(c));
    if (!options.rank.empty() && !band) band = judged_band(model, options.band);
    model_text = model.text;
    if (model.wave) throw InputError({options.model_path, 1, 1}, "sweeps solve antennas driven by ports, not plane waves");
    std::vector<Real> values;
    for (const auto& v : varied)
      for (const auto& r : model.values)
        if (r.name == v.name) values.push_back(r.value);
    si.push_back(values);
  }
  const std::string stem = std::filesystem::path(options.model_path).stem().string();
  const std::filesystem::path output(options.output.empty() ? stem + "-sweep.h5" : options.output);
  const std::filesystem::path directory = output.has_parent_path() ? output.parent_path() : std::filesystem::path(".");
  check_output_file(output);
  const std::filesystem::path case_directory = output.string() + ".cases";
  check_output_directory(case_directory);
  const std::string expected = manifest(model_text, options, varied, cases);
  std::filesystem::create_directories(case_directory);
  const DirectoryLock lock(case_directory);
  if (!lock.held())
    throw InputError({output.string(), 1, 1}, "another sweep is writing into '" + case_directory.string() +
                                                  "' now; wait for it to finish or choose another -o");
  const auto manifest_path = case_directory / "manifest.txt";
  if (std::filesystem::exists(manifest_path)) {
    std::ifstream in(manifest_path, std::ios::binary);
    std::ostringstream found;
    found << in.rdbuf();
    if (found.str() != expected)
      throw InputError({output.string(), 1, 1}, "'" + case_directory.string() +
                                                   "' holds the cases of a different sweep; remove it or choose another -o");
  } else {
    OutputFiles files(case_directory);
    files.stage_text("manifest.txt", expected);
    files.commit();
  }
  // Half-written cases of a sweep that was killed: never published, safe to remove.
  remove_dead_temporaries(case_directory);
  remove_dead_temporaries(directory);

  std::signal(SIGINT, on_interrupt);
  std::signal(SIGTERM, on_interrupt);
  std::vector<std::filesystem::path> case_files;
  std::size_t skipped = 0, solved = 0;
  std::set<std::string> warned;  // each distinct mesh warning once, not once per case
  std::optional<ProgressLine> progress(std::in_place, "case", cases.size());
  for (std::size_t c = 0; c < cases.size(); ++c) {
    case_files.push_back(case_directory / (case_name(c) + ".h5"));
    if (std::filesystem::exists(case_files.back())) {
      // Published whole by rename, a case file can still be damaged afterwards (a disk
      // error, a copy cut short): a file that does not read is named and solved again.
      try {
        read_result_network(case_files.back());
        ++skipped;
        continue;
      } catch (const InputError& e) {
        std::fprintf(stderr, "\n%s is damaged (%s); solving it again\n", case_files.back().string().c_str(), e.what());
        std::filesystem::remove(case_files.back());
      }
    }
    const Model model = load_model(options.model_path, overrides_of(cases[c]));
    const AntennaProblem problem(model);
    if (solved == 0)
      print_long_run_estimate(problem.unknowns(), static_cast<double>(model.frequencies_hz.size()),
                              static_cast<double>(cases.size() - c));
    for (const auto* list : {&problem.mesh.warnings, &problem.surfaces.warnings})
      for (const auto& w : *list)
        if (warned.insert(w.formatted()).second) std::fprintf(stderr, "\n%s (%s)\n", w.formatted().c_str(), case_name(c).c_str());
    std::string command = "lobe sweep case " + case_name(c) + ":";
    for (const auto& o : overrides_of(cases[c])) command += " --set " + o.name + "=" + o.expression;
    RunRecord run{problem, {}, {LOBE_VERSION, thread_count(), command, std::nullopt}};
    for (Real f : model.frequencies_hz) {
      if (interrupted) break;
      run.results.push_back(evaluate_frequency(problem, solve_frequency(problem, f)));
    }
    if (interrupted) break;
    try {
      OutputFiles files(case_directory);
      write_hdf5(files.staging_path(case_name(c) + ".h5"), run);
      files.commit();
    } catch (const OutputError& e) {
      progress.reset();
      throw OutputError(std::string(e.what()) + "; the " + std::to_string(solved + skipped) + " finished cases are kept in " +
                        case_directory.string() + ": make room and run the same command again to go on");
    }
    ++solved;
    progress->update(c + 1, solved);
  }
  progress.reset();
  if (interrupted) {
    std::fprintf(stderr, "interrupted: %zu of %zu cases are saved in %s; run the same command again to go on\n",
                 solved + skipped, cases.size(), case_directory.string().c_str());
    return 130;
  }
  SweepTable table{{}, cases, labels, si};
  for (const auto& v : varied) table.names.push_back(v.name);
  try {
    OutputFiles files(directory);
    write_sweep_hdf5(files.staging_path(output.filename().string()), table, case_files);
    files.commit();
  } catch (const OutputError& e) {
    throw OutputError(std::string(e.what()) + "; all " + std::to_string(cases.size()) + " cases are kept in " +
                      case_directory.string() + ": make room and run the same command again to assemble them");
  }
  std::printf("%zu cases (%zu solved now, %zu from before) in %s\n", cases.size(), solved, skipped, output.string().c_str());

  // Rank by the chosen band figure of the first port.
  if (!options.rank.empty()) {
    std::vector<std::pair<Real, std::size_t>> scores;
    for (std::size_t c = 0; c < cases.size(); ++c) {
      const NetworkData network = read_result_network(case_files[c]);
      ReflectionCurve curve{network.frequency_hz, {}};
      for (const auto& s : network.s) curve.reflection.push_back(s(0, 0));
      const Real figure = band_figure(band_report(curve, band->low_hz, band->high_hz), options.rank);
      const Real score = larger_is_better(options.rank) ? -figure : figure;
      scores.emplace_back(score, c);
    }
    std::stable_sort(scores.begin(), scores.end());
    std::printf("\nbest cases by %s over %s (%s to %s), first port:\n", options.rank.c_str(), band->name.c_str(),
                frequency_text(band->low_hz).c_str(), frequency_text(band->high_hz).c_str());
    for (std::size_t k = 0; k < std::min<std::size_t>(10, scores.size()); ++k) {
      std::printf("  %2zu. %s  %-12.4g", k + 1, case_name(scores[k].second).c_str(),
                  larger_is_better(options.rank) ? -scores[k].first : scores[k].first);
      for (std::size_t v = 0; v < varied.size(); ++v)
        std::printf("  %s = %s", varied[v].name.c_str(), labels[scores[k].second][v].c_str());
      std::printf("\n");
    }
  }
  return 0;
}

}  // namespace lobe::cli
