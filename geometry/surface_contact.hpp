#pragma once
/// Where points and wires stand against plates and bodies, from the shapes alone (before
/// any meshing): distances, crossings and the nearest surface point.
#include <vector>

#include "geometry/surface_shape.hpp"

namespace lobe {

/// The unit vector in the plane with normal `normal` nearest +x (nearest +y when the
/// normal is along x): a rectangle's width direction and a helix's start direction.
Vec3 in_plane_direction(const Vec3& normal);

/// A closed 2-D outline: a polygon (corners in order) or, when `radius` > 0, a circle.
struct Outline2 {
  std::vector<Eigen::Vector2d> corners;
  Eigen::Vector2d centre = Eigen::Vector2d::Zero();
  Real radius = 0.0;
  bool contains(const Eigen::Vector2d& q) const;
  /// Distance from q to the outline's boundary.
  Real boundary_distance(const Eigen::Vector2d& q) const;
};

/// The plates and bodies of a model, each in its own frame (transforms undone: they are
/// isometries, so distances carry over).
class SurfaceContact {
 public:
  explicit SurfaceContact(const std::vector<SurfaceShape>& shapes);

  std::size_t size() const { return m_entries.size(); }
  bool is_plate(std::size_t shape) const { return m_entries[shape].plate; }
  /// Distance from p to the shape's surface (a plate's holes excluded), m.
  Real distance(std::size_t shape, const Vec3& p) const;
  /// Signed height of p above a plate's plane along its normal, m (plates only).
  Real height(std::size_t shape, const Vec3& p) const;
  /// Whether the foot of p on a plate's plane lies on the plate, and its distance to the
  /// plate's nearest edge (outline or hole), m (plates only).
  bool foot_on_plate(std::size_t shape, const Vec3& p, Real* edge_distance) const;
  /// True when p lies inside a closed body by more than `margin` (bodies only).
  bool inside_body(std::size_t shape, const Vec3& p, Real margin) const;
  /// The point of the shape's surface nearest p (the plane's foot for a plate).
  Vec3 nearest_point(std::size_t shape, const Vec3& p) const;

 private:
  struct Entry {
    bool plate = true;
    SurfaceKind kind = SurfaceKind::rectangle;
    Affine to_local = Affine::Identity(), to_world = Affine::Identity();
    Vec3 origin = Vec3::Zero(), u = Vec3::UnitX(), w = Vec3::UnitY(), n = Vec3::UnitZ();  ///< plates
    Outline2 outline;
    std::vector<Outline2> holes;
    Vec3 centre = Vec3::Zero();  ///< sphere
    Real radius = 0.0;           ///< sphere
    Vec3 low = Vec3::Zero(), high = Vec3::Zero();  ///< box
  };
  Eigen::Vector2d in_plane(const Entry& e, const Vec3& local) const;
  std::vector<Entry> m_entries;
};

}  // namespace lobe
