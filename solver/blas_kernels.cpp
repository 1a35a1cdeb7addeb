#include "solver/blas_kernels.hpp"

#include <cstdlib>
#include <mutex>

extern "C" {
// OpenBLAS's dynamic-architecture entry points (exported by every DYNAMIC_ARCH build):
// quit forgets the kernel table, init chooses one again, reading OPENBLAS_CORETYPE.
void gotoblas_dynamic_init(void);
void gotoblas_dynamic_quit(void);
char* openblas_get_corename(void);
}

namespace lobe {

std::string better_blas_kernel(const std::string& chosen, bool avx512, bool avx2_fma) {
  // Only the generic fallback is replaced: a recognised CPU keeps what OpenBLAS chose.
  if (chosen != "Prescott") return {};
  if (avx512) return "SkylakeX";
  if (avx2_fma) return "Haswell";
  return {};
}

void use_fastest_blas_kernels() {
  static std::once_flag once;
  std::call_once(once, [] {
    if (std::getenv("OPENBLAS_CORETYPE") != nullptr) return;
#if defined(__x86_64__)
    __builtin_cpu_init();
    const bool avx512 = __builtin_cpu_supports("avx512f") && __builtin_cpu_supports("avx512bw") &&
                        __builtin_cpu_supports("avx512dq") && __builtin_cpu_supports("avx512vl");
    const bool avx2_fma = __builtin_cpu_supports("avx2") && __builtin_cpu_supports("fma");
    const std::string better = better_blas_kernel(blas_kernel_name(), avx512, avx2_fma);
    if (better.empty()) return;
    // The environment is how OpenBLAS documents choosing a kernel; re-running its choice
    // reads it. Nothing has been computed with the old kernels yet.
    setenv("OPENBLAS_CORETYPE", better.c_str(), 0);
    gotoblas_dynamic_quit();
    gotoblas_dynamic_init();
#endif
  });
}

std::string blas_kernel_name() {
  const char* name = openblas_get_corename();
  return name != nullptr ? name : "";
}

}  // namespace lobe
