#include "solver/threads.hpp"

#include "solver/blas_kernels.hpp"

#ifdef _OPENMP
#include <omp.h>
#endif

extern "C" {
void openblas_set_num_threads(int);
int openblas_get_num_threads(void);
}

namespace lobe {

void set_thread_count(int n) {
  use_fastest_blas_kernels();
#ifdef _OPENMP
  omp_set_num_threads(n);
#endif
  openblas_set_num_threads(n);
}

SingleThreadedBlas::SingleThreadedBlas() : m_threads(openblas_get_num_threads()) { openblas_set_num_threads(1); }

SingleThreadedBlas::~SingleThreadedBlas() { openblas_set_num_threads(m_threads); }

int thread_count() {
#ifdef _OPENMP
  return omp_get_max_threads();
#else
  return 1;
#endif
}

}  // namespace lobe
