#include "solver/time_estimate.hpp"

#include <cblas.h>

#include <algorithm>
#include <chrono>
#include <vector>

#include "core/types.hpp"
#include "solver/blas_kernels.hpp"

namespace lobe {

double measured_zgemm_gflops(int n) {
  use_fastest_blas_kernels();
  const ComplexMatrix a = ComplexMatrix::Random(n, n), b = ComplexMatrix::Random(n, n);
  ComplexMatrix c(n, n);
  const Complex one(1.0), zero(0.0);
  std::vector<double> seconds;
  for (int r = 0; r < 3; ++r) {
    const auto start = std::chrono::steady_clock::now();
    cblas_zgemm(CblasColMajor, CblasNoTrans, CblasNoTrans, n, n, n, &one, a.data(), n, b.data(), n, &zero, c.data(), n);
    seconds.push_back(std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count());
  }
  std::sort(seconds.begin(), seconds.end());
  return 8.0 * n * n * static_cast<double>(n) / seconds[1] / 1e9;
}

double estimated_solve_seconds(double unknowns, double frequencies, double threshold_seconds) {
  constexpr double fill_share = 1.0 / 3.0, factor_efficiency = 0.75, slow_gflops = 1.0;
  const double flops = 8.0 / 3.0 * unknowns * unknowns * unknowns * frequencies * (1.0 + fill_share);
  if (flops / (slow_gflops * 1e9) < threshold_seconds) return 0.0;
  static const double rate = measured_zgemm_gflops(600);
  return flops / (factor_efficiency * rate * 1e9);
}

}  // namespace lobe
