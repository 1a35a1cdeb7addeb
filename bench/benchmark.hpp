#pragma once
/// `lobe bench`: this machine's own rates, and the fill, factorisation and solve of wire and
/// surface models of a few thousand unknowns measured against them, with the throughput of
/// a sweep of a small model. Medians of repetitions; ratios travel between machines better
/// than seconds do.
#include <functional>
#include <string>
#include <vector>

namespace lobe {

struct BenchmarkRow {
  std::string model;
  long unknowns = 0;
  double setup_seconds = 0.0;  ///< once per mesh: meshing, quadrature points, near pairs' static parts
  double fill_seconds = 0.0;
  double kernel_evaluations = 0.0;  ///< per fill, by the far-pair rule (0: not counted)
  double factor_seconds = 0.0;
  std::string factorization;        ///< "symmetric LDLt" or "LU"
  double solve_seconds = 0.0;
  double peak_memory_mib = 0.0;     ///< the process's peak so far
};

struct BenchmarkReport {
  int threads = 1;
  std::string blas_kernel;
  double zgemm_gflops = 0.0;
  double kernel_rate = 0.0;         ///< evaluations of e^{-jkR}/R per second
  std::vector<BenchmarkRow> rows;
  std::string sweep_model;
  long sweep_unknowns = 0;
  int sweep_cases = 0, sweep_frequencies = 0;
  double sweep_seconds = 0.0;
};

/// Runs the benchmark; `quick` uses models of a few hundred unknowns (for tests).
/// `progress` is told what is being measured.
BenchmarkReport run_benchmark(bool quick, const std::function<void(const std::string&)>& progress);

/// LU's operation count (8/3) N³ over the factorisation's seconds, GFLOP/s: what an LU
/// would have to reach to match it.
double lu_equivalent_gflops(long unknowns, double seconds);

/// The report as a table for the screen, with the ratios to the machine's rates.
std::string benchmark_table(const BenchmarkReport& report);

/// The report as CSV (RFC 4180), one line per model and one for the sweep.
std::string benchmark_csv(const BenchmarkReport& report);

}  // namespace lobe
