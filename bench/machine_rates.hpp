#pragma once
/// This machine's own limits, measured in the run that uses them: the rate of complex
/// matrix multiplication (what a dense factorisation cannot beat) and the rate of
/// evaluating the free-space kernel e^{-jkR}/R (what a matrix fill cannot beat).

namespace lobe {

/// zgemm of order `n` on the current BLAS threads, GFLOP/s (median of three).
double zgemm_gflops(int n);

/// A measured kernel-evaluation rate, and how long its tries ran.
struct KernelRate {
  double per_second = 0.0;            ///< evaluations of e^{-jkR}/R per second, all threads
  double shortest_try_seconds = 0.0;  ///< the shortest of the timed tries
};

/// Evaluations of e^{-jkR}/R per second over all threads, from a loop over arrays of
/// points with the vector math library's sine and cosine: the best of five tries, each
/// lasting at least `shortest_try_seconds`.
KernelRate kernel_evaluations_per_second(double shortest_try_seconds = 0.1);

}  // namespace lobe
