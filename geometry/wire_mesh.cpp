#include "geometry/wire_mesh.hpp"

#include <algorithm>
#include <cmath>
#include <numeric>
#include <set>
#include <sstream>

#include "core/constants.hpp"
#include "core/number_text.hpp"
#include "geometry/spatial_grid.hpp"
#include "geometry/surface_contact.hpp"
#include "geometry/wire_path.hpp"

namespace lobe {
namespace {

/// Segments per wavelength at the highest frequency when the model does not say.
constexpr Real default_segments_per_wavelength = 20.0;
/// A curved wire gets at least one segment per this many radians of turning (15 deg).
constexpr Real max_turn_per_segment = pi / 12.0;
/// Below this ratio of segment length to radius the thin-wire kernel loses accuracy.
constexpr Real thin_wire_ratio = 8.0;
/// Below this ratio a segment is a disc, not a piece of wire: its current is no longer a
/// line on the axis, and the model is refused (thousands of such segments within one
/// radius also made joining the nodes quadratic).
constexpr Real disc_ratio = 0.1;
/// Above this fraction of a wavelength a segment cannot follow the current well.
constexpr Real longest_segment_wavelengths = 0.1;
constexpr std::size_t max_total_segments = 200000;

std::string format(Real v) {
  std::ostringstream s;
  s.precision(3);
  s << v;
  return s.str();
}

struct Positions {
  std::vector<Real> fractions;  ///< node fractions along the wire, 0 ... 1
};

/// `total` segments shared out over the pieces between `breaks` by length, at least one
/// per piece (total ≥ pieces), largest remainders first.
std::vector<int> share_by_length(const std::vector<Real>& breaks, int total) {
  const int pieces = static_cast<int>(breaks.size()) - 1;
  std::vector<int> counts(pieces, 1);
  const int left = total - pieces;
  std::vector<Real> remainder(pieces);
  int given = 0;
  for (int i = 0; i < pieces; ++i) {
    const Real exact = left * (breaks[i + 1] - breaks[i]);
    const int whole = static_cast<int>(std::floor(exact));
    counts[i] += whole;
    given += whole;
    remainder[i] = exact - whole;
  }
  std::vector<int> order(pieces);
  std::iota(order.begin(), order.end(), 0);
  std::stable_sort(order.begin(), order.end(), [&](int a, int b) { return remainder[a] > remainder[b]; });
  for (int i = 0; given < left; ++i, ++given) ++counts[order[i % pieces]];
  return counts;
}

/// Node fractions of one wire. Corners and required fractions (ports, loads, points where
/// another wire or a plate joins it) are breakpoints, so each of them is a node. With an
/// automatic count each piece between breakpoints gets about `target_length` per segment;
/// with `segments N` at least N segments are shared out over the pieces by length, adding
/// up to one per required point where that makes them more nearly equal.
std::vector<Real> node_fractions(const Wire& wire, const WirePath& path, std::vector<Real> required,
                                 Real target_length) {
  const std::vector<Real>& corners = path.corner_fractions();
  const int corner_pieces = static_cast<int>(corners.size()) - 1;
  if (wire.segments > 0 && wire.segments < corner_pieces)
    throw InputError(wire.where, "wire '" + wire.name + "' has " + std::to_string(corner_pieces) +
                                     " straight pieces but only " + std::to_string(wire.segments) +
                                     " segments; it needs at least one per piece");
  std::vector<Real> breaks = corners;
  breaks.insert(breaks.end(), required.begin(), required.end());
  std::sort(breaks.begin(), breaks.end());
  breaks.erase(std::unique(breaks.begin(), breaks.end(), [](Real a, Real b) { return b - a < 1e-9; }), breaks.end());
  breaks.back() = 1.0;
  const int pieces = static_cast<int>(breaks.size()) - 1;
  const Real length = path.length();
  std::vector<int> counts(pieces, 1);
  if (wire.segments == 0) {
    const Real min_curve_segments = std::ceil(path.turning_angle() / max_turn_per_segment - 1e-9);
    Real total = 0.0;
    for (int i = 0; i < pieces; ++i) {
      const Real share = breaks[i + 1] - breaks[i];
      const Real by_length = std::ceil(share * length / target_length - 1e-9);
      const Real by_turning = std::ceil(share * min_curve_segments - 1e-9);
      const Real count = std::max({1.0, by_length, by_turning});
      total += count;
      if (total > max_segments_per_wire)
        throw InputError(wire.where, "wire '" + wire.name + "' is " +
                                         format(length / (default_segments_per_wavelength * target_length)) +
                                         " wavelengths long at the highest frequency; it would need more than " +
                                         std::to_string(max_segments_per_wire) + " segments");
      counts[i] = static_cast<int>(count);
    }
  } else {
    // The count closest to N (never fewer) whose segments come out most nearly equal:
    // `segments 11` with a port at the middle gives 12 equal segments, not 5.5 + 5.5.
    const int fewest = std::max(wire.segments, pieces);
    Real best_spread = INFINITY;
    for (int total = fewest; total <= fewest + static_cast<int>(required.size()); ++total) {
      const std::vector<int> shared = share_by_length(breaks, total);
      Real longest = 0.0, shortest = INFINITY;
      for (int i = 0; i < pieces; ++i) {
        longest = std::max(longest, (breaks[i + 1] - breaks[i]) / shared[i]);
        shortest = std::min(shortest, (breaks[i + 1] - breaks[i]) / shared[i]);
      }
      if (longest / shortest < best_spread * (1 - 1e-9)) {
        best_spread = longest / shortest;
        counts = shared;
      }
    }
  }
  std::vector<Real> nodes;
  for (int i = 0; i < pieces; ++i)
    for (int k = 0; k < counts[i]; ++k) nodes.push_back(breaks[i] + (breaks[i + 1] - breaks[i]) * k / counts[i]);
  nodes.push_back(1.0);
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

/// Parameter in [0, 1] of the point of segment a→b nearest p.
Real nearest_parameter(const Vec3& p, const Vec3& a, const Vec3& b) {
  return std::clamp((p - a).dot(b - a) / (b - a).squaredNorm(), 0.0, 1.0);
}

std::string point_text(const Vec3& p, Real unit) {
  return "(" + format(p.x() / unit) + ", " + format(p.y() / unit) + ", " + format(p.z() / unit) + ")";
}

class Mesher {
 public:
  explicit Mesher(const Model& model) : m_model(model), m_contact(model.surfaces) {
    for (const Wire& w : model.wires) m_paths.emplace_back(w);
  }

  WireMesh run() {
    const Real wavelength = speed_of_light / m_model.highest_frequency();
    const Real target = wavelength / default_segments_per_wavelength;
    std::vector<std::vector<Real>> required(m_model.wires.size());
    for (std::size_t w = 0; w < m_model.wires.size(); ++w) {
      for (const auto& p : m_model.ports)
        if (!p.line && p.node.empty() && p.position.wire == m_model.wires[w].name)
          required[w].push_back(p.position.fraction);
      for (const auto& l : m_model.loads)
        if (l.position.wire == m_model.wires[w].name) required[w].push_back(l.position.fraction);
      for (const auto& e : m_model.network)
        for (const auto& end : e.ends)
          if (end.wire && end.wire->wire == m_model.wires[w].name) required[w].push_back(end.wire->fraction);
    }
    mesh_all(required, target);
    // Points where another wire's end or a plate meets a wire between its nodes become
    // nodes too; then the wires are meshed again with them as breakpoints.
    if (add_joining_points(required)) mesh_all(required, target);
    check_surfaces();
    join_nodes();
    check_ground();
    count_junctions();
    m_mesh.port_gaps.reserve(m_model.ports.size());
    for (const auto& p : m_model.ports)
      if (!p.line && p.node.empty()) m_mesh.port_gaps.push_back(gap(p.position, p.where, "port " + p.name));
    for (const auto& l : m_model.loads) m_mesh.load_gaps.push_back(gap(l.position, l.where, "load " + l.name));
    for (const auto& e : m_model.network)
      for (const auto& end : e.ends)
        if (end.wire) m_mesh.network_gaps.push_back(gap(*end.wire, end.where, "'" + e.name + "'"));
    check_segments(wavelength);
    check_crossings();
    return std::move(m_mesh);
  }

 private:
  void mesh_all(const std::vector<std::vector<Real>>& required, Real target) {
    m_mesh.segments.clear();
    m_first_segment.clear();
    m_wire_fractions.clear();
    for (std::size_t w = 0; w < m_model.wires.size(); ++w) mesh_wire(static_cast<int>(w), required[w], target);
  }

  void mesh_wire(int index, const std::vector<Real>& required, Real target) {
    const Wire& wire = m_model.wires[index];
    const WirePath& path = m_paths[index];
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
      if (s.length() < disc_ratio * wire.radius)
        throw InputError(wire.where, "wire '" + wire.name + "': a segment would be only " +
                                         format(s.length() / wire.radius) +
                                         " radii long, a disc rather than a piece of thin wire; use a thinner wire, "
                                         "fewer segments or a lower frequency");
      m_mesh.segments.push_back(s);
    }
  }

  int wire_end_segment(int wire, int end) const {
    return end == 0 ? m_first_segment[wire] : m_first_segment[wire] + static_cast<int>(m_wire_fractions[wire].size()) - 2;
  }

  /// The fraction of wire `w` between its nodes k and k + 1 nearest p (golden-section search
  /// on the path, so a curved wire's node lands on the curve, not on the chord).
  Real nearest_fraction(int w, int k, const Vec3& p) const {
    Real lo = m_wire_fractions[w][k], hi = m_wire_fractions[w][k + 1];
    const Real ratio = 0.5 * (std::sqrt(5.0) - 1.0);
    for (int i = 0; i < 80 && hi - lo > 1e-15; ++i) {
      const Real a = hi - ratio * (hi - lo), b = lo + ratio * (hi - lo);
      if ((m_paths[w].point(a) - p).norm() < (m_paths[w].point(b) - p).norm()) hi = b;
      else lo = a;
    }
    return 0.5 * (lo + hi);
  }

  /// Adds to `required` (per wire) the fraction where a wire end lies on another wire
  /// between its nodes, and where a wire passes through a plate between its nodes. Returns
  /// true when it added any.
  bool add_joining_points(std::vector<std::vector<Real>>& required) {
    const auto& segs = m_mesh.segments;
    Real reach = 0.0;
    for (const auto& s : segs) reach = std::max(reach, 0.5 * s.length() + s.radius);
    SpatialGrid grid(reach);
    for (std::size_t i = 0; i < segs.size(); ++i) grid.insert(segs[i].midpoint(), static_cast<int>(i));
    bool added = false;
    auto add = [&](int w, Real fraction) {
      for (Real r : required[w])
        if (std::abs(r - fraction) < 1e-9) return;
      required[w].push_back(fraction);
      added = true;
    };
    for (std::size_t w = 0; w < m_model.wires.size(); ++w)
      for (int end = 0; end < 2; ++end) {
        const Segment& own = segs[wire_end_segment(static_cast<int>(w), end)];
        const Vec3 p = end == 0 ? own.start : own.end;
        grid.for_near(p, [&](int i) {
          const Segment& s = segs[i];
          const Real tolerance = std::min(own.radius, s.radius);
          const Real t = nearest_parameter(p, s.start, s.end);
          if ((s.start + t * (s.end - s.start) - p).norm() >= tolerance) return;
          // Within a radius of either end it meets a node, which join_nodes handles.
          if (t * s.length() < tolerance || (1 - t) * s.length() < tolerance) return;
          const int k = i - m_first_segment[s.wire];
          add(s.wire, nearest_fraction(s.wire, k, p));
        });
      }
    for (std::size_t i = 0; i < segs.size(); ++i)
      for (std::size_t plate = 0; plate < m_contact.size(); ++plate)
        if (m_contact.is_plate(plate)) {
          const Real fraction = plate_crossing(static_cast<int>(i), plate);
          if (fraction >= 0.0) add(segs[i].wire, fraction);
        }
    return added;
  }

  /// The fraction where segment i passes through the plate between its ends, or −1 when
  /// it does not. Refuses a wire that passes through the plate at its edge, where it
  /// could be neither joined nor left unjoined with confidence.
  Real plate_crossing(int i, std::size_t plate) const {
    const Segment& s = m_mesh.segments[i];
    const Real tolerance = touch_tolerance(s.length());
    const Real ha = m_contact.height(plate, s.start), hb = m_contact.height(plate, s.end);
    if (!((ha > tolerance && hb < -tolerance) || (ha < -tolerance && hb > tolerance))) return -1.0;
    const int w = s.wire, k = i - m_first_segment[w];
    // Bisection on the path's height above the plane: exact on the curve.
    Real lo = m_wire_fractions[w][k], hi = m_wire_fractions[w][k + 1];
    for (int step = 0; step < 80 && hi - lo > 1e-15; ++step) {
      const Real mid = 0.5 * (lo + hi);
      if ((m_contact.height(plate, m_paths[w].point(mid)) > 0) == (ha > 0)) lo = mid;
      else hi = mid;
    }
    const Real fraction = 0.5 * (lo + hi);
    const Vec3 at = m_paths[w].point(fraction);
    Real edge = 0.0;
    const bool on = m_contact.foot_on_plate(plate, at, &edge);
    if (edge <= s.radius) {
      const Wire& wire = m_model.wires[w];
      throw InputError(wire.where, "wire '" + wire.name + "' passes through the edge of '" +
                                       m_model.surfaces[plate].name + "' at " + point_text(at, m_model.length_unit) +
                                       "; pass it through the plate at least a wire radius inside its edges and holes, "
                                       "or clear of it");
    }
    return on ? fraction : -1.0;
  }

  /// Refuses wires that lie along a plate or enter a closed body: the thin-wire model has
  /// no meaning there.
  void check_surfaces() {
    for (const Segment& s : m_mesh.segments) {
      const Wire& wire = m_model.wires[s.wire];
      const Real tolerance = touch_tolerance(s.length());
      for (std::size_t k = 0; k < m_contact.size(); ++k) {
        const std::string& name = m_model.surfaces[k].name;
        if (m_contact.is_plate(k)) {
          if (std::abs(m_contact.height(k, s.start)) <= tolerance && std::abs(m_contact.height(k, s.end)) <= tolerance &&
              m_contact.foot_on_plate(k, s.midpoint(), nullptr))
            throw InputError(wire.where, "wire '" + wire.name + "' lies on plate '" + name +
                                             "'; a wire may end on a plate or pass through it, not run along it");
          continue;
        }
        for (const Vec3& p : {s.start, s.midpoint(), s.end})
          if (m_contact.inside_body(k, p, tolerance))
            throw InputError(wire.where, "wire '" + wire.name + "' goes inside '" + name + "' at " +
                                             point_text(p, m_model.length_unit) +
                                             "; a wire may end on a body's surface but not enter it");
      }
    }
  }

  /// Segment ends closer than the smaller of their radii are one node; consecutive segments
  /// of a wire always share theirs. Every node counts, a polyline's corners and a wire's
  /// inner nodes included, but two inner nodes of one wire never join (a helix whose turns
  /// touch overlaps itself; check_crossings refuses it).
  void join_nodes() {
    const auto count = m_mesh.segments.size();
    Joiner joiner(2 * count);
    std::vector<int> wire_end(2 * count, 0);  // 1 where the end is a wire's start or end
    Real largest_radius = 0.0;
    for (std::size_t w = 0; w < m_first_segment.size(); ++w) {
      const int first = wire_end_segment(static_cast<int>(w), 0), last = wire_end_segment(static_cast<int>(w), 1);
      for (int s = first; s < last; ++s) joiner.join(2 * s + 1, 2 * (s + 1));
      wire_end[2 * first] = wire_end[2 * last + 1] = 1;
    }
    auto end_point = [&](int e) { return e % 2 ? m_mesh.segments[e / 2].end : m_mesh.segments[e / 2].start; };
    for (const auto& s : m_mesh.segments) largest_radius = std::max(largest_radius, s.radius);
    SpatialGrid grid(largest_radius);
    for (std::size_t e = 0; e < 2 * count; ++e) grid.insert(end_point(static_cast<int>(e)), static_cast<int>(e));
    for (std::size_t e = 0; e < 2 * count; ++e) {
      const int a = static_cast<int>(e);
      grid.for_near(end_point(a), [&](int b) {
        if (b <= a) return;
        const Segment &sa = m_mesh.segments[a / 2], &sb = m_mesh.segments[b / 2];
        if (sa.wire == sb.wire && !wire_end[a] && !wire_end[b]) return;
        if ((end_point(a) - end_point(b)).norm() < std::min(sa.radius, sb.radius)) joiner.join(a, b);
      });
    }
    m_mesh.nodes.clear();
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
    const bool system = m_model.real_ground && m_model.real_ground->system_resistance;
    if (m_model.real_ground && !system) return check_real_ground();
    if (!m_model.ground_perfect && !system) return;
    for (auto& node : m_mesh.nodes) {
      const Real tolerance = touch_tolerance(m_mesh.segments[node.ends.front().segment].length());
      if (std::abs(node.position.z()) < tolerance) node.on_ground = true;
    }
    for (const auto& s : m_mesh.segments) {
      const Wire& wire = m_model.wires[s.wire];
      const Real tolerance = touch_tolerance(s.length());
      if (s.start.z() < -tolerance || s.end.z() < -tolerance)
        throw InputError(wire.where, "wire '" + wire.name + "' goes below the ground plane at z = 0");
      if (m_mesh.nodes[s.node[0]].on_ground && m_mesh.nodes[s.node[1]].on_ground)
        throw InputError(wire.where, "wire '" + wire.name + "' has a segment lying on the ground plane; "
                                     "a wire may end on the ground but not run along it");
    }
  }

  /// Over real ground without a stated ground system every wire stays above the soil: a
  /// wire into the soil needs one (its loss resistance), and lobe refuses it rather than
  /// invent that connection.
  void check_real_ground() {
    for (const auto& s : m_mesh.segments) {
      const Wire& wire = m_model.wires[s.wire];
      if (std::min(s.start.z(), s.end.z()) <= touch_tolerance(s.length()))
        throw InputError(wire.where, "wire '" + wire.name + "' touches or enters the real ground at z = 0; a wire "
                                     "connected to soil needs a stated ground system (radials or rods): give its loss "
                                     "resistance, 'ground real ... system R ohm', or raise the antenna above the "
                                     "ground (an elevated ground plane)");
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
      // A probe through a substrate carries a uniform current, with no charge along it to
      // misplace: its radius is held to under half the board's thickness instead.
      if (ratio < thin_wire_ratio && !warned_short[s.wire] && !m_model.substrate) {
        warned_short[s.wire] = true;
        warn(wire.where, "wire '" + wire.name + "': a segment is only " + beside_limit(ratio, thin_wire_ratio) +
                             " radii long; below " + format(thin_wire_ratio) +
                             " the thin-wire approximation degrades (use fewer segments or a thinner wire)");
      }
      if (s.length() > longest_segment_wavelengths * wavelength && !warned_long[s.wire]) {
        warned_long[s.wire] = true;
        warn(wire.where, "wire '" + wire.name + "': a segment is " + beside_limit(s.length() / wavelength, longest_segment_wavelengths) +
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
  /// overlap (an error, for two wires and for one wire whose turns or pieces lie on one
  /// another alike) or cross unjoined (a warning). Two segments of one wire count only when
  /// the wire between them is longer than π times their radii: nearer, they are the wire's
  /// own thickness at a short segment (check_segments warns of that), not a second touch.
  void check_crossings() {
    const auto& segs = m_mesh.segments;
    if (segs.empty()) return;
    std::vector<Real> along(segs.size(), 0.0);  // path length from the wire's start
    std::vector<Real> wire_length(m_model.wires.size(), 0.0);
    for (std::size_t i = 0; i < segs.size(); ++i) {
      along[i] = wire_length[segs[i].wire];
      wire_length[segs[i].wire] += segs[i].length();
    }
    auto closed = [&](int w) {
      return segs[wire_end_segment(w, 0)].node[0] == segs[wire_end_segment(w, 1)].node[1];
    };
    // Two segments leaving one node the same way lie on one another.
    for (const MeshNode& node : m_mesh.nodes)
      for (std::size_t i = 0; i < node.ends.size(); ++i)
        for (std::size_t j = i + 1; j < node.ends.size(); ++j) {
          const Segment &a = segs[node.ends[i].segment], &b = segs[node.ends[j].segment];
          const Vec3 da = node.ends[i].end ? -a.direction() : a.direction();
          const Vec3 db = node.ends[j].end ? -b.direction() : b.direction();
          if (da.dot(db) > 0.999) throw InputError(m_model.wires[b.wire].where, overlap_message(a.wire, b.wire));
        }
    std::set<std::pair<int, int>> warned;
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
        if (a.wire == b.wire) {
          Real between = along[j] - along[i] - a.length();
          if (closed(a.wire)) between = std::min(between, wire_length[a.wire] - along[j] - b.length() + along[i]);
          if (between <= pi * reach) continue;
        }
        const Wire& wa = m_model.wires[a.wire];
        const Wire& wb = m_model.wires[b.wire];
        if (std::abs(a.direction().dot(b.direction())) > 0.999)
          throw InputError(wb.where, overlap_message(a.wire, b.wire));
        if (!warned.insert({a.wire, b.wire}).second) continue;
        warn(wb.where, (a.wire == b.wire ? "wire '" + wa.name + "' touches itself"
                                         : "wires '" + wa.name + "' and '" + wb.name + "' cross") +
                           " without a junction; end one wire on the other to connect them");
      }
    }
  }

  std::string overlap_message(int a, int b) const {
    const std::string& first = m_model.wires[a].name;
    return (a == b ? "wire '" + first + "' overlaps itself (turns or pieces lie on one another)"
                   : "wires '" + first + "' and '" + m_model.wires[b].name + "' overlap") +
           "; move them apart or remove one";
  }

  void warn(const SourceLocation& where, const std::string& message) { m_mesh.warnings.push_back({where, message}); }

  const Model& m_model;
  SurfaceContact m_contact;
  std::vector<WirePath> m_paths;
  WireMesh m_mesh;
  std::vector<int> m_first_segment;
  std::vector<std::vector<Real>> m_wire_fractions;
};

}  // namespace

WireMesh mesh_wires(const Model& model) { return Mesher(model).run(); }

void require_current_at_gaps(const WireMesh& mesh, const std::vector<bool>& attached) {
  for (const auto* gaps : {&mesh.port_gaps, &mesh.load_gaps, &mesh.network_gaps})
    for (const Gap& g : *gaps) {
      const MeshNode& node = mesh.nodes[g.node];
      if (node.ends.size() == 1 && !node.on_ground && (attached.empty() || !attached[g.node]))
        throw InputError(g.where, g.what + " sits on a free end of a wire; no current flows there. Put it inside the "
                                           "wire, at a junction, on the ground or where the wire meets a plate");
    }
}

std::vector<Real> distances_along_wires(const WireMesh& mesh) {
  // A wire's segments are consecutive and run from its start (mesh_wires lays them so).
  std::vector<Real> distances;
  Real along = 0.0;
  for (std::size_t k = 0; k < mesh.segments.size(); ++k) {
    const Segment& s = mesh.segments[k];
    if (k == 0 || s.wire != mesh.segments[k - 1].wire) along = 0.0;
    distances.push_back(along + 0.5 * s.length());
    along += s.length();
  }
  return distances;
}

}  // namespace lobe
