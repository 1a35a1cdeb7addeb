#include "solver/phase_factor.hpp"

#include "core/vector_clones.hpp"

namespace lobe {

LOBE_VECTOR_CLONES void sine_cosine(
    const Real* x, Real* sine, Real* cosine, int count) {
#pragma omp simd
  for (int i = 0; i < count; ++i) sine_cosine_of(x[i], sine[i], cosine[i]);
}

}  // namespace lobe
