#pragma once
/// One place that sets how many threads the fill (OpenMP) and the factorisation (BLAS) use.

namespace lobe {

/// Sets the thread count of OpenMP regions and of the BLAS library; n ≥ 1.
void set_thread_count(int n);
/// Threads the next parallel region will use.
int thread_count();

}  // namespace lobe
