#include "geometry/wire_path.hpp"

#include <cmath>

#include "core/constants.hpp"
#include "geometry/surface_contact.hpp"

namespace lobe {
WirePath::WirePath(const Wire& wire) : m_wire(wire) {
  const WireShape& s = wire.shape;
  switch (s.kind) {
    case ShapeKind::line:
    case ShapeKind::polyline: {
      std::vector<Real> cumulative{0.0};
      for (std::size_t i = 1; i < s.points.size(); ++i)
        cumulative.push_back(cumulative.back() + (s.points[i] - s.points[i - 1]).norm());
      m_length = cumulative.back();
      for (Real c : cumulative) m_corners.push_back(c / m_length);
      m_corners.back() = 1.0;
      break;
    }
    case ShapeKind::arc: {
      const Vec3 offset = s.start - s.center;
      const Real radius = (offset - offset.dot(s.axis) * s.axis).norm();
      m_length = radius * std::abs(s.angle);
      m_corners = {0.0, 1.0};
      break;
    }
    case ShapeKind::helix: {
      const Real circumference = pi * s.diameter;
      m_length = s.turns * std::hypot(circumference, s.pitch);
      m_corners = {0.0, 1.0};
      break;
    }
  }
}

Vec3 WirePath::local_point(Real u) const {
  const WireShape& s = m_wire.shape;
  switch (s.kind) {
    case ShapeKind::line:
    case ShapeKind::polyline: {
      for (std::size_t i = 1; i < m_corners.size(); ++i) {
        if (u <= m_corners[i] || i + 1 == m_corners.size()) {
          const Real t = (u - m_corners[i - 1]) / (m_corners[i] - m_corners[i - 1]);
          return s.points[i - 1] + t * (s.points[i] - s.points[i - 1]);
        }
      }
      return s.points.back();
    }
    case ShapeKind::arc: {
      // Rotation of the start point about the normal through the centre (right-hand rule).
      const Eigen::AngleAxisd rotation(u * s.angle, s.axis);
      return s.center + rotation * (s.start - s.center);
    }
    case ShapeKind::helix: {
      const Vec3 u_dir = in_plane_direction(s.axis);
      const Vec3 w_dir = (s.right_handed ? 1.0 : -1.0) * s.axis.cross(u_dir);
      const Real phase = 2 * pi * s.turns * u;
      return s.center + 0.5 * s.diameter * (std::cos(phase) * u_dir + std::sin(phase) * w_dir) +
             s.axis * (s.pitch * s.turns * u);
    }
  }
  return Vec3::Zero();
}

Vec3 WirePath::point(Real u) const { return m_wire.transform * local_point(u); }

Real WirePath::turning_angle() const {
  const WireShape& s = m_wire.shape;
  if (s.kind == ShapeKind::arc) return std::abs(s.angle);
  if (s.kind == ShapeKind::helix) return 2 * pi * s.turns;
  return 0.0;
}

}  // namespace lobe
