#pragma once
/// The subcommands of the lobe program; each returns the process exit code.
#include <cstdio>
#include <filesystem>
#include <optional>
#include <string>
#include <vector>

#include "geometry/model.hpp"
#include "geometry/wire_mesh.hpp"
#include "post/measured_csv.hpp"
#include "post/result_figures.hpp"
#include "study/run_study.hpp"
#include "study/sweep_study.hpp"
#include "study/tune_study.hpp"

namespace lobe::cli {

struct RunOptions {
  RunRequest study;                       ///< the model, overrides, extra bands, output directory
  bool json = false;                      ///< the summary as JSON on stdout, everything else on stderr
  std::optional<double> tx_power_w;       ///< forward power for reflected-power figures
  int threads = 0;                        ///< 0: all available
  std::string command_line;
};

/// Solves every frequency of an antenna or a scatterer (study/run_study), prints the
/// summary and lists the result files.
int run_command(const RunOptions& options);

/// Meshes the model and writes the mesh as a VTK XML file (.vtu) for ParaView.
int mesh_command(const std::string& model_path, const std::string& output, const std::vector<std::string>& set_options);

/// Prints the mesher's warnings as FILE:LINE:COL: warning: ... on standard error.
void print_warnings(const std::vector<MeshWarning>& warnings);
/// Prints a time estimate when `frequencies` solves of `unknowns` (times `cases`) will take
/// longer than about ten minutes here.
void print_long_run_estimate(double unknowns, double frequencies, double cases = 1.0, std::FILE* out = stdout);

struct ExportOptions {
  std::string result_path;
  std::string output;         ///< empty: the result's stem with .sNp beside it
  std::string format = "ri";  ///< ri, ma or db
  std::string unit = "GHz";   ///< Hz, kHz, MHz or GHz
  int version = 1;            ///< Touchstone 1 or 2
  std::string case_name;      ///< for a sweep file: the case to export ("case-000003")
};

/// Writes a result file's port S-parameters as Touchstone.
int export_command(const ExportOptions& options);

struct CompareOptions {
  std::string result_path;
  std::string measured_path;
  std::string measured_format = "auto";  ///< auto (by extension), touchstone or csv
  std::string port;                       ///< empty: the first port
  std::vector<std::string> band_options;  ///< LOW:HIGH; none: the overlap of the two curves
  std::optional<double> tx_power_w;       ///< forward power for reflected-power figures
  std::string case_name;                  ///< for a sweep file: the case to compare
  bool json = false;                      ///< the comparison as JSON on standard output, the text on standard error
};

/// The group of `path` to read results from: "" for a run's file, "/case-NNNNNN" for the
/// case `case_option` of a sweep file. Refuses a sweep file without --case (saying how to
/// pick one) and --case on a single result.
std::string result_group(const std::string& path, const std::string& case_option);

/// Compares a result's reflection with a measured one (Touchstone or CSV) and prints dips,
/// differences, the best frequency-scale factor and band reports side by side.
int compare_command(const CompareOptions& options);

struct PlotOptions {
  std::string result_path;
  std::string output_directory;           ///< empty: beside the result
  std::string measured_path;              ///< optional measured curve to overlay
  std::string measured_format = "auto";   ///< auto (by extension), touchstone or csv
  std::vector<std::string> band_options;  ///< LOW:HIGH; shaded, and for a sweep the band of its map
  std::string figure;                     ///< a sweep map's band figure; empty: worst-vswr
  std::vector<std::string> axes;          ///< a sweep map's varied names; default the first two
};

/// Writes SVG figures of a result: VSWR and return loss against frequency with the bands
/// shaded, the Smith chart, pattern cuts and axial ratio; a measured curve is overlaid when
/// given. For a sweep file, writes the map of a band figure over two varied names.
int plot_command(const PlotOptions& options);

/// The map of a band figure of the first port over one or two varied names of a sweep,
/// the other names held at the best case's values; prints the best case.
int plot_sweep(const PlotOptions& options);

/// The figures of a single result (post/result_figures): a scatterer's, or an antenna's with
/// `bands` shaded and the measured curve at `measured_path` (if any) overlaid.
ResultFigures figures_of_result(const std::filesystem::path& path, const std::vector<Band>& bands,
                                const std::string& measured_path, const std::string& measured_format);

struct ReportOptions {
  std::string result_path;
  std::string output_directory;          ///< empty: beside the result
  std::string measured_path;             ///< optional measured curve to overlay
  std::string measured_format = "auto";
};

/// Writes one self-contained HTML page of a result (its summary and every figure) or of a
/// sweep (its best cases and map): RESULT-STEM-report.html.
int report_command(const ReportOptions& options);

/// The measured curve from Touchstone (its first port, referred to `reference_ohm`) or from a
/// CSV table. `format` is "auto" (Touchstone by the extension .sNp or .ts, else CSV),
/// "touchstone" (for analysers' .txt exports; one port unless the file says otherwise) or "csv".
MeasuredCurve read_measured(const std::string& path, Real reference_ohm, const std::string& format = "auto");

struct SweepOptions {
  SweepRequest study;  ///< the model, the varied and fixed values, the output, the ranking
  int threads = 0;
  bool json = false;   ///< the summary as JSON on standard output (cli/sweep_json.hpp), the rest on standard error
};

struct BenchOptions {
  std::string output = "lobe-bench.csv";
  bool quick = false;  ///< models of a few hundred unknowns (seconds, for tests)
  int threads = 0;
};

/// Measures this machine's rates and the solver's speed against them (bench/benchmark),
/// prints the table and writes it as CSV.
int bench_command(const BenchOptions& options);

/// Solves every combination of the varied values, saving each finished case at once (a
/// crash loses at most the case in flight; re-running the same command goes on where it
/// stopped), then writes one file of all cases and, with a rank, prints the best ten.
int sweep_command(const SweepOptions& options);

struct TuneOptions {
  TuneRequest study;  ///< the model, the ranges, the goal and band, the output, the evaluations
  int threads = 0;
};

/// Searches the varied values for the best band figure of the first port (NLopt's BOBYQA
/// within the bounds) and writes the model with the best values filled in.
int tune_command(const TuneOptions& options);

struct MatchOptions {
  std::string result_path;
  std::string band;                  ///< LOW:HIGH; empty: the model's first band
  std::string port;                  ///< empty: the first port
  std::string goal = "worst-vswr";   ///< worst-vswr, mean-vswr or mean-mismatch-loss
  std::string series = "E12";        ///< E12 or E24
  Real velocity_factor = 0.66;       ///< of lines and stubs
  std::string topology;              ///< the design to write: L, pi, T, stub, quarter-wave; empty: the best
  std::string output;                ///< the matched model; empty: RESULT-STEM-matched.lobe
  std::string case_name;             ///< for a sweep file: the case to match
};

/// Designs matching networks for a port over a band from a result's impedances, prints
/// them with their band figures as built, and writes the model with one of them added.
int match_command(const MatchOptions& options);

/// Parses and meshes; prints counts and warnings; solves nothing.
int check_command(const std::string& model_path, const std::vector<std::string>& set_options, bool json = false);

}  // namespace lobe::cli
