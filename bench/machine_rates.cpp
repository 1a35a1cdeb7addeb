#include "bench/machine_rates.hpp"

#include <algorithm>
#include <chrono>
#include <cmath>
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

double kernel_evaluations_per_second() {
  constexpr int count = 4096, passes = 1000, tries = 5;
  double best = 0.0;
  for (int t = 0; t < tries; ++t) {
    const auto start = std::chrono::steady_clock::now();
#pragma omp parallel
    {
      std::vector<double> x(count), y(count), z(count), real(count), imaginary(count);
      for (int i = 0; i < count; ++i) {
        x[i] = 0.01 + 1e-4 * i;
        y[i] = 0.3;
        z[i] = 0.1 * i / count;
      }
      for (int p = 0; p < passes; ++p)
        evaluate_kernel(x.data(), y.data(), z.data(), count, 6.28 + 1e-6 * p, real.data(), imaginary.data());
      // Keeps the loop from being optimised away.
      if (real[count / 2] == 12345.0) best = -1.0;
    }
    const double seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
    best = std::max(best, static_cast<double>(count) * passes * thread_count() / seconds);
  }
  return best;
}

}  // namespace lobe
