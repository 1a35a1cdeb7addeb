#pragma once
/// This machine's own limits, measured in the run that uses them: the rate of complex
/// matrix multiplication (what a dense factorisation cannot beat) and the rate of
/// evaluating the free-space kernel e^{-jkR}/R (what a matrix fill cannot beat).

namespace lobe {

/// zgemm of order `n` on the current BLAS threads, GFLOP/s (median of three).
double zgemm_gflops(int n);

/// Evaluations of e^{-jkR}/R per second over all threads, from a loop over arrays of
/// points with the vector math library's sine and cosine (best of five).
double kernel_evaluations_per_second();

}  // namespace lobe
