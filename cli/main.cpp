/// The lobe command: parses the subcommands and their options (CLI11), runs one, and turns
/// its errors into the documented exit codes.
#include <CLI/CLI.hpp>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <exception>
#include <optional>
#include <string>
#include <thread>
#include <vector>

#include "cli/commands.hpp"
#include "core/input_error.hpp"
#include "core/output_error.hpp"
#include "post/band_report.hpp"
#include "solver/system_matrix.hpp"
#include "study/process_ranks.hpp"
#include "source_commit.hpp"  // generated at build time (cli/source_commit.cmake)

namespace {

// The exit codes, documented in the README and in every --help: stable for scripts.
constexpr int exit_bad_input = 2;
constexpr int exit_internal_failure = 1;
constexpr const char* exit_codes_text =
    "Exit codes: 0 done; 1 a numerical, output or internal failure (nothing half-written); 2 bad input (a model,\n"
    "an option or a file, reported as FILE:LINE:COL: message); 130 interrupted (Ctrl-C; finished work is kept).\n";

/// Levenshtein distance: how far a mistyped command is from a real one.
std::size_t edit_distance(const std::string& a, const std::string& b) {
  std::vector<std::size_t> row(b.size() + 1);
  for (std::size_t j = 0; j <= b.size(); ++j) row[j] = j;
  for (std::size_t i = 1; i <= a.size(); ++i) {
    std::size_t diagonal = row[0];
    row[0] = i;
    for (std::size_t j = 1; j <= b.size(); ++j) {
      const std::size_t above = row[j];
      row[j] = std::min({row[j] + 1, row[j - 1] + 1, diagonal + (a[i - 1] == b[j - 1] ? 0 : 1)});
      diagonal = above;
    }
  }
  return row[b.size()];
}

/// When the first argument names no subcommand: says so, with the nearest one if it is close.
std::optional<std::string> unknown_command_text(const CLI::App& app, int argc, char** argv) {
  if (argc < 2 || argv[1][0] == '-') return std::nullopt;
  const std::string given = argv[1];
  std::string nearest;
  std::size_t best = std::string::npos;
  for (const CLI::App* sub : app.get_subcommands([](const CLI::App*) { return true; })) {
    if (sub->get_name() == given) return std::nullopt;
    const std::size_t d = edit_distance(given, sub->get_name());
    if (d < best) best = d, nearest = sub->get_name();
  }
  std::string text = "lobe: '" + given + "' is not a lobe command";
  if (best <= std::max<std::size_t>(2, given.size() / 3)) text += "; did you mean '" + nearest + "'?";
  return text + " (`lobe help` lists the commands)";
}

/// Far beyond any transmitter this tool's users drive; above it distances lose meaning.
constexpr double largest_transmit_power_w = 1e6;

/// A forward power in watts: a finite number above zero, at most 1 MW (nan and 1e308 are
/// not powers).
const CLI::Validator transmit_power(
    [](std::string& text) -> std::string {
      char* end = nullptr;
      const double w = std::strtod(text.c_str(), &end);
      if (end == text.c_str() || *end != '\0' || !std::isfinite(w) || !(w > 0.0) || w > largest_transmit_power_w)
        return "expected a power in watts above 0 and at most 1000000, got '" + text + "'";
      return {};
    },
    "WATTS");

/// Threads: at least one, at most the cores this process may use; more only slows the
/// factorisation, and thousands fail to start.
CLI::Range thread_range() {
  const unsigned cores = std::max(1u, std::thread::hardware_concurrency());
  return CLI::Range(1u, cores);
}

}  // namespace

