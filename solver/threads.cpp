#include "solver/threads.hpp"

#include "solver/blas_kernels.hpp"

#ifdef _OPENMP
#include <omp.h>
#endif

extern "C" void openblas_set_num_threads(int);

namespace lobe {

void set_thread_count(int n) {
  use_fastest_blas_kernels();
#ifdef _OPENMP
  omp_set_num_threads(n);
#endif
  openblas_set_num_threads(n);
}

int thread_count() {
#ifdef _OPENMP
  return omp_get_max_threads();
#else
  return 1;
#endif
}

}  // namespace lobe
