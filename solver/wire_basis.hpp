#pragma once
/// Piecewise-linear (triangle) current basis functions over a wire mesh.
#include <vector>

#include "geometry/wire_mesh.hpp"

namespace lobe {

/// One half of a triangle function: on one segment, a linear ramp from 0 at one end to 1
/// at `peak_end`, flowing along the segment direction times `sign`.
struct BasisPiece {
  int basis = 0;
  int peak_end = 0;   ///< 0: peak at the segment start, 1: at its end
  Real sign = 1.0;    ///< +1 along the segment direction, −1 against it
};

/// The unknowns of a wire mesh. At a node where k ends meet there are k−1 functions, each
/// carrying current from the first end into another (Kirchhoff's law holds by
/// construction); a node on a perfect ground has one half function per end, completed by
/// its image; a node attached to a surface has one function per end, carrying current from
/// that end into the surface (completed by a junction star, solver/junction_star.hpp).
/// With `uniform_probes`, a segment from the ground to an attached node carries a single
/// function instead, of uniform current (two ramps of one function): the probe through a
/// substrate, electrically short, whose kernels are those of a uniform current.
class WireBasis {
 public:
  /// `attached[node]` marks nodes that lie on a surface mesh vertex (empty: none do).
  explicit WireBasis(const WireMesh& mesh, const std::vector<bool>& attached = {}, bool uniform_probes = false);
  /// The junction functions of an attached node, in the order of its ends.
  const std::vector<int>& functions_into_surface(int node) const { return m_into_surface[node]; }
  int size() const { return m_count; }
  /// The pieces lying on segment s.
  const std::vector<BasisPiece>& pieces_on(int segment) const { return m_by_segment[segment]; }
  /// The current each basis function carries across a gap, in the wire's direction:
  /// the port or load's coupling vector (excitation and measurement alike).
  Eigen::VectorXd gap_vector(const Gap& gap) const;

 private:
  int m_count = 0;
  std::vector<std::vector<BasisPiece>> m_by_segment;
  std::vector<std::vector<int>> m_into_surface;
};

}  // namespace lobe