int main(int argc, char** argv) {
  const lobe::ProcessRanks ranks(&argc, &argv);
  CLI::App app{"lobe: a method-of-moments antenna simulator for the CPU. Wires, plates and bodies, in free space, over\n"
                "ground or printed on a board; antennas driven at their ports and scatterers lit by a plane wave; match,\n"
                "gain, pattern and polarisation over whole bands; sweeps, tuning, matching networks, comparisons with\n"
                "measurements, plots and reports.",
                "lobe"};
  app.set_version_flag("--version", "lobe " LOBE_VERSION " (commit " LOBE_COMMIT ")");
  app.require_subcommand(1);
  app.footer(exit_codes_text);

  lobe::cli::RunOptions run;
  for (int i = 0; i < argc; ++i) run.command_line += (i ? " " : "") + std::string(argv[i]);
  auto* run_app = app.add_subcommand("run", "Solve a model at its frequencies; print a summary and write HDF5 and CSV results");
  run_app->add_option("MODEL", run.study.model_path, "Model file (.lobe)")->required();
  run_app->add_option("-o,--output", run.study.output_directory, "Directory for result files (default: MODEL-STEM-results)");
  run_app->add_option("--set", run.study.set_options, "Override a let value: NAME=VALUE (repeatable)")->allow_extra_args(false);
  run_app->add_option("--toward", run.study.toward,
                      "Judge polarisation (axial ratio, RHCP/LHCP, cross-polar) toward THETA,PHI in degrees "
                      "(default: the main beam)");
  run_app->add_flag("--json", run.json,
                    "Print the summary as JSON on standard output (schema lobe-run-summary, version 1); everything else "
                    "goes to standard error");
  run_app->add_flag("--views", run.study.views,
                    "Also write 3-D views for ParaView: the gain over the whole sphere as a surface and the currents as "
                    "vectors, each a series over frequency (STEM_pattern_3d.pvd, STEM_currents.pvd)");
  run_app->add_option("--band", run.study.band_options, "Also report a band: LOW:HIGH, e.g. 5.65GHz:5.95GHz (repeatable)")
      ->allow_extra_args(false);
  run_app->add_option("--tx-power", run.tx_power_w, "Transmitter forward power in W: print the reflected power")
      ->check(transmit_power);
  run_app->add_option("--threads", run.threads, "Threads for matrix fill and factorisation (default: all cores)")
      ->check(thread_range());
  bool run_every_frequency = false;
  run_app->add_flag("--every-frequency", run_every_frequency,
                    "Solve every frequency in full (default: ranges of 21 or more are solved adaptively and interpolated)");

  std::string check_path;
  std::vector<std::string> check_sets;
  auto* check_app = app.add_subcommand("check", "Parse and mesh a model; print counts and warnings without solving");
  check_app->add_option("MODEL", check_path, "Model file (.lobe)")->required();
  check_app->add_option("--set", check_sets, "Override a let value: NAME=VALUE (repeatable)")->allow_extra_args(false);
  bool check_json = false;
  check_app->add_flag("--json", check_json,
                      "Print the counts as JSON on standard output (schema lobe-check-summary, version 1); warnings go "
                      "to standard error");

  std::string mesh_path, mesh_output;
  std::vector<std::string> mesh_sets;
  auto* mesh_app = app.add_subcommand("mesh", "Mesh a model and write the mesh as VTK XML (.vtu) for ParaView");
  mesh_app->add_option("MODEL", mesh_path, "Model file (.lobe)")->required();
  mesh_app->add_option("-o,--output", mesh_output, "Mesh file to write (.vtu)")->required();
  mesh_app->add_option("--set", mesh_sets, "Override a let value: NAME=VALUE (repeatable)")->allow_extra_args(false);

  lobe::cli::ExportOptions export_options;
  bool touchstone = false;
  auto* export_app = app.add_subcommand("export", "Write a result file's port S-parameters in another format");
  export_app->add_option("RESULT", export_options.result_path, "Result file written by run (.h5)")->required();
  export_app->add_flag("--touchstone", touchstone, "Write Touchstone (.sNp), the only format so far")->required();
  export_app->add_option("-o,--output", export_options.output, "File to write (default: RESULT-STEM.sNp beside it)");
  export_app->add_option("--format", export_options.format, "Number format: ri, ma or db (default ri)")
      ->check(CLI::IsMember({"ri", "ma", "db"}));
  export_app->add_option("--unit", export_options.unit, "Frequency unit: Hz, kHz, MHz or GHz (default GHz)")
      ->check(CLI::IsMember({"Hz", "kHz", "MHz", "GHz"}));
  export_app->add_option("--case", export_options.case_name, "For a sweep file: the case to export, e.g. case-000003");
  export_app->add_option("--touchstone-version", export_options.version, "Touchstone version 1 or 2 (default 1)")
      ->check(CLI::IsMember({1, 2}));

  lobe::cli::CompareOptions compare;
  auto* compare_app = app.add_subcommand("compare", "Compare a result's reflection with a measured curve");
  compare_app->add_option("RESULT", compare.result_path, "Result file written by run (.h5)")->required();
  compare_app->add_option("MEASURED", compare.measured_path, "Measured data: Touchstone (.s1p, .ts) or CSV")->required();
  compare_app->add_option("--measured-format", compare.measured_format,
                          "How to read MEASURED: auto (by extension), touchstone (e.g. an analyser's .txt) or csv")
      ->check(CLI::IsMember({"auto", "touchstone", "csv"}));
  compare_app->add_option("--port", compare.port, "The result's port to compare (default: the first)");
  compare_app->add_option("--band", compare.band_options, "A band to report: LOW:HIGH (repeatable; default: the overlap)")
      ->allow_extra_args(false);
  compare_app->add_option("--case", compare.case_name, "For a sweep file: the case to compare, e.g. case-000003");
  compare_app->add_flag("--json", compare.json,
                        "Print the comparison as JSON on standard output (schema lobe-compare-summary, version 1); the "
                        "text goes to standard error");
  compare_app->add_option("--tx-power", compare.tx_power_w, "Transmitter forward power in W: the worst reflected power")
      ->check(transmit_power);

  lobe::cli::PlotOptions plot;
  auto* plot_app =
      app.add_subcommand("plot", "Write SVG figures of a result, or a map of a band figure over a sweep");
  plot_app->add_option("RESULT", plot.result_path, "Result file written by run or sweep (.h5)")->required();
  plot_app->add_option("-o,--output", plot.output_directory, "Directory for the figures (default: beside the result)");
  plot_app->add_option("--measured", plot.measured_path, "A measured curve to overlay: Touchstone or CSV");
  plot_app->add_option("--measured-format", plot.measured_format,
                       "How to read --measured: auto (by extension), touchstone (e.g. an analyser's .txt) or csv")
      ->check(CLI::IsMember({"auto", "touchstone", "csv"}));
  plot_app->add_option("--band", plot.band_options, "A band to shade, and a sweep map's band: LOW:HIGH (repeatable)")
      ->allow_extra_args(false);
  plot_app->add_option("--figure", plot.figure, "A sweep map's band figure: worst-vswr (default), mean-vswr, worst-axial-ratio, centre-gain, ...")
      ->check(CLI::IsMember(lobe::band_figure_names()));
  plot_app->add_option("--axes", plot.axes, "A sweep map's varied names: X or X,Y (default: the first two)")
      ->delimiter(',')
      ->allow_extra_args(false);

  lobe::cli::ReportOptions report;
  auto* report_app = app.add_subcommand("report", "Write one HTML page of a result or sweep: summary, tables and every figure");
  report_app->add_option("RESULT", report.result_path, "Result file written by run or sweep (.h5)")->required();
  report_app->add_option("-o,--output", report.output_directory, "Directory for the page (default: beside the result)");
  report_app->add_option("--measured", report.measured_path, "A measured curve to overlay: Touchstone or CSV");
  report_app->add_option("--measured-format", report.measured_format,
                         "How to read --measured: auto (by extension), touchstone (e.g. an analyser's .txt) or csv")
      ->check(CLI::IsMember({"auto", "touchstone", "csv"}));

  lobe::cli::SweepOptions sweep;
  bool resume = false;
  auto* sweep_app = app.add_subcommand("sweep", "Solve a model for every combination of varied let values");
  sweep_app->add_option("MODEL", sweep.study.model_path, "Model file (.lobe)")->required();
  sweep_app->add_option("--vary", sweep.study.vary_options, "NAME=START:STOP:STEP or NAME=A,B,C (repeatable)")
      ->required()
      ->allow_extra_args(false);
  sweep_app->add_option("--set", sweep.study.set_options, "Override a let value in every case: NAME=VALUE (repeatable)")
      ->allow_extra_args(false);
  sweep_app->add_option("-o,--output", sweep.study.output, "The sweep's HDF5 file (default: MODEL-STEM-sweep.h5)");
  sweep_app->add_flag("--resume", resume, "Go on with an interrupted sweep (re-running the same command does too)");
  sweep_app->add_option("--rank", sweep.study.rank,
                        "Rank the cases by a band figure (worst-vswr, worst-axial-ratio, centre-gain, worst-front-to-back, "
                        "...) or a weighted sum ('worst-vswr + 0.5*worst-axial-ratio')");
  sweep_app->add_option("--limit", sweep.study.limits,
                        "A limit every case should meet: FIGURE<=BOUND or FIGURE>=BOUND, e.g. worst-axial-ratio<=3 (repeatable)")
      ->allow_extra_args(false);
  sweep_app->add_option("--toward", sweep.study.toward,
                        "Judge polarisation toward THETA,PHI in degrees (default: the main beam)");
  sweep_app->add_option("--band", sweep.study.band, "The band to rank over: LOW:HIGH (default: the model's first band)");
  sweep_app->add_option("--threads", sweep.threads, "Threads (default: all cores)")->check(thread_range());
  bool sweep_every_frequency = false;
  sweep_app->add_flag("--every-frequency", sweep_every_frequency,
                      "Solve every frequency of every case in full (default: long ranges adaptively)");
  sweep_app->add_flag("--json", sweep.json,
                      "Print the case table, each case's band figures and the ranking as JSON on standard output "
                      "(schema lobe-sweep-summary, version 1); everything else goes to standard error");

  lobe::cli::TuneOptions tune;
  auto* tune_app = app.add_subcommand("tune", "Search let values for the best band figures, within limits; write the tuned model");
  tune_app->add_option("MODEL", tune.study.model_path, "Model file (.lobe)")->required();
  tune_app->add_option("--vary", tune.study.vary_options, "NAME=MIN:MAX (repeatable)")->required()->allow_extra_args(false);
  tune_app->add_option("--set", tune.study.set_options, "Override a let value: NAME=VALUE (repeatable)")->allow_extra_args(false);
  tune_app->add_option("--goal", tune.study.goal,
                       "A band figure (worst-vswr, the default; worst-axial-ratio, centre-gain, ...) or a weighted sum "
                       "to minimise ('worst-vswr + 0.5*worst-axial-ratio')");
  tune_app->add_option("--limit", tune.study.limits,
                       "A limit the result must meet: FIGURE<=BOUND or FIGURE>=BOUND, e.g. worst-axial-ratio<=3 (repeatable)")
      ->allow_extra_args(false);
  tune_app->add_option("--toward", tune.study.toward, "Judge polarisation toward THETA,PHI in degrees (default: the main beam)");
  tune_app->add_option("--band", tune.study.band, "The band to judge: LOW:HIGH (default: the model's first band)");
  tune_app->add_option("--evaluations", tune.study.evaluations, "Most models to solve (default 60)")->check(CLI::Range(2, 100000));
  tune_app->add_option("-o,--output", tune.study.output, "The tuned model (default: MODEL-STEM-tuned.lobe)");
  tune_app->add_option("--threads", tune.threads, "Threads (default: all cores)")->check(thread_range());

  lobe::cli::MatchOptions match;
  auto* match_app = app.add_subcommand("match", "Design a matching network for a port over a band from a result; write the matched model");
  match_app->add_option("RESULT", match.result_path, "Result file written by run (.h5)")->required();
  match_app->add_option("--band", match.band, "The band to match: LOW:HIGH (default: the model's first band)");
  match_app->add_option("--port", match.port, "The port to match (default: the first)");
  match_app->add_option("--goal", match.goal, "worst-vswr (default), mean-vswr or mean-mismatch-loss")
      ->check(CLI::IsMember({"worst-vswr", "mean-vswr", "mean-mismatch-loss"}));
  match_app->add_option("--series", match.series, "Standard values for inductors and capacitors: E12 (default) or E24")
      ->check(CLI::IsMember({"E12", "E24"}));
  match_app->add_option("--velocity", match.velocity_factor, "Velocity factor of stub and line designs (default 0.66)")
      ->check(CLI::Range(0.1, 1.0));
  match_app->add_option("--write", match.topology, "The design to write: L, pi, T, stub or quarter-wave (default: the best)")
      ->check(CLI::IsMember({"L", "pi", "T", "stub", "quarter-wave"}));
  match_app->add_option("-o,--output", match.output, "The matched model (default: RESULT-STEM-matched.lobe)");
  match_app->add_option("--case", match.case_name, "For a sweep file: the case to match, e.g. case-000003");

  lobe::cli::BenchOptions bench;
  auto* bench_app = app.add_subcommand("bench", "Measure this machine's rates and the solver's speed against them");
  bench_app->add_option("-o,--output", bench.output, "CSV file for the table (default: lobe-bench.csv)");
  bench_app->add_flag("--quick", bench.quick, "Small models only: a check in seconds, not a measurement");
  bench_app->add_option("--threads", bench.threads, "Threads (default: all cores)")->check(thread_range());

  std::string help_topic;
  auto* help_app = app.add_subcommand("help", "Show the commands, or one command's options: lobe help COMMAND");
  help_app->add_option("COMMAND", help_topic, "The command to explain");

  if (const auto unknown = unknown_command_text(app, argc, argv)) {
    std::fprintf(stderr, "%s\n", unknown->c_str());
    return exit_bad_input;
  }
  try {
    app.parse(argc, argv);
  } catch (const CLI::ParseError& e) {
    const int code = app.exit(e);
    return code == 0 ? 0 : exit_bad_input;
  }

  try {
    // Only a sweep shares its work among processes; any other command would run whole in
    // each of them and write the same files at once.
    if (lobe::process_count() > 1 && !*sweep_app)
      throw lobe::InputError({"mpirun", 1, 1}, "only 'lobe sweep' runs under mpirun; start '" +
                                                 app.get_subcommands().front()->get_name() + "' as one process");
    if (*help_app) {
      if (help_topic.empty()) {
        std::printf("%s", app.help().c_str());
        return 0;
      }
      const auto subs = app.get_subcommands([&](const CLI::App* sub) { return sub->get_name() == help_topic; });
      if (subs.empty() || help_topic == "help")
        throw lobe::InputError({"help", 1, 1}, "'" + help_topic + "' is not a lobe command; `lobe help` lists them");
      // As `lobe COMMAND --help` would: CLI11 then names the program in the usage line.
      app.clear();
      try {
        app.parse(std::vector<std::string>{"--help", help_topic});  // CLI11 takes the arguments reversed
      } catch (const CLI::ParseError& e) {
        return app.exit(e);
      }
      return 0;
    }
    if (run_every_frequency) run.study.sampling = lobe::FrequencySampling::every;
    if (sweep_every_frequency) sweep.study.sampling = lobe::FrequencySampling::every;
    if (*run_app) return lobe::cli::run_command(run);
    if (*mesh_app) return lobe::cli::mesh_command(mesh_path, mesh_output, mesh_sets);
    if (*export_app) return lobe::cli::export_command(export_options);
    if (*compare_app) return lobe::cli::compare_command(compare);
    if (*plot_app) return lobe::cli::plot_command(plot);
    if (*report_app) return lobe::cli::report_command(report);
    if (*sweep_app) return lobe::cli::sweep_command(sweep);
    if (*tune_app) return lobe::cli::tune_command(tune);
    if (*bench_app) return lobe::cli::bench_command(bench);
    if (*match_app) return lobe::cli::match_command(match);
    return lobe::cli::check_command(check_path, check_sets, check_json);
  } catch (const lobe::InputError& e) {
    std::fprintf(stderr, "%s\n", e.formatted().c_str());
    return lobe::end_all_processes(exit_bad_input);
  } catch (const lobe::OutputError& e) {
    std::fprintf(stderr, "\nlobe: %s; earlier results were left as they were\n", e.what());
    return lobe::end_all_processes(exit_internal_failure);
  } catch (const lobe::NumericalError& e) {
    std::fprintf(stderr, "lobe: numerical failure: %s; no results were written\n", e.what());
    return lobe::end_all_processes(exit_internal_failure);
  } catch (const std::exception& e) {
    std::fprintf(stderr, "lobe: internal failure: %s; no results were written\n", e.what());
    return lobe::end_all_processes(exit_internal_failure);
  }
}
