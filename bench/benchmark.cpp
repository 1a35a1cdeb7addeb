#include "bench/benchmark.hpp"

#include <sys/resource.h>
#include <unistd.h>

#include <algorithm>
#include <chrono>
#include <filesystem>
#include <fstream>
#include <sstream>

#include "bench/machine_rates.hpp"
#include "core/formatted_text.hpp"
#include "geometry/model_parser.hpp"
#include "solver/antenna_problem.hpp"
#include "solver/assembly.hpp"
#include "solver/blas_kernels.hpp"
#include "solver/dense_matrix.hpp"
#include "solver/threads.hpp"
#include "study/sweep_study.hpp"

namespace lobe {
namespace {

/// `text` as one CSV field (RFC 4180): quoted, with inner quotes doubled, when it holds a
/// comma, a quote or a line break.
std::string csv_field(const std::string& text) {
  if (text.find_first_of(",\"\r\n") == std::string::npos) return text;
  std::string out = "\"";
  for (const char c : text) out += c == '"' ? std::string("\"\"") : std::string(1, c);
  return out + "\"";
}

using Clock = std::chrono::steady_clock;
constexpr int repetitions = 3;

double seconds_since(Clock::time_point start) { return std::chrono::duration<double>(Clock::now() - start).count(); }

double median(std::vector<double> v) {
  std::sort(v.begin(), v.end());
  return v[v.size() / 2];
}

double peak_memory_mib() {
  rusage usage{};
  getrusage(RUSAGE_SELF, &usage);
  return static_cast<double>(usage.ru_maxrss) / 1024.0;
}

/// A broadside curtain of `count` half-wave dipoles of 51 segments (50 unknowns each), λ = 1 m.
std::string curtain(int count) {
  std::ostringstream text;
  text << "units m\n";
  for (int i = 0; i < count; ++i)
    text << "wire d" << i << " from (" << 0.6 * (i % 10) << ", " << 0.7 * (i / 10) << ", -0.24) to (" << 0.6 * (i % 10)
         << ", " << 0.7 * (i / 10) << ", 0.24) radius 1e-3 segments 51\n";
  text << "port feed on d0 at middle\nfrequency 299.792458 MHz\n";
  return text.str();
}

/// A 1 λ square plate meshed at `size` (in wavelengths) with a quarter-wave monopole at
/// its centre, λ = 1 m: a wire-to-surface junction and RWG functions on the plate.
std::string plate_with_monopole(double size) {
  return "units m\nplate floor rectangle corner (-0.5, -0.5, 0) size (1, 1)\nmesh floor size " + std::to_string(size) +
         "\nwire whip from (0, 0, 0) to (0, 0, 0.237) radius 3e-3 segments 5\n"
         "port feed on whip at start\nfrequency 299.792458 MHz\n";
}

/// A 38 × 29.4 mm patch 1.6 mm up, meshed at 2 mm (about 2,000 RWG functions), fed across
/// its middle at 2.4 GHz, on the given board ("ground none" for free space): the substrate's
/// fill against the same plate's in free space.
std::string printed_patch(const std::string& board) {
  return "units mm\n" + board +
         "\nplate patch rectangle corner (-14.7, -19, 1.6) size (29.4, 38)\nmesh patch size 2\n"
         "port gap on patch along (0, -19, 1.6) to (0, 19, 1.6)\nfrequency 2.4 GHz\n";
}

/// The sweep's model: crossed dipoles over a reflector plate for 137 MHz (the demo
/// model's geometry), 21 frequencies, far field on the zenith cut only.
const char* sweep_model_text =
    "units mm\nlet f0 = 137.5 MHz\nlet arm = 0.228 * c0 / f0\nlet height = 0.25 * c0 / f0\nlet side = 1500\n"
    "let r = 4 mm\n"
    "plate reflector rectangle corner (-side/2, -side/2, 0) size (side, side)\n"
    "wire east from (-arm, 0, height) to (arm, 0, height) radius r\n"
    "wire north from (0, -arm, height + 3 * r) to (0, arm, height + 3 * r) radius r\n"
    "port p0 on east at middle\nport p90 on north at middle phase -90 deg\n"
    "frequency 136 MHz to 139 MHz count 21\nband noaa 137 MHz to 138 MHz\n"
    "pattern theta 0 to 180 step 5 deg  phi 0 to 90 step 45 deg\n";

BenchmarkRow measure(const std::string& name, const std::string& text) {
  const Model model = parse_model(text, "benchmark");
  const auto setup_start = Clock::now();
  const AntennaProblem problem(model);
  const double setup_seconds = seconds_since(setup_start);
  const Eigen::Index n = problem.unknowns();
  const Real f = model.frequencies_hz[0];
  std::vector<double> fill, factor, solve;
  std::string factorization;
  for (int r = 0; r < repetitions; ++r) {
    DenseMatrix matrix(n);
    auto start = Clock::now();
    assemble_system(problem, f, matrix);
    fill.push_back(seconds_since(start));
    start = Clock::now();
    matrix.factor();
    factor.push_back(seconds_since(start));
    SolveReport report;
    const ComplexMatrix rhs = ComplexMatrix::Ones(n, 1);
    start = Clock::now();
    matrix.solve(rhs, report);
    solve.push_back(seconds_since(start));
    factorization = report.factorization == Factorization::symmetric ? "symmetric LDLt" : "LU";
  }
  BenchmarkRow row;
  row.model = name;
  row.unknowns = static_cast<long>(n);
  row.setup_seconds = setup_seconds;
  row.fill_seconds = median(fill);
  row.kernel_evaluations = triangle_pair_kernel_evaluations(problem);
  row.factor_seconds = median(factor);
  row.factorization = factorization;
  row.solve_seconds = median(solve);
  row.peak_memory_mib = peak_memory_mib();
  return row;
}

/// A sweep of `cases` reflector sizes in a fresh directory, removed afterwards; seconds.
double time_sweep(BenchmarkReport& report, int cases) {
  namespace fs = std::filesystem;
  const fs::path directory = fs::temp_directory_path() / ("lobe-bench-" + std::to_string(getpid()));
  fs::remove_all(directory);
  fs::create_directories(directory);
  const fs::path model_path = directory / "crossed_dipoles.lobe";
  std::ofstream(model_path) << sweep_model_text;
  SweepRequest request;
  request.model_path = model_path.string();
  request.vary_options = {"side=1300:" + std::to_string(1300 + 10 * (cases - 1)) + ":10"};
  request.output = (directory / "sweep.h5").string();
  const auto start = Clock::now();
  const PreparedSweep sweep = prepare_sweep(request);
  execute_sweep(sweep, StudyControl{});
  const double seconds = seconds_since(start);
  const Model model = parse_model(sweep_model_text, "benchmark");
  report.sweep_unknowns = static_cast<long>(AntennaProblem(model).unknowns());
  report.sweep_frequencies = static_cast<int>(model.frequencies_hz.size());
  fs::remove_all(directory);
  return seconds;
}

}  // namespace

double lu_equivalent_gflops(long unknowns, double seconds) {
  const double n = static_cast<double>(unknowns);
  return 8.0 / 3.0 * n * n * n / seconds / 1e9;
}

BenchmarkReport run_benchmark(bool quick, const std::function<void(const std::string&)>& progress) {
  BenchmarkReport report;
  report.threads = thread_count();
  // The kernel rate first: BLAS threads spin for a while after a zgemm and would take the
  // cores from the kernel loop's threads.
  progress("this machine's kernel-evaluation rate");
  report.kernel_rate = kernel_evaluations_per_second(quick ? 0.01 : 0.1).per_second;
  progress("this machine's zgemm rate");
  report.zgemm_gflops = zgemm_gflops(quick ? 400 : 1500);
  report.blas_kernel = blas_kernel_name();
  struct Case {
    std::string name, text;
  };
  std::vector<Case> cases{{"wire curtain", curtain(quick ? 4 : 40)}};
  // Pushed one by one: GCC 12 warns falsely about a long initializer list of strings.
  for (const double size : quick ? std::vector<double>{0.12} : std::vector<double>{0.049, 0.04, 0.031})
    cases.push_back({"plate + monopole", plate_with_monopole(size)});
  if (!quick) {
    cases.push_back({"patch, free space", printed_patch("ground none")});
    cases.push_back({"patch on FR-4", printed_patch("substrate fr4 thickness 1.6 permittivity 4.4 loss-tangent 0.02")});
  }
  for (const Case& c : cases) {
    progress(c.name);
    report.rows.push_back(measure(c.name, c.text));
    // Wires are integrated by other rules, and a board adds its table's work to every pair.
    if (c.name == "wire curtain" || c.name == "patch on FR-4") report.rows.back().kernel_evaluations = 0.0;
  }
  progress("a sweep of a small model");
  report.sweep_model = "crossed dipoles over a reflector";
  report.sweep_cases = quick ? 2 : 20;
  report.sweep_seconds = time_sweep(report, report.sweep_cases);
  return report;
}

std::string benchmark_table(const BenchmarkReport& r) {
  std::string out = formatted("lobe bench: %d threads, BLAS kernels %s\n", r.threads, r.blas_kernel.c_str());
  out += formatted("  zgemm                %8.1f GFLOP/s   (the factorisation's ceiling)\n", r.zgemm_gflops);
  out += formatted("  kernel e^-jkR/R      %8.3g per s     (the fill's ceiling)\n\n", r.kernel_rate);
  out += formatted("%-18s %8s %9s %9s %14s %9s %10s %11s %9s %10s %9s %9s\n", "model", "unknowns", "setup (s)",
                   "fill (s)", "kernels/s", "of rate", "factor (s)", "fill/factor", "GFLOP/s", "of zgemm", "solve (s)",
                   "peak MiB");
  for (const BenchmarkRow& row : r.rows) {
    const double gflops = lu_equivalent_gflops(row.unknowns, row.factor_seconds);
    const std::string kernels =
        row.kernel_evaluations > 0 ? formatted("%14.3g %8.0f%%", row.kernel_evaluations / row.fill_seconds,
                                               100 * row.kernel_evaluations / row.fill_seconds / r.kernel_rate)
                                   : formatted("%14s %9s", "-", "-");
    out += formatted("%-18s %8ld %9.3f %9.3f %s %10.3f %11.2f %9.1f %9.0f%% %9.4f %9.0f\n", row.model.c_str(),
                     row.unknowns, row.setup_seconds, row.fill_seconds, kernels.c_str(), row.factor_seconds,
                     row.fill_seconds / row.factor_seconds, gflops, 100 * gflops / r.zgemm_gflops, row.solve_seconds,
                     row.peak_memory_mib);
  }
  out += formatted("\nfactorisation: %s; GFLOP/s counts an LU's (8/3) N^3, so a symmetric factorisation "
                   "(half the work) can pass 100%% of zgemm\n",
                   r.rows.empty() ? "-" : r.rows.front().factorization.c_str());
  out += "kernels/s: the triangle pairs' kernel evaluations (49 a near or far pair, 36 a distant one) over the fill's time\n";
  out += "setup: once per mesh (meshing, quadrature points, the near pairs' static parts); fill and factor: every frequency\n";
  const double per_case = r.sweep_seconds / std::max(1, r.sweep_cases);
  out += formatted("\nsweep: %s, %ld unknowns, %d frequencies: %d cases in %.2f s, %.3f s a case, %.0f variants an hour\n",
                   r.sweep_model.c_str(), r.sweep_unknowns, r.sweep_frequencies, r.sweep_cases, r.sweep_seconds,
                   per_case, 3600.0 / per_case);
  return out;
}

std::string benchmark_csv(const BenchmarkReport& r) {
  std::string out =
      "model,unknowns,setup_s,fill_s,kernel_evaluations_per_s,of_kernel_rate,factor_s,fill_over_factor,factorization,"
      "lu_equivalent_gflops,of_zgemm,solve_s,peak_memory_mib,threads,zgemm_gflops,kernel_rate_per_s,variants_per_hour\n";
  for (const BenchmarkRow& row : r.rows) {
    const double gflops = lu_equivalent_gflops(row.unknowns, row.factor_seconds);
    const double kernels = row.kernel_evaluations > 0 ? row.kernel_evaluations / row.fill_seconds : 0.0;
    out += formatted("%s,%ld,%.6g,%.6g,%.6g,%.4g,%.6g,%.4g,%s,%.6g,%.4g,%.6g,%.6g,%d,%.6g,%.6g,\n", csv_field(row.model).c_str(),
                     row.unknowns, row.setup_seconds, row.fill_seconds, kernels, kernels / r.kernel_rate,
                     row.factor_seconds, row.fill_seconds / row.factor_seconds, csv_field(row.factorization).c_str(), gflops,
                     gflops / r.zgemm_gflops, row.solve_seconds, row.peak_memory_mib, r.threads, r.zgemm_gflops,
                     r.kernel_rate);
  }
  const double per_case = r.sweep_seconds / std::max(1, r.sweep_cases);
  out += formatted("%s,%ld,,,,,,,,,,,,%d,%.6g,%.6g,%.6g\n",
                   csv_field(formatted("sweep: %s (%d cases)", r.sweep_model.c_str(), r.sweep_cases)).c_str(),
                   r.sweep_unknowns, r.threads, r.zgemm_gflops, r.kernel_rate, 3600.0 / per_case);
  return out;
}

}  // namespace lobe
