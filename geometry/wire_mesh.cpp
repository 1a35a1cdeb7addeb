#include "geometry/wire_mesh.hpp"

#include <algorithm>
#include <cmath>
#include <numeric>
#include <sstream>

#include "core/constants.hpp"
#include "geometry/wire_path.hpp"

namespace lobe {
namespace {

/// Segments per wavelength at the highest frequency when the model does not say.
constexpr Real default_segments_per_wavelength = 20.0;
/// A curved wire gets at least one segment per this many radians of turning (15 deg).
constexpr Real max_turn_per_segment = pi / 12.0;
/// Below this ratio of segment length to radius the thin-wire kernel loses accuracy.
constexpr Real thin_wire_ratio = 8.0;
/// Above this fraction of a wavelength a segment cannot follow the current well.
constexpr Real longest_segment_wavelengths = 0.1;
constexpr std::size_t max_total_segments = 200000;
/// Relative to a segment's length, how close to z = 0 an end must be to touch the ground.
constexpr Real ground_tolerance = 1e-6;

std::string format(Real v) {
  std::ostringstream s;
  s.precision(3);
  s << v;
  return s.str();
}

struct Positions {
  std::vector<Real> fractions;  ///< node fractions along the wire, 0 ... 1
};

/// Node fractions of one wire. Required fractions (ports, loads) become nodes: with an
/// automatic count they are breakpoints; with `segments N` the nearest node is used when
/// it is within a thousandth of a segment, otherwise the segment is split there.
std::vector<Real> node_fractions(const Wire& wire, const WirePath& path, std::vector<Real> required,
                                 Real target_length) {
  std::vector<Real> breaks = path.corner_fractions();
  const Real length = path.length();
  std::vector<Real> nodes;
  auto subdivide = [&](const std::vector<Real>& marks, const std::vector<int>& counts) {
    nodes.clear();
    for (std::size_t i = 0; i + 1 < marks.size(); ++i)
      for (int k = 0; k < counts[i]; ++k) nodes.push_back(marks[i] + (marks[i + 1] - marks[i]) * k / counts[i]);
    nodes.push_back(1.0);
  };
  const Real min_curve_segments = std::ceil(path.turning_angle() / max_turn_per_segment - 1e-9);
  if (wire.segments == 0) {
    breaks.insert(breaks.end(), required.begin(), required.end());
    std::sort(breaks.begin(), breaks.end());
    breaks.erase(std::unique(breaks.begin(), breaks.end(), [](Real a, Real b) { return b - a < 1e-9; }),
                 breaks.end());
    breaks.back() = 1.0;
    std::vector<int> counts;
    Real total = 0.0;
    for (std::size_t i = 0; i + 1 < breaks.size(); ++i) {
      const Real share = breaks[i + 1] - breaks[i];
      const Real by_length = std::ceil(share * length / target_length - 1e-9);
      const Real by_turning = std::ceil(share * min_curve_segments - 1e-9);
      const Real count = std::max({1.0, by_length, by_turning});
      total += count;
      if (total > max_segments_per_wire)
        throw InputError(wire.where, "wire '" + wire.name + "' is " + format(length / (default_segments_per_wavelength * target_length)) +
                                         " wavelengths long at the highest frequency; it would need more than " +
                                         std::to_string(max_segments_per_wire) + " segments");
      counts.push_back(static_cast<int>(count));
    }
    subdivide(breaks, counts);
    return nodes;
  }
  const int pieces = static_cast<int>(breaks.size()) - 1;
  if (wire.segments < pieces)
    throw InputError(wire.where, "wire '" + wire.name + "' has " + std::to_string(pieces) +
                                     " straight pieces but only " + std::to_string(wire.segments) +
                                     " segments; it needs at least one per piece");
  // Share the segments out by length, at least one per piece, largest remainders first.
  std::vector<int> counts(pieces, 1);
  std::vector<Real> remainder(pieces);
  int left = wire.segments - pieces;
  Real spare_total = 0;
  for (int i = 0; i < pieces; ++i) spare_total += breaks[i + 1] - breaks[i];
  int given = 0;
  for (int i = 0; i < pieces; ++i) {
    const Real exact = left * (breaks[i + 1] - breaks[i]) / spare_total;
    const int whole = static_cast<int>(std::floor(exact));
    counts[i] += whole;
    given += whole;
    remainder[i] = exact - whole;
  }
  std::vector<int> order(pieces);
  std::iota(order.begin(), order.end(), 0);
  std::stable_sort(order.begin(), order.end(), [&](int a, int b) { return remainder[a] > remainder[b]; });
  for (int i = 0; given < left; ++i, ++given) ++counts[order[i % pieces]];
  subdivide(breaks, counts);
  const Real snap = 1e-3 / wire.segments;
  for (Real r : required) {
    const auto nearest = std::min_element(nodes.begin(), nodes.end(),
                                          [r](Real a, Real b) { return std::abs(a - r) < std::abs(b - r); });
    if (std::abs(*nearest - r) <= snap) {
      *nearest = r;
    } else {
      nodes.insert(std::upper_bound(nodes.begin(), nodes.end(), r), r);
    }
  }
  return nodes;
}

/// Union-find over segment ends, to join ends that touch.
struct Joiner {
  std::vector<int> parent;
  explicit Joiner(std::size_t n) : parent(n) { std::iota(parent.begin(), parent.end(), 0); }
  int root(int i) {
    while (parent[i] != i) i = parent[i] = parent[parent[i]];
    return i;
  }
  void join(int a, int b) { parent[root(a)] = root(b); }
};

/// Closest distance between two segments, and the parameters where it is reached.
Real segment_distance(const Segment& a, const Segment& b) {
  const Vec3 d1 = a.end - a.start, d2 = b.end - b.start, r = a.start - b.start;
  const Real aa = d1.dot(d1), ee = d2.dot(d2), f = d2.dot(r), c = d1.dot(r), bb = d1.dot(d2);
  const Real denom = aa * ee - bb * bb;
  Real s = denom > 1e-14 * aa * ee ? std::clamp((bb * f - c * ee) / denom, 0.0, 1.0) : 0.0;
  Real t = (bb * s + f) / ee;
  if (t < 0.0) {
    t = 0.0;
    s = std::clamp(-c / aa, 0.0, 1.0);
  } else if (t > 1.0) {
    t = 1.0;
    s = std::clamp((bb - c) / aa, 0.0, 1.0);
  }
  return (a.start + s * d1 - (b.start + t * d2)).norm();
}

class Mesher {
 public:
  explicit Mesher(const Model& model) : m_model(model) {}

