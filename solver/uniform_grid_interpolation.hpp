#pragma once
/// Four-point Lagrange interpolation on a uniform grid of tabulated values.
#include <algorithm>
#include <cmath>

#include "core/types.hpp"

namespace lobe {

/// The stencil for x (in grid steps) on `size` ≥ 4 nodes: the first of four nodes and the
/// cubic's weights on them, at u = x − (first + 1); clamped to the grid's ends.
struct CubicStencil {
  int first = 0;
  Real weight[4] = {};
};
inline CubicStencil cubic_stencil(Real x, int size) {
  CubicStencil s;
  s.first = std::clamp(static_cast<int>(std::floor(x)) - 1, 0, size - 4);
  const Real u = x - (s.first + 1), up = u + 1.0, um = u - 1.0, um2 = u - 2.0;
  s.weight[0] = -u * um * um2 / 6.0;
  s.weight[1] = up * um * um2 / 2.0;
  s.weight[2] = -up * u * um2 / 2.0;
  s.weight[3] = up * u * um / 6.0;
  return s;
}

}  // namespace lobe
