#include "solver/green_function.hpp"

#include "solver/phase_factor.hpp"

namespace lobe {

void green_kernel_batch(Real k, const Real* r, const Real* weight, Real* re, Real* im, int count) {
  constexpr int chunk = 64;
  Real phase[chunk], sine[chunk], cosine[chunk];
  for (int start = 0; start < count; start += chunk) {
    const int n = count - start < chunk ? count - start : chunk;
    for (int i = 0; i < n; ++i) phase[i] = k * r[start + i];
    sine_cosine(phase, sine, cosine, n);
#pragma omp simd
    for (int i = 0; i < n; ++i) {
      const Real w = weight[start + i] / r[start + i];
      re[start + i] = w * cosine[i];
      im[start + i] = -w * sine[i];
    }
  }
}

}  // namespace lobe