  WireMesh run() {
    const Real wavelength = speed_of_light / m_model.highest_frequency();
    const Real target = wavelength / default_segments_per_wavelength;
    for (std::size_t w = 0; w < m_model.wires.size(); ++w) mesh_wire(static_cast<int>(w), target);
    join_ends();
    check_ground();
    count_junctions();
    m_mesh.port_gaps.reserve(m_model.ports.size());
    for (const auto& p : m_model.ports)
      if (!p.line) m_mesh.port_gaps.push_back(gap(p.position, p.where, "port " + p.name));
    for (const auto& l : m_model.loads) m_mesh.load_gaps.push_back(gap(l.position, l.where, "load " + l.name));
    check_segments(wavelength);
    check_crossings();
    return std::move(m_mesh);
  }

 private:
  void mesh_wire(int index, Real target) {
    const Wire& wire = m_model.wires[index];
    const WirePath path(wire);
    std::vector<Real> required;
    for (const auto& p : m_model.ports)
      if (!p.line && p.position.wire == wire.name) required.push_back(p.position.fraction);
    for (const auto& l : m_model.loads)
      if (l.position.wire == wire.name) required.push_back(l.position.fraction);
    const std::vector<Real> fractions = node_fractions(wire, path, required, target);
    if (m_mesh.segments.size() + fractions.size() > max_total_segments)
      throw InputError(wire.where, "the model would need more than " + std::to_string(max_total_segments) +
                                       " segments; give fewer segments or a lower frequency");
    m_first_segment.push_back(static_cast<int>(m_mesh.segments.size()));
    m_wire_fractions.push_back(fractions);
    for (std::size_t k = 0; k + 1 < fractions.size(); ++k) {
      Segment s;
      s.start = path.point(fractions[k]);
      s.end = path.point(fractions[k + 1]);
      s.radius = wire.radius;
      s.conductivity = wire.conductivity;
      s.wire = index;
      if (!s.start.allFinite() || !s.end.allFinite() || !std::isfinite(s.length()))
        throw InputError(wire.where, "wire '" + wire.name + "' is too large: its coordinates overflow");
      if (s.length() <= 1e-6 * wire.radius)
        throw InputError(wire.where, "wire '" + wire.name + "' has a segment of zero length");
      m_mesh.segments.push_back(s);
    }
  }

