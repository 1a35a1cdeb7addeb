#pragma once
/// One place that sets how many threads the fill (OpenMP) and the factorisation (BLAS) use.

namespace lobe {

/// Sets the thread count of OpenMP regions and of the BLAS library; n ≥ 1.
void set_thread_count(int n);
/// Threads the next parallel region will use.
int thread_count();

/// Keeps the BLAS library on one thread while it lives and then restores its count: for
/// OpenMP threads that share work and each call BLAS (BLAS's own threads would spin
/// beside them).
class SingleThreadedBlas {
 public:
  SingleThreadedBlas();
  ~SingleThreadedBlas();
  SingleThreadedBlas(const SingleThreadedBlas&) = delete;
  SingleThreadedBlas& operator=(const SingleThreadedBlas&) = delete;

 private:
  int m_threads;
};

}  // namespace lobe
