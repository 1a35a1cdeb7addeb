#pragma once
/// The curve a wire follows, parametrised by the fraction of its length.
#include <vector>

#include "geometry/model.hpp"

namespace lobe {

/// Evaluates a wire's shape, with its transform applied, at fractions of its length.
class WirePath {
 public:
  explicit WirePath(const Wire& wire);
  /// Total length along the path, m (chord-independent: the true curve length).
  Real length() const { return m_length; }
  /// Point at fraction u in [0, 1] of the length, world coordinates (m).
  Vec3 point(Real u) const;
  /// Fractions where the path has corners (polyline vertices), including 0 and 1.
  const std::vector<Real>& corner_fractions() const { return m_corners; }
  /// Total turning of a curved path, rad (0 for straight pieces); sets a minimum segment count.
  Real turning_angle() const;

 private:
  Vec3 local_point(Real u) const;
  const Wire& m_wire;
  Real m_length = 0.0;
  std::vector<Real> m_corners;
};

}  // namespace lobe