  /// Ends closer than the smaller of their radii are one node; consecutive segments of a
  /// wire always share theirs.
  void join_ends() {
    const auto count = m_mesh.segments.size();
    Joiner joiner(2 * count);
    std::vector<int> free_ends;
    for (std::size_t w = 0; w < m_first_segment.size(); ++w) {
      const int first = m_first_segment[w];
      const int last = first + static_cast<int>(m_wire_fractions[w].size()) - 2;
      for (int s = first; s < last; ++s) joiner.join(2 * s + 1, 2 * (s + 1));
      free_ends.push_back(2 * first);
      free_ends.push_back(2 * last + 1);
    }
    auto end_point = [&](int e) { return e % 2 ? m_mesh.segments[e / 2].end : m_mesh.segments[e / 2].start; };
    for (std::size_t i = 0; i < free_ends.size(); ++i)
      for (std::size_t j = i + 1; j < free_ends.size(); ++j) {
        const int a = free_ends[i], b = free_ends[j];
        const Real tolerance = std::min(m_mesh.segments[a / 2].radius, m_mesh.segments[b / 2].radius);
        if ((end_point(a) - end_point(b)).norm() < tolerance) joiner.join(a, b);
      }
    std::vector<int> node_of_root(2 * count, -1);
    for (std::size_t e = 0; e < 2 * count; ++e) {
      const int root = joiner.root(static_cast<int>(e));
      if (node_of_root[root] < 0) {
        node_of_root[root] = static_cast<int>(m_mesh.nodes.size());
        m_mesh.nodes.push_back(MeshNode{end_point(static_cast<int>(e)), {}, false});
      }
      const int node = node_of_root[root];
      m_mesh.nodes[node].ends.push_back({static_cast<int>(e / 2), static_cast<int>(e % 2)});
      m_mesh.segments[e / 2].node[e % 2] = node;
    }
  }

  void check_ground() {
    if (!m_model.ground_perfect) return;
    // An end within a millionth of its segment's length of z = 0 touches the ground:
    // rounding in the user's arithmetic, not a gap.
    for (auto& node : m_mesh.nodes) {
      const Real tolerance = ground_tolerance * m_mesh.segments[node.ends.front().segment].length();
      if (std::abs(node.position.z()) < tolerance) node.on_ground = true;
    }
    for (const auto& s : m_mesh.segments) {
      const Wire& wire = m_model.wires[s.wire];
      const Real tolerance = ground_tolerance * s.length();
      if (s.start.z() < -tolerance || s.end.z() < -tolerance)
        throw InputError(wire.where, "wire '" + wire.name + "' goes below the ground plane at z = 0");
      if (m_mesh.nodes[s.node[0]].on_ground && m_mesh.nodes[s.node[1]].on_ground)
        throw InputError(wire.where, "wire '" + wire.name + "' has a segment lying on the ground plane; "
                                     "a wire may end on the ground but not run along it");
    }
  }

  void count_junctions() {
    for (const auto& node : m_mesh.nodes)
      if (node.on_ground || node.ends.size() >= 3) ++m_mesh.junction_count;
  }

  Gap gap(const WirePosition& position, const SourceLocation& where, const std::string& what) {
    int w = 0;
    while (m_model.wires[w].name != position.wire) ++w;
    const auto& fractions = m_wire_fractions[w];
    const auto nearest = std::min_element(fractions.begin(), fractions.end(), [&](Real a, Real b) {
      return std::abs(a - position.fraction) < std::abs(b - position.fraction);
    });
    const int k = static_cast<int>(nearest - fractions.begin());
    const int last = static_cast<int>(fractions.size()) - 1;
    Gap g;
    g.at = k == last ? SegmentEnd{m_first_segment[w] + last - 1, 1} : SegmentEnd{m_first_segment[w] + k, 0};
    g.node = m_mesh.segments[g.at.segment].node[g.at.end];
    g.where = where;
    g.what = what;
    return g;
  }

