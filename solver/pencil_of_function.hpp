#pragma once
/// Sums of complex exponentials fitted to equally spaced samples by the generalized
/// pencil-of-function method (Hua & Sarkar 1989), the exponent extraction of the discrete
/// complex image method.
#include <vector>

#include "core/types.hpp"

namespace lobe {

/// y_k ≈ Σ_i amplitudes[i] · ratios[i]^k for k = 0 … N−1.
struct ExponentialFit {
  std::vector<Complex> amplitudes;
  std::vector<Complex> ratios;
};

/// The fit to `samples` (N ≥ 4) with as many exponentials as the samples' Hankel matrix
/// has singular values above `tolerance` × its largest.
ExponentialFit pencil_of_function(const std::vector<Complex>& samples, Real tolerance);

}  // namespace lobe
