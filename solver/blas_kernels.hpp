#pragma once
/// Which of OpenBLAS's compute kernels this process uses, chosen once before any BLAS call.
#include <string>

namespace lobe {

/// OpenBLAS 0.3.21 (Debian 12) picks its kernels from the CPU's family and model number;
/// a model newer than it knows (the Xeons of current cloud machines, model 0xCF) gets the
/// generic "Prescott" kernels, at a sixth of the rate the CPU can do (zgemm 18 against
/// 106 GFLOP/s on 2 cores, measured). When OpenBLAS has fallen back so and the CPU
/// reports the instruction sets of a kernel family it has, this switches to that family:
/// SkylakeX with AVX-512 (F, BW, DQ, VL), Haswell with AVX2 and FMA. A kernel the user
/// names in OPENBLAS_CORETYPE is kept. Idempotent and thread-safe; every function of
/// lobe that calls BLAS calls this first.
void use_fastest_blas_kernels();

/// The kernel family OpenBLAS uses now ("SkylakeX", "Haswell", "Prescott", ...).
std::string blas_kernel_name();

/// The family to switch to, given the one OpenBLAS chose and the CPU's instruction sets;
/// empty to keep OpenBLAS's choice. Separate from the switch so that it can be tested.
std::string better_blas_kernel(const std::string& chosen, bool avx512, bool avx2_fma);

}  // namespace lobe
