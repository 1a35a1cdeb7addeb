#pragma once
/// Batched e^{−jx} for the matrix-fill kernels, in a loop the compiler can vectorise.
#include "core/types.hpp"

namespace lobe {

/// cosine[i] = cos(x[i]) and sine[i] = sin(x[i]) for |x[i]| < 1e5, to a few units in the
/// last place. Range reduction by a three-part π/2 (Cody & Waite, 1980), then the Taylor
/// series on [−π/4, π/4] through x¹⁵ and x¹⁶ (truncation below 5e-17). Branch-free, so
/// that the loop vectorises; the library's sincos cannot, and took half the fill time.
void sine_cosine(const Real* x, Real* sine, Real* cosine, int count);

}  // namespace lobe
