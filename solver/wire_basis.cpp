#include "solver/wire_basis.hpp"

namespace lobe {

WireBasis::WireBasis(const WireMesh& mesh, const std::vector<bool>& attached, bool uniform_probes)
    : m_by_segment(mesh.segments.size()), m_into_surface(mesh.nodes.size()) {
  // Current into a node on a segment end is positive when that end is the segment's end.
  auto into_node = [](const SegmentEnd& e) { return e.end == 1 ? 1.0 : -1.0; };
  const auto is_attached = [&](int node) { return !attached.empty() && attached[node]; };
  const auto is_probe = [&](const SegmentEnd& e) {
    const Segment& s = mesh.segments[e.segment];
    return uniform_probes && mesh.nodes[s.node[1 - e.end]].on_ground && is_attached(s.node[e.end]);
  };
  for (std::size_t n = 0; n < mesh.nodes.size(); ++n) {
    const MeshNode& node = mesh.nodes[n];
    if (is_attached(static_cast<int>(n))) {
      for (const auto& e : node.ends) {
        m_by_segment[e.segment].push_back({m_count, e.end, into_node(e)});
        if (is_probe(e)) m_by_segment[e.segment].push_back({m_count, 1 - e.end, into_node(e)});
        m_into_surface[n].push_back(m_count++);
      }
      continue;
    }
    if (node.on_ground) {
      for (const auto& e : node.ends) {
        const Segment& s = mesh.segments[e.segment];
        if (uniform_probes && is_attached(s.node[1 - e.end])) continue;  // the probe's function, at its top
        m_by_segment[e.segment].push_back({m_count, e.end, -into_node(e)});
        ++m_count;
      }
      continue;
    }
    const SegmentEnd& first = node.ends.front();
    for (std::size_t i = 1; i < node.ends.size(); ++i) {
      const SegmentEnd& other = node.ends[i];
      m_by_segment[first.segment].push_back({m_count, first.end, into_node(first)});
      m_by_segment[other.segment].push_back({m_count, other.end, -into_node(other)});
      ++m_count;
    }
  }
}

Eigen::VectorXd WireBasis::gap_vector(const Gap& gap) const {
  Eigen::VectorXd p = Eigen::VectorXd::Zero(m_count);
  for (const auto& piece : m_by_segment[gap.at.segment])
    if (piece.peak_end == gap.at.end) p[piece.basis] += piece.sign;
  return p;
}

}  // namespace lobe
