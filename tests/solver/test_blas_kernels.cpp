// The choice of OpenBLAS's kernels (solver/blas_kernels): the generic fallback is replaced
// on a CPU with the instruction sets of an optimised family; a recognised CPU is left alone.
#include <gtest/gtest.h>

#include <cstdio>

#include "solver/blas_kernels.hpp"

namespace lobe {
namespace {

TEST(BlasKernels, GenericFallbackIsReplacedByTheFamilyTheCpuCanRun) {
  EXPECT_EQ(better_blas_kernel("Prescott", true, true), "SkylakeX");
  EXPECT_EQ(better_blas_kernel("Prescott", false, true), "Haswell");
  EXPECT_EQ(better_blas_kernel("Prescott", false, false), "");
  // What OpenBLAS recognised stays, whatever the flags.
  EXPECT_EQ(better_blas_kernel("Haswell", true, true), "");
  EXPECT_EQ(better_blas_kernel("Zen", true, true), "");
}

TEST(BlasKernels, ThisMachineRunsOptimisedKernelsWhenItCan) {
  use_fastest_blas_kernels();
  const std::string name = blas_kernel_name();
  std::printf("OpenBLAS kernels in use: %s\n", name.c_str());
#if defined(__x86_64__)
  __builtin_cpu_init();
  if (__builtin_cpu_supports("avx2") && __builtin_cpu_supports("fma")) {
    EXPECT_NE(name, "Prescott") << "this CPU has AVX2 and FMA (unless OPENBLAS_CORETYPE forces the generic kernels)";
  }
#endif
}

}  // namespace
}  // namespace lobe
