#include "bench/machine_rates.hpp"

#include <algorithm>
#include <chrono>
#include <cmath>
#include <cstdio>
#include <vector>

#include "core/vector_clones.hpp"
#include "solver/threads.hpp"
#include "solver/time_estimate.hpp"

namespace lobe {
namespace {

/// One pass of the kernel over `count` source points seen from the origin. Compiled with
/// the fast-math flags the vector math library needs (bench/CMakeLists.txt) and for
/// wider vectors beside the generic build (core/vector_clones.hpp).
LOBE_VECTOR_CLONES void evaluate_kernel(
    const double* __restrict x, const double* __restrict y, const double* __restrict z, int count, double k,
    double* __restrict real, double* __restrict imaginary) {
#pragma omp simd
  for (int i = 0; i < count; ++i) {
    const double r = std::sqrt(x[i] * x[i] + y[i] * y[i] + z[i] * z[i]);
    const double inverse = 1.0 / r;
    real[i] = std::cos(k * r) * inverse;
    imaginary[i] = -std::sin(k * r) * inverse;
  }
}

}  // namespace

double zgemm_gflops(int n) { return measured_zgemm_gflops(n); }

KernelRate kernel_evaluations_per_second(double shortest_try_seconds) {
  constexpr int count = 4096, tries = 5, passes_a_round = 256;
  // One round: every thread makes `passes_a_round` passes over its own arrays.
  const auto round = [] {
#pragma omp parallel
    {
      std::vector<double> x(count), y(count), z(count), real(count), imaginary(count);
      for (int i = 0; i < count; ++i) {
        x[i] = 0.01 + 1e-4 * i;
        y[i] = 0.3;
        z[i] = 0.1 * i / count;
      }
      for (int p = 0; p < passes_a_round; ++p)
        evaluate_kernel(x.data(), y.data(), z.data(), count, 6.28 + 1e-6 * p, real.data(), imaginary.data());
      // Keeps the loop from being optimised away.
      if (real[count / 2] == 12345.0) std::printf("%g\n", imaginary[0]);
    }
  };
  // Each try runs rounds until it has lasted `shortest_try_seconds`: tries of a few
  // milliseconds, taken right after a zgemm whose BLAS threads were still spinning, once
  // gave a third of the rate measured a minute later, and the fill 90 % of it.
  KernelRate rate;
  rate.shortest_try_seconds = 1e300;
  for (int t = 0; t < tries; ++t) {
    const auto start = std::chrono::steady_clock::now();
    double seconds = 0.0;
    long passes = 0;
    do {
      round();
      passes += passes_a_round;
      seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
    } while (seconds < shortest_try_seconds);
    rate.shortest_try_seconds = std::min(rate.shortest_try_seconds, seconds);
    rate.per_second = std::max(rate.per_second, static_cast<double>(count) * passes * thread_count() / seconds);
  }
  return rate;
}

}  // namespace lobe
