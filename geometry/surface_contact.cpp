#include "geometry/surface_contact.hpp"

#include <algorithm>
#include <cmath>

namespace lobe {

Vec3 in_plane_direction(const Vec3& normal) {
  Vec3 u = Vec3::UnitX() - Vec3::UnitX().dot(normal) * normal;
  if (u.norm() < 1e-9) u = Vec3::UnitY() - Vec3::UnitY().dot(normal) * normal;
  return u.normalized();
}

bool Outline2::contains(const Eigen::Vector2d& q) const {
  if (radius > 0.0) return (q - centre).norm() < radius;
  // Crossing-number test: a ray toward +x crosses the outline an odd number of times.
  bool inside = false;
  for (std::size_t i = 0, j = corners.size() - 1; i < corners.size(); j = i++) {
    const Eigen::Vector2d &a = corners[i], &b = corners[j];
    if ((a.y() > q.y()) != (b.y() > q.y()) && q.x() < a.x() + (q.y() - a.y()) * (b.x() - a.x()) / (b.y() - a.y()))
      inside = !inside;
  }
  return inside;
}

Real Outline2::boundary_distance(const Eigen::Vector2d& q) const {
  if (radius > 0.0) return std::abs((q - centre).norm() - radius);
  Real nearest = INFINITY;
  for (std::size_t i = 0, j = corners.size() - 1; i < corners.size(); j = i++) {
    const Eigen::Vector2d edge = corners[i] - corners[j];
    const Real t = std::clamp((q - corners[j]).dot(edge) / edge.squaredNorm(), 0.0, 1.0);
    nearest = std::min(nearest, (q - corners[j] - t * edge).norm());
  }
  return nearest;
}

namespace {

/// The corners of a flat outline in 3-D (a rectangle's four, a polygon's own).
std::vector<Vec3> outline_corners(const SurfaceShape& s) {
  if (s.kind == SurfaceKind::polygon) return s.polygon;
  const Vec3 n = s.normal.normalized(), u = in_plane_direction(n), w = n.cross(u);
  return {s.corner, s.corner + s.width * u, s.corner + s.width * u + s.length * w, s.corner + s.length * w};
}

}  // namespace

SurfaceContact::SurfaceContact(const std::vector<SurfaceShape>& shapes) {
  for (const SurfaceShape& s : shapes) {
    Entry e;
    e.kind = s.kind;
    e.to_world = s.transform;
    e.to_local = s.transform.inverse();
    e.plate = s.kind == SurfaceKind::rectangle || s.kind == SurfaceKind::polygon || s.kind == SurfaceKind::disc;
    if (s.kind == SurfaceKind::sphere) {
      e.centre = s.corner;
      e.radius = 0.5 * s.diameter;
    } else if (s.kind == SurfaceKind::box) {
      e.low = s.corner;
      e.high = s.corner + s.size;
    } else if (s.kind == SurfaceKind::disc) {
      e.origin = s.corner;
      e.n = s.normal.normalized();
      e.u = in_plane_direction(e.n);
      e.w = e.n.cross(e.u);
      e.outline.radius = 0.5 * s.diameter;
    } else {
      const std::vector<Vec3> corners = outline_corners(s);
      e.origin = corners[0];
      if (s.kind == SurfaceKind::polygon) {
        e.n = (corners[1] - corners[0]).cross(corners[2] - corners[0]).normalized();
        e.u = (corners[1] - corners[0]).normalized();
      } else {
        e.n = s.normal.normalized();
        e.u = in_plane_direction(e.n);
      }
      e.w = e.n.cross(e.u);
      for (const Vec3& c : corners) e.outline.corners.push_back(in_plane(e, c));
    }
    for (const SurfaceShape& cut : s.cuts) {
      Outline2 hole;
      if (cut.kind == SurfaceKind::disc) {
        hole.centre = in_plane(e, cut.corner);
        hole.radius = 0.5 * cut.diameter;
      } else {
        for (const Vec3& c : outline_corners(cut)) hole.corners.push_back(in_plane(e, c));
      }
      e.holes.push_back(std::move(hole));
    }
    m_entries.push_back(std::move(e));
  }
}

Eigen::Vector2d SurfaceContact::in_plane(const Entry& e, const Vec3& local) const {
  return {(local - e.origin).dot(e.u), (local - e.origin).dot(e.w)};
}

Real SurfaceContact::height(std::size_t shape, const Vec3& p) const {
  const Entry& e = m_entries[shape];
  return (e.to_local * p - e.origin).dot(e.n);
}

bool SurfaceContact::foot_on_plate(std::size_t shape, const Vec3& p, Real* edge_distance) const {
  const Entry& e = m_entries[shape];
  const Eigen::Vector2d q = in_plane(e, e.to_local * p);
  bool on = e.outline.contains(q);
  Real edge = e.outline.boundary_distance(q);
  for (const Outline2& hole : e.holes) {
    on = on && !hole.contains(q);
    edge = std::min(edge, hole.boundary_distance(q));
  }
  if (edge_distance) *edge_distance = edge;
  return on;
}

bool SurfaceContact::inside_body(std::size_t shape, const Vec3& p, Real margin) const {
  const Entry& e = m_entries[shape];
  const Vec3 local = e.to_local * p;
  if (e.kind == SurfaceKind::sphere) return (local - e.centre).norm() < e.radius - margin;
  return ((local - e.low).array() > margin).all() && ((e.high - local).array() > margin).all();
}

Real SurfaceContact::distance(std::size_t shape, const Vec3& p) const {
  const Entry& e = m_entries[shape];
  const Vec3 local = e.to_local * p;
  if (e.kind == SurfaceKind::sphere) return std::abs((local - e.centre).norm() - e.radius);
  if (e.kind == SurfaceKind::box) {
    const Vec3 outside = (e.low - local).cwiseMax(local - e.high).cwiseMax(0.0);
    if (outside.norm() > 0.0) return outside.norm();
    return std::min((local - e.low).minCoeff(), (e.high - local).minCoeff());
  }
  Real edge = 0.0;
  const bool on = foot_on_plate(shape, p, &edge);
  const Real h = (local - e.origin).dot(e.n);
  return on ? std::abs(h) : std::hypot(h, edge);
}

Vec3 SurfaceContact::nearest_point(std::size_t shape, const Vec3& p) const {
  const Entry& e = m_entries[shape];
  const Vec3 local = e.to_local * p;
  Vec3 foot = local;
  if (e.kind == SurfaceKind::sphere) {
    const Vec3 radial = local - e.centre;
    foot = e.centre + e.radius * (radial.norm() > 0.0 ? radial.normalized() : Vec3::UnitZ());
  } else if (e.kind == SurfaceKind::box) {
    foot = local.cwiseMax(e.low).cwiseMin(e.high);
    if (foot == local) {
      // Inside: move to the nearest face.
      Eigen::Index axis = 0;
      const Vec3 to_low = local - e.low, to_high = e.high - local;
      const Vec3 nearest = to_low.cwiseMin(to_high);
      nearest.minCoeff(&axis);
      foot[axis] = to_low[axis] < to_high[axis] ? e.low[axis] : e.high[axis];
    }
  } else {
    foot = local - (local - e.origin).dot(e.n) * e.n;
  }
  return e.to_world * foot;
}

}  // namespace lobe
