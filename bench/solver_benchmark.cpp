/// Times one frequency of wire models of about 1,000 and 2,000 unknowns and of a plate
/// with a monopole of about 3,000: matrix fill, factorisation, and the factorisation's rate
/// against this machine's own zgemm rate measured in the same run, with the process's peak
/// memory. Prints medians of several repetitions (shared machines are noisy; medians and
/// ratios travel better than single timings).
#include <cblas.h>
#include <sys/resource.h>

#include <algorithm>
#include <chrono>
#include <cstdio>
#include <sstream>
#include <vector>

#include "geometry/model_parser.hpp"
#include "solver/assembly.hpp"
#include "solver/dense_matrix.hpp"
#include "solver/threads.hpp"
#include "solver/time_estimate.hpp"
#include "solver/antenna_problem.hpp"

namespace {

using Clock = std::chrono::steady_clock;
constexpr int repetitions = 5;

double seconds_since(Clock::time_point start) { return std::chrono::duration<double>(Clock::now() - start).count(); }

double median(std::vector<double> v) {
  std::sort(v.begin(), v.end());
  return v[v.size() / 2];
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

/// A 1 λ square plate meshed at λ/25 with a quarter-wave monopole at its centre, λ = 1 m:
/// about 3,000 RWG functions and a wire-to-surface junction.
std::string plate_with_monopole() {
  return "units m\n"
         "plate floor rectangle corner (-0.5, -0.5, 0) size (1, 1)\nmesh floor size 0.04\n"
         "wire whip from (0, 0, 0) to (0, 0, 0.237) radius 3e-3 segments 5\n"
         "port feed on whip at start\nfrequency 299.792458 MHz\n";
}

/// A 38 × 29.4 mm patch 1.6 mm up, meshed at 2 mm (about 2,000 RWG functions), fed across
/// its middle at 2.4 GHz, on the given board ("ground none" for free space).
std::string printed_patch(const std::string& board) {
  return "units mm\n" + board +
         "\nplate patch rectangle corner (-14.7, -19, 1.6) size (29.4, 38)\nmesh patch size 2\n"
         "port gap on patch along (0, -19, 1.6) to (0, 19, 1.6)\nfrequency 2.4 GHz\n";
}

/// Median fill time of `problem` over `count` fills, and the time of the first.
struct FillTimes {
  double first = 0.0, median = 0.0;
};
FillTimes time_fills(const lobe::AntennaProblem& problem, int count) {
  std::vector<double> times;
  for (int r = 0; r < count; ++r) {
    lobe::DenseMatrix matrix(problem.unknowns());
    const auto start = Clock::now();
    lobe::assemble_system(problem, problem.model.frequencies_hz[0], matrix);
    times.push_back(seconds_since(start));
  }
  return {times.front(), median(times)};
}

/// Peak resident memory of this process so far, MiB.
double peak_memory_mib() {
  rusage usage{};
  getrusage(RUSAGE_SELF, &usage);
  return static_cast<double>(usage.ru_maxrss) / 1024.0;
}

/// LU of a complex matrix takes n³/3 complex multiply-adds of 8 real flops each:
/// (8/3) n³ flops. GFLOP/s.
double factor_rate(Eigen::Index n, double seconds) { return 8.0 / 3.0 * n * static_cast<double>(n) * n / seconds / 1e9; }

}  // namespace

int main() {
  using namespace lobe;
  const int threads = thread_count();
  set_thread_count(threads);
  const double peak = lobe::measured_zgemm_gflops(1500);
  std::printf("lobe solver benchmark: %d threads; zgemm (n = 1500) runs at %.1f GFLOP/s (this machine's reference)\n",
              threads, peak);
  // First, and one matrix at a time, so that the peak memory is what one frequency needs.
  constexpr int surface_repetitions = 3;
  const Model model = parse_model(plate_with_monopole(), "benchmark");
  const AntennaProblem problem(model);
  const Eigen::Index n = problem.unknowns();
  std::printf("\nsurface (1 wavelength plate, %zu triangles, with a monopole), %d repetitions:\n",
              problem.surfaces.mesh.triangles.size(), surface_repetitions);
  std::printf("%9s %10s %10s %12s %12s %14s %16s\n", "unknowns", "fill (s)", "factor (s)", "factor GF/s", "of zgemm",
              "total (s)", "peak memory");
  std::vector<double> fill, factor;
  for (int r = 0; r < surface_repetitions; ++r) {
    DenseMatrix matrix(n);
    const Real f = model.frequencies_hz[0];
    auto start = Clock::now();
    assemble_system(problem, f, matrix);
    fill.push_back(seconds_since(start));
    start = Clock::now();
    matrix.factor();
    factor.push_back(seconds_since(start));
  }
  const double rate = factor_rate(n, median(factor));
  std::printf("%9ld %10.3f %10.3f %12.1f %11.0f%% %14.3f %12.0f MiB\n", static_cast<long>(n), median(fill),
              median(factor), rate, 100 * rate / peak, median(fill) + median(factor), peak_memory_mib());
  std::printf("(the dense matrix and its kept copy take %.0f MiB of that)\n",
              static_cast<double>(system_matrix_bytes(static_cast<std::uint64_t>(n))) / (1 << 20));
  {
    // The substrate's fill against the same plate's fill in free space. The first
    // substrate fill makes the kernel table; later fills (sweep cases) find it made.
    const Model air = parse_model(printed_patch("ground none"), "benchmark");
    const Model board = parse_model(printed_patch("substrate fr4 thickness 1.6 permittivity 4.4 loss-tangent 0.02"),
                                    "benchmark");
    const AntennaProblem air_problem(air), board_problem(board);
    const FillTimes board_times = time_fills(board_problem, repetitions);
    const FillTimes air_times = time_fills(air_problem, repetitions);
    std::printf("\nprinted patch (%ld unknowns), fill, %d repetitions:\n", static_cast<long>(board_problem.unknowns()),
                repetitions);
    std::printf("  free space %.3f s; on FR-4 %.3f s (%.2f times), the first with its kernel table %.3f s\n",
                air_times.median, board_times.median, board_times.median / air_times.median, board_times.first);
  }
  std::printf("\nwires (broadside curtains of half-wave dipoles), %d repetitions:\n", repetitions);
  std::printf("%9s %10s %10s %12s %12s %14s\n", "unknowns", "fill (s)", "factor (s)", "factor GF/s", "of zgemm", "total (s)");
  for (int dipoles : {20, 40}) {
    const Model model = parse_model(curtain(dipoles), "benchmark");
    const AntennaProblem problem(model);
    const auto n = problem.basis.size();
    // All fills first, then all factorisations: OpenBLAS's worker threads keep spinning
    // for a while after a factorisation and would slow a fill that follows at once.
    std::vector<double> fill, factor;
    std::vector<DenseMatrix> matrices;
    for (int r = 0; r < repetitions; ++r) {
      matrices.emplace_back(n);
      const auto start = Clock::now();
      assemble_system(problem, model.frequencies_hz[0], matrices.back());
      fill.push_back(seconds_since(start));
    }
    for (auto& matrix : matrices) {
      const auto start = Clock::now();
      matrix.factor();
      factor.push_back(seconds_since(start));
    }
    const double rate = factor_rate(n, median(factor));
    std::printf("%9d %10.3f %10.3f %12.1f %11.0f%% %14.3f\n", n, median(fill), median(factor), rate, 100 * rate / peak,
                median(fill) + median(factor));
  }

  return 0;
}
