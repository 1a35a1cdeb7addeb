#pragma once
/// The smooth remainder of the Green's function once its static 1/R part is taken out.
#include <cmath>

#include "core/types.hpp"

namespace lobe {

/// (e^{−jkR} − 1)/R without cancellation for small kR; its limit −jk at R = 0 (where a
/// self-term's observation and source points coincide).
inline Complex smooth_kernel(Real k, Real r) {
  if (k * r < 1e-8) return Complex(-0.5 * k * k * r, -k);
  const Real s = std::sin(0.5 * k * r);
  return Complex(-2.0 * s * s, -std::sin(k * r)) / r;
}

}  // namespace lobe
