#pragma once
/// Four-point Lagrange interpolation on a uniform grid of tabulated values.
#include <algorithm>
#include <cmath>
#include <cstddef>
#include <vector>

#include "core/types.hpp"

namespace lobe {

/// The stencil for x ≥ 0 (in grid steps) on `size` ≥ 4 nodes: the first of four nodes and
/// the cubic's weights on them, at u = x − (first + 1); clamped to the grid's ends. Written
/// so that a loop around it vectorises: truncation (the floor, for x ≥ 0) and a clamp of
/// integers (std::floor, or a clamp written with branches, kept such loops scalar).
struct CubicStencil {
  int first = 0;
  Real weight[4] = {};
};
[[gnu::always_inline]] inline CubicStencil cubic_stencil(Real x, int size) {
  CubicStencil s;
  s.first = std::min(std::max(static_cast<int>(x) - 1, 0), size - 4);
  const Real u = x - (s.first + 1), up = u + 1.0, um = u - 1.0, um2 = u - 2.0;
  s.weight[0] = -u * um * um2 / 6.0;
  s.weight[1] = up * um * um2 / 2.0;
  s.weight[2] = -up * u * um2 / 2.0;
  s.weight[3] = up * u * um / 6.0;
  return s;
}

/// Values on the nodes 0, step, 2 step, … of a uniform grid read below `end` (the last of
/// several grids: everywhere beyond the others), read by the cubic above. Value needs
/// `Value += Real * Value`.
template <class Value>
struct UniformGrid {
  Real step = 0.0;
  Real end = 0.0;
  std::vector<Value> values;

  /// Makes room for the nodes out to `end` and the stencil beyond, and returns the first
  /// node a read above `read_from` (the previous grid's end) reaches: the stencil reaches
  /// one step below its read, so nodes before that are never read and need no value.
  std::size_t size_for_reads_above(Real read_from) {
    values.assign(static_cast<std::size_t>(std::ceil(end / step)) + 4, Value{});
    return static_cast<std::size_t>(std::max(0.0, std::floor(read_from / step) - 2.0));
  }

  Value at(Real x) const {
    const CubicStencil s = cubic_stencil(x / step, static_cast<int>(values.size()));
    Value result{};
    for (int i = 0; i < 4; ++i) result += s.weight[i] * values[s.first + i];
    return result;
  }
};

}  // namespace lobe
