#pragma once
/// The parsed model: named wires, ports, loads and run settings, all in SI units.
#include <optional>
#include <string>
#include <vector>

#include "core/input_error.hpp"
#include "core/types.hpp"
#include "geometry/surface_shape.hpp"

namespace lobe {

/// Most segments one wire may have, given or automatic: far beyond any antenna this tool
/// can solve, and small enough that no model can make the mesher run out of memory.
constexpr int max_segments_per_wire = 100000;

enum class ShapeKind { line, polyline, arc, helix };

/// The path a wire follows before any transform, in metres.
struct WireShape {
  ShapeKind kind = ShapeKind::line;
  std::vector<Vec3> points;  ///< line: 2 points; polyline: its vertices
  Vec3 center = Vec3::Zero();  ///< arc centre or helix base
  Vec3 axis = Vec3::UnitZ();   ///< arc normal or helix axis (unit)
  Vec3 start = Vec3::Zero();   ///< arc start point
  Real angle = 0.0;            ///< arc sweep, rad (right-hand about `axis`)
  Real diameter = 0.0;         ///< helix
  Real pitch = 0.0;            ///< helix rise per turn
  Real turns = 0.0;            ///< helix
  bool right_handed = true;    ///< helix winding sense about `axis`
};

struct Wire {
  std::string name;
  SourceLocation where;
  WireShape shape;
  Real radius = 0.0;            ///< m
  int segments = 0;             ///< 0: chosen from the highest frequency
  Affine transform = Affine::Identity();
  Real conductivity = 0.0;      ///< S/m; 0 means perfectly conducting
};

/// A position along a wire, as a fraction of its length (0 = start, 1 = end).
struct WirePosition {
  std::string wire;
  SourceLocation wire_where;
  Real fraction = 0.5;
};

/// A straight line across a plate along which a port's voltage is impressed. Positive
/// current crosses it to the right of a walk from `from` to `to` with the plate's normal
/// pointing up: along (to − from) × normal.
struct PlateLine {
  std::string plate;
  SourceLocation plate_where;
  Vec3 from = Vec3::Zero();
  Vec3 to = Vec3::Zero();
};

/// A port on a wire (at `position`), across a line on a plate (`line`) or at a free point
/// of the feed network (`node`, e.g. a feed line's connector end).
struct Port {
  std::string name;
  SourceLocation where;
  WirePosition position;
  std::optional<PlateLine> line;
  std::string node;  ///< a free point of the feed network; empty on a wire or plate
  Complex voltage{1.0, 0.0};  ///< V, amplitude and phase
};

/// A lumped part's values: R, L and C in series, or in parallel.
struct LumpedValues {
  Real resistance = 0.0;                 ///< ohm
  Real inductance = 0.0;                 ///< H
  std::optional<Real> capacitance;       ///< F; none means no capacitor
  bool parallel = false;                 ///< parallel RLC instead of series
};

/// A lumped part in a wire, at a gap (across the gap, seen from a feed network there).
struct Load {
  std::string name;
  SourceLocation where;
  WirePosition position;
  LumpedValues values;
};

/// One end of a feed-network element: a gap on a wire (between two of its segments, the
/// wire's direction the positive sense of current, as for a port) or a free connection
/// point named in the model, where the network's own elements meet.
struct CircuitEnd {
  std::optional<WirePosition> wire;
  std::string node;  ///< when not on a wire
  SourceLocation where;
};

/// A line's attenuation, dB per metre: a √f (conductor loss, skin effect) + b f (dielectric
/// loss), from one or two points of a cable's data sheet.
struct LineLoss {
  Real conductor = 0.0;   ///< a, dB/m/√Hz
  Real dielectric = 0.0;  ///< b, dB/m/Hz
  Real db_per_metre(Real frequency_hz) const;
};

enum class NetworkKind {
  line,         ///< a transmission line between two ends
  stub,         ///< a line hung at one end, open or shorted at its far end
  transformer,  ///< an ideal transformer (a balun) between two ends
  lumped,       ///< R, L, C in series between two ends, or across one end
};

/// A part of the feed network. Everything joined at one end is in parallel across it.
struct NetworkElement {
  std::string name;
  SourceLocation where;
  NetworkKind kind = NetworkKind::line;
  std::vector<CircuitEnd> ends;  ///< from, to; a stub and a part across one end have one
  // Lines and stubs. The characteristic impedance is real (the low-loss approximation).
  Real impedance = 0.0;           ///< ohm
  Real length = 0.0;              ///< m
  Real velocity_factor = 1.0;
  LineLoss loss;
  bool crossed = false;           ///< a line's conductors swap between its ends
  bool shorted = false;           ///< a stub's far end
  /// Transformer: the impedance seen at `from` is the one at `to` divided by this.
  Real ratio = 1.0;
  LumpedValues part;  ///< lumped
};

/// An incident plane wave, arriving from direction (θ, φ), its electric field along θ̂ or
/// φ̂ there, `amplitude` V/m at the origin.
struct PlaneWave {
  SourceLocation where;
  Real theta = 0.0, phi = 0.0;  ///< rad
  bool theta_polarized = true;
  Real amplitude = 1.0;
};

/// An infinite dielectric slab on the perfect ground plane, from z = 0 up to z = thickness:
/// the usual model of a circuit board whose ground is several wavelengths across. Plates
/// on its top face are printed on it.
struct Substrate {
  SourceLocation where;
  std::string name;
  Real thickness = 0.0;     ///< m
  Real permittivity = 1.0;  ///< relative, real part
  Real loss_tangent = 0.0;
};

/// Real (lossy) ground below z = 0: soil or water of relative permittivity εr and
/// conductivity σ, so that εg = εr − jσ/(ωε0).
struct RealGround {
  SourceLocation where;
  Real permittivity = 1.0;   ///< relative
  Real conductivity = 0.0;   ///< S/m
  /// A stated ground system under the antenna (radials or rods), by its loss resistance:
  /// wires may then end on the ground, each joined to it through this resistance, and the
  /// near interaction is taken over the system as over a perfect conductor. Ohm.
  std::optional<Real> system_resistance;
};

struct Band {
  std::string name;
  Real low_hz = 0.0;
  Real high_hz = 0.0;
};

/// Directions at which the far field is reported; angles in radians.
struct PatternGrid {
  Real theta_start = 0.0, theta_stop = 0.0, theta_step = 0.0;
  Real phi_start = 0.0, phi_stop = 0.0, phi_step = 0.0;
  std::vector<Real> thetas() const;
  std::vector<Real> phis() const;
};

/// The value of a `let` after overrides, kept so that a result can be reproduced.
struct ResolvedValue {
  std::string name;
  Real value = 0.0;       ///< SI
  std::string unit;       ///< SI unit text of its dimension, "" when plain
  bool overridden = false;
};

struct Model {
  std::string file;
  std::string text;
  Real length_unit = 1.0;  ///< metres per bare length number
  std::string length_unit_name = "m";  ///< as written in `units`
  std::vector<Wire> wires;
  std::vector<SurfaceShape> surfaces;
  std::optional<PlaneWave> wave;
  std::vector<Port> ports;
  std::vector<Load> loads;
  std::vector<NetworkElement> network;  ///< lines, stubs, transformers and parts between ends
  bool ground_perfect = false;
  std::optional<RealGround> real_ground;  ///< instead of a perfect ground
  std::optional<Substrate> substrate;  ///< implies ground_perfect
  std::vector<Real> frequencies_hz;
  SourceLocation frequency_where;
  Real reference_ohm = 50.0;
  std::vector<Band> bands;
  PatternGrid pattern;
  std::vector<ResolvedValue> values;

  Real highest_frequency() const;
};

}  // namespace lobe