  void check_segments(Real wavelength) {
    std::vector<bool> warned_short(m_model.wires.size()), warned_long(m_model.wires.size());
    for (const auto& s : m_mesh.segments) {
      const Wire& wire = m_model.wires[s.wire];
      const Real ratio = s.length() / s.radius;
      if (ratio < thin_wire_ratio && !warned_short[s.wire]) {
        warned_short[s.wire] = true;
        warn(wire.where, "wire '" + wire.name + "': a segment is only " + format(ratio) +
                             " radii long; below " + format(thin_wire_ratio) +
                             " the thin-wire approximation degrades (use fewer segments or a thinner wire)");
      }
      if (s.length() > longest_segment_wavelengths * wavelength && !warned_long[s.wire]) {
        warned_long[s.wire] = true;
        warn(wire.where, "wire '" + wire.name + "': a segment is " + format(s.length() / wavelength) +
                             " wavelengths long at the highest frequency; keep segments under " +
                             format(longest_segment_wavelengths));
      }
    }
    for (const auto& wire : m_model.wires)
      if (2 * pi * wire.radius / wavelength > 0.1)
        warn(wire.where, "wire '" + wire.name + "' is thick for its wavelength (circumference " +
                             format(2 * pi * wire.radius / wavelength) + " wavelengths); thin-wire results are rough");
  }

  /// Segments that come within their radii of each other without sharing a node either
  /// overlap (an error) or cross unjoined (a warning).
  void check_crossings() {
    const auto& segs = m_mesh.segments;
    if (segs.empty()) return;
    std::vector<std::pair<int, int>> reported;
    // Sweep along the axis on which the structure is longest: only segments whose extents
    // on it come within reach are compared, so a long straight wire costs O(S log S).
    Vec3 lowest = segs.front().start, highest = segs.front().start;
    for (const auto& s : segs) {
      lowest = lowest.cwiseMin(s.start).cwiseMin(s.end);
      highest = highest.cwiseMax(s.start).cwiseMax(s.end);
    }
    Eigen::Index axis = 0;
    (highest - lowest).maxCoeff(&axis);
    std::vector<int> order(segs.size());
    std::iota(order.begin(), order.end(), 0);
    auto low = [&](int i) { return std::min(segs[i].start[axis], segs[i].end[axis]) - segs[i].radius; };
    auto high = [&](int i) { return std::max(segs[i].start[axis], segs[i].end[axis]) + segs[i].radius; };
    std::sort(order.begin(), order.end(), [&](int a, int b) { return low(a) < low(b); });
    for (std::size_t oi = 0; oi < order.size(); ++oi) {
      for (std::size_t oj = oi + 1; oj < order.size() && low(order[oj]) <= high(order[oi]); ++oj) {
        const int i = std::min(order[oi], order[oj]), j = std::max(order[oi], order[oj]);
        const Segment &a = segs[i], &b = segs[j];
        if (a.node[0] == b.node[0] || a.node[0] == b.node[1] || a.node[1] == b.node[0] || a.node[1] == b.node[1])
          continue;
        const Real reach = a.radius + b.radius;
        const Real span = 0.5 * (a.length() + b.length()) + reach;
        if ((a.midpoint() - b.midpoint()).norm() > span) continue;
        if (segment_distance(a, b) >= reach) continue;
        const std::pair<int, int> wires{std::min(a.wire, b.wire), std::max(a.wire, b.wire)};
        if (std::find(reported.begin(), reported.end(), wires) != reported.end()) continue;
        reported.push_back(wires);
        const Wire& wa = m_model.wires[a.wire];
        const Wire& wb = m_model.wires[b.wire];
        const std::string names = a.wire == b.wire ? "wire '" + wa.name + "' touches itself"
                                                   : "wires '" + wa.name + "' and '" + wb.name + "'";
        if (std::abs(a.direction().dot(b.direction())) > 0.999)
          throw InputError(wb.where, names + (a.wire == b.wire ? " where it doubles back" : " overlap") +
                                         "; remove one or move it apart");
        warn(wb.where, names + (a.wire == b.wire ? "" : " cross") +
                           " without a junction; end one wire on the other's node to connect them");
      }
    }
  }

  void warn(const SourceLocation& where, const std::string& message) { m_mesh.warnings.push_back({where, message}); }

  const Model& m_model;
  WireMesh m_mesh;
  std::vector<int> m_first_segment;
  std::vector<std::vector<Real>> m_wire_fractions;
};

}  // namespace

WireMesh mesh_wires(const Model& model) { return Mesher(model).run(); }

void require_current_at_gaps(const WireMesh& mesh, const std::vector<bool>& attached) {
  for (const auto* gaps : {&mesh.port_gaps, &mesh.load_gaps})
    for (const Gap& g : *gaps) {
      const MeshNode& node = mesh.nodes[g.node];
      if (node.ends.size() == 1 && !node.on_ground && (attached.empty() || !attached[g.node]))
        throw InputError(g.where, g.what + " sits on a free end of a wire; no current flows there. Put it inside the "
                                           "wire, at a junction, on the ground or where the wire meets a plate");
    }
}

}  // namespace lobe
