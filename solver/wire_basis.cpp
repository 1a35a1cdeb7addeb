#include "solver/wire_basis.hpp"

namespace lobe {

WireBasis::WireBasis(const WireMesh& mesh, const std::vector<bool>& attached)
    : m_by_segment(mesh.segments.size()), m_into_surface(mesh.nodes.size()) {
  // Current into a node on a segment end is positive when that end is the segment's end.
  auto into_node = [](const SegmentEnd& e) { return e.end == 1 ? 1.0 : -1.0; };
  for (std::size_t n = 0; n < mesh.nodes.size(); ++n) {
    const MeshNode& node = mesh.nodes[n];
    if (!attached.empty() && attached[n]) {
      for (const auto& e : node.ends) {
        m_by_segment[e.segment].push_back({m_count, e.end, into_node(e)});
        m_into_surface[n].push_back(m_count++);
      }
      continue;
    }
    if (node.on_ground) {
      for (const auto& e : node.ends) {
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
