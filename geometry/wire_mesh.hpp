#pragma once
/// Straight segments with radii, joined at nodes; the discrete form of a model's wires.
#include <string>
#include <vector>

#include "geometry/mesh_warning.hpp"
#include "geometry/model.hpp"

namespace lobe {

/// One straight piece of wire, from `start` to `end`; current is positive along it.
struct Segment {
  Vec3 start = Vec3::Zero();
  Vec3 end = Vec3::Zero();
  Real radius = 0.0;         ///< m
  Real conductivity = 0.0;   ///< S/m; 0 = perfect conductor
  int wire = 0;              ///< index into Model::wires
  int node[2] = {-1, -1};    ///< node at start and at end

  Real length() const { return (end - start).norm(); }
  Vec3 direction() const { return (end - start).normalized(); }
  Vec3 midpoint() const { return 0.5 * (start + end); }
};

/// A segment end: which segment, and 0 for its start or 1 for its end.
struct SegmentEnd {
  int segment = 0;
  int end = 0;
};

/// A point where segment ends meet; on_ground when it touches a perfect ground at z = 0.
struct MeshNode {
  Vec3 position = Vec3::Zero();
  std::vector<SegmentEnd> ends;
  bool on_ground = false;
};

/// A place on a wire where a port or load sits: a segment end, with the wire's own
/// direction as the positive sense of current.
struct Gap {
  SegmentEnd at;
  int node = 0;
  SourceLocation where;  ///< of the port or load
  std::string what;      ///< "port NAME" or "load NAME"
};


struct WireMesh {
  std::vector<Segment> segments;
  std::vector<MeshNode> nodes;
  std::vector<Gap> port_gaps;  ///< one per wire port of Model::ports, same order
  std::vector<Gap> load_gaps;  ///< one per Model::loads, same order
  /// One per end on a wire of Model::network's elements, in the order of the elements and
  /// of their ends.
  std::vector<Gap> network_gaps;
  std::vector<MeshWarning> warnings;
  int junction_count = 0;      ///< nodes where three or more ends meet, or a wire meets the ground
};

/// How close a wire node must come to the ground or a surface to touch it: a millionth of
/// its segment's length, rounding in the user's arithmetic rather than a gap.
inline Real touch_tolerance(Real segment_length) { return 1e-6 * segment_length; }

/// Meshes every wire of the model: segment counts from `segments N` or from the highest
/// frequency (about a twentieth of a wavelength), nodes at every port and load, nodes joined
/// where they touch (a wire end on another wire between its nodes splits that segment, and
/// a wire passing through a plate gets a node there). Throws InputError for geometry that cannot be solved; warns for
/// geometry that is solvable but questionable.
WireMesh mesh_wires(const Model& model);

/// Throws InputError for a port or load on a free wire end, where no current can flow;
/// `attached[node]` marks nodes joined to a surface (empty: none are).
void require_current_at_gaps(const WireMesh& mesh, const std::vector<bool>& attached);

/// Per segment: how far its midpoint lies along its wire from the wire's start (m), the
/// position a builder measures with a rule.
std::vector<Real> distances_along_wires(const WireMesh& mesh);

}  // namespace lobe
