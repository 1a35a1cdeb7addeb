#include "geometry/model_parser.hpp"

#include "core/number_text.hpp"

#include <algorithm>
#include <cctype>
#include <cmath>
#include <map>
#include <set>
#include <sstream>
#include <unordered_map>

#include "core/constants.hpp"
#include "geometry/expression.hpp"

namespace lobe {
namespace {

constexpr int max_frequency_count = 10000;
constexpr long max_pattern_points = 1000000;
/// Far-field rows over all frequencies: beyond this the CSV alone passes several GB.
constexpr double max_pattern_rows = 5e7;

const std::set<std::string, std::less<>> statement_words = {
    "units", "let", "wire", "arc", "helix", "copy", "shift", "turn", "mirror", "port", "cut",
    "load", "line", "stub", "transformer", "conductor", "ground", "frequency", "reference", "band", "pattern", "plate", "sphere", "box", "mesh", "wave"};

std::string quoted(const Token& t) {
  return t.kind == TokenKind::end ? std::string("the end of the line") : "'" + t.text + "'";
}

std::string si_unit_text(const Dimension& d) {
  if (d.is_none()) return "";
  if (d == dimension::length) return "m";
  if (d == dimension::frequency) return "Hz";
  if (d == dimension::angle) return "rad";
  if (d == dimension::voltage) return "V";
  if (d == dimension::resistance) return "ohm";
  if (d == dimension::inductance) return "H";
  if (d == dimension::capacitance) return "F";
  if (d == dimension::conductivity) return "S/m";
  return unit_symbols(d);
}

/// Bounds on every length in a model, m (see ModelParser::length and positive_length).
constexpr Real largest_length = 1e5;
constexpr Real smallest_length = 1e-7;
/// The thinnest substrate, m (thin flexible laminates are 25 um and more).
constexpr Real thinnest_board = 10e-6;

/// Where a named object sits: in Model::wires or Model::surfaces, at `index`.
struct ObjectIndex {
  bool wire = true;
  std::size_t index = 0;
};

class ModelParser {
 public:
  ModelParser(const std::string& file, const std::vector<Override>& overrides) : m_file(file) {
    for (const auto& o : overrides) {
      const auto [earlier, fresh] = m_overrides.emplace(o.name, o);
      if (!fresh)
        throw InputError(o.where, "'" + o.name + "' is given twice (also by " + earlier->second.where.file + " " +
                                      std::to_string(earlier->second.where.line) + "); give each name once");
    }
    m_model.file = file;
    m_model.pattern = {0.0, pi, 5.0 * pi / 180.0, 0.0, 355.0 * pi / 180.0, 5.0 * pi / 180.0};
  }

  Model parse(const std::string& text) {
    m_model.text = text;
    if (text.size() > max_model_bytes)
      throw InputError({m_file, 1, 1}, "the model file is larger than 64 MiB; it cannot be a model");
    int line_number = 0;
    // A UTF-8 byte-order mark, as some Windows editors write, is not part of the model.
    std::size_t start = text.rfind("\xEF\xBB\xBF", 0) == 0 ? 3 : 0;
    bool any_statement = false;
    while (start <= text.size()) {
      // Lines end in LF, CR LF or a lone CR (old Mac editors).
      std::size_t end = text.find_first_of("\r\n", start);
      if (end == std::string::npos) end = text.size();
      ++line_number;
      const auto tokens = tokenize_line(std::string_view(text).substr(start, end - start), m_file, line_number);
      if (tokens.size() > 1) {
        TokenCursor cursor(tokens);
        statement(cursor);
        any_statement = true;
      }
      m_last_line = line_number;
      if (end == text.size()) break;
      start = end + (text.compare(end, 2, "\r\n") == 0 ? 2 : 1);
    }
    if (!any_statement) throw InputError({m_file, 1, 1}, "the model is empty: it has no statements");
    finish();
    return std::move(m_model);
  }

 private:
  // ---- statements -------------------------------------------------------------------
  void statement(TokenCursor& c) {
    const Token keyword = c.next();
    if (keyword.kind != TokenKind::identifier)
      throw InputError(keyword.where, "expected a statement keyword, found " + quoted(keyword));
    const std::string& k = keyword.text;
    if (k == "units") units(c);
    else if (k == "let") let(c);
    else if (k == "wire") wire(c, keyword);
    else if (k == "arc") arc(c, keyword);
    else if (k == "helix") helix(c, keyword);
    else if (k == "copy") copy(c);
    else if (k == "shift") shift(c);
    else if (k == "turn") turn(c);
    else if (k == "mirror") mirror(c);
    else if (k == "port") port(c, keyword);
    else if (k == "load") load(c, keyword);
    else if (k == "line") line(c, keyword);
    else if (k == "stub") stub(c, keyword);
    else if (k == "transformer") transformer(c, keyword);
    else if (k == "conductor") conductor(c);
    else if (k == "ground") ground(c, keyword);
    else if (k == "substrate") substrate(c, keyword);
    else if (k == "frequency") frequency(c, keyword);
    else if (k == "reference") reference(c);
    else if (k == "band") band(c);
    else if (k == "pattern") pattern(c);
    else if (k == "plate") plate(c, keyword);
    else if (k == "sphere") sphere(c, keyword);
    else if (k == "box") box(c, keyword);
    else if (k == "mesh") mesh(c);
    else if (k == "cut") cut(c, keyword);
    else if (k == "wave") wave(c, keyword);
    else
      throw InputError(keyword.where, "unknown statement '" + k + "'; statements are: units let wire arc helix plate "
                                      "cut sphere box copy shift turn mirror mesh port load line stub transformer conductor ground "
                                      "substrate wave "
                                      "frequency reference band pattern");
    end_of_statement(c);
  }

  void end_of_statement(TokenCursor& c) {
    if (!c.at_end()) throw InputError(c.peek().where, "unexpected " + quoted(c.peek()) + " after the statement");
  }

  void units(TokenCursor& c) {
    const Token& u = c.expect_name("a length unit (m cm mm um in mil)");
    static const std::map<std::string, Real, std::less<>> scale = {
        {"m", 1.0}, {"cm", 1e-2}, {"mm", 1e-3}, {"um", 1e-6}, {"in", 0.0254}, {"mil", 25.4e-6}};
    auto it = scale.find(u.text);
    if (it == scale.end()) throw InputError(u.where, "unknown length unit '" + u.text + "'; use m cm mm um in mil");
    m_model.length_unit = it->second;
    m_model.length_unit_name = it->first;
  }

  void let(TokenCursor& c) {
    const Token& name = c.expect_name("a name after 'let'");
    if (is_builtin_name(name.text) || statement_words.count(name.text))
      throw InputError(name.where, "'" + name.text + "' is a built-in word and cannot be redefined");
    if (m_symbols.count(name.text)) throw InputError(name.where, "'" + name.text + "' is already defined");
    c.expect_symbol('=', "after the name");
    Quantity value = parse_expression(c, m_symbols);
    ResolvedValue resolved{name.text, value.value, si_unit_text(value.dim), false};
    if (auto it = m_overrides.find(name.text); it != m_overrides.end()) {
      Quantity replaced = evaluate_override(it->second);
      if (replaced.dim.is_none() && !value.dim.is_none()) replaced = plain_as(replaced.value, value.dim, it->second);
      if (replaced.dim != value.dim)
        throw InputError(it->second.where, it->second.where.file + " " + name.text + " gives " + dimension_name(replaced.dim) +
                                               " but the model defines it as " + dimension_name(value.dim));
      value = replaced;
      resolved = {name.text, value.value, si_unit_text(value.dim), true};
      m_used_overrides.insert(name.text);
    }
    m_symbols[name.text] = value;
    m_model.values.push_back(resolved);
  }

  /// A plain number given for a value that has a unit is read as the model reads bare
  /// numbers: lengths in `units`, angles in degrees, other quantities in SI; a frequency
  /// must say its unit.
  Quantity plain_as(Real number, const Dimension& dim, const Override& o) {
    if (dim == dimension::frequency)
      throw InputError(o.where, o.where.file + " " + o.name + " needs a unit (Hz, kHz, MHz or GHz)");
    const Real scale = dim == dimension::length ? m_model.length_unit : dim == dimension::angle ? pi / 180.0 : 1.0;
    return {number * scale, dim};
  }

  Quantity evaluate_override(const Override& o) {
    const auto tokens = tokenize_line(o.expression, o.where.file, o.where.line);
    TokenCursor c(tokens);
    const Quantity q = parse_expression(c, m_symbols);
    if (!c.at_end()) throw InputError(c.peek().where, "unexpected " + quoted(c.peek()) + " in the " + o.where.file + " value");
    return q;
  }

  void wire(TokenCursor& c, const Token& keyword) {
    Wire w = new_wire(c, keyword);
    if (c.accept_word("from")) {
      w.shape.kind = ShapeKind::line;
      w.shape.points.push_back(point(c));
      c.expect_word("to", "after the start point");
      w.shape.points.push_back(point(c));
    } else if (c.accept_word("through")) {
      w.shape.kind = ShapeKind::polyline;
      while (c.peek_symbol('(')) w.shape.points.push_back(point(c));
      if (w.shape.points.size() < 2) throw InputError(c.peek().where, "'through' needs at least two points");
    } else {
      throw InputError(c.peek().where, "expected 'from' or 'through' after the wire name, found " + quoted(c.peek()));
    }
    for (std::size_t i = 1; i < w.shape.points.size(); ++i)
      if ((w.shape.points[i] - w.shape.points[i - 1]).norm() == 0.0)
        throw InputError(w.where, "wire '" + w.name + "' has a piece of zero length (point " +
                                      std::to_string(i + 1) + " repeats point " + std::to_string(i) + ")");
    wire_options(c, w);
    add_wire(std::move(w));
  }

  void arc(TokenCursor& c, const Token& keyword) {
    Wire w = new_wire(c, keyword);
    w.shape.kind = ShapeKind::arc;
    c.expect_word("center", "after the arc name");
    w.shape.center = point(c);
    c.expect_word("normal", "after the centre");
    w.shape.axis = direction(c);
    c.expect_word("from", "after the normal");
    const Token& start_token = c.peek();
    w.shape.start = point(c);
    c.expect_word("angle", "after the start point");
    w.shape.angle = angle(c);
    const Vec3 offset = w.shape.start - w.shape.center;
    const Vec3 in_plane = offset - offset.dot(w.shape.axis) * w.shape.axis;
    if (in_plane.norm() == 0.0) throw InputError(start_token.where, "the arc's start point lies on its axis: its radius is zero");
    if (w.shape.angle == 0.0 || std::abs(w.shape.angle) > 2 * pi + 1e-12)
      throw InputError(w.where, "an arc's angle must be non-zero and at most 360 deg");
    wire_options(c, w);
    add_wire(std::move(w));
  }

  void helix(TokenCursor& c, const Token& keyword) {
    Wire w = new_wire(c, keyword);
    w.shape.kind = ShapeKind::helix;
    c.expect_word("base", "after the helix name");
    w.shape.center = point(c);
    c.expect_word("axis", "after the base point");
    w.shape.axis = direction(c);
    c.expect_word("diameter", "after the axis");
    w.shape.diameter = positive_length(c, "a helix diameter");
    c.expect_word("pitch", "after the diameter");
    w.shape.pitch = positive_length(c, "a helix pitch");
    c.expect_word("turns", "after the pitch");
    const Token& turns_token = c.peek();
    const Quantity turns = plain(c, "the number of turns");
    if (!(turns.value > 0.0) || turns.value > 10000)
      throw InputError(turns_token.where, "turns must be above 0 and at most 10000");
    w.shape.turns = turns.value;
    if (c.accept_word("hand")) {
      const Token& hand = c.expect_name("'right' or 'left'");
      if (hand.text == "right") w.shape.right_handed = true;
      else if (hand.text == "left") w.shape.right_handed = false;
      else throw InputError(hand.where, "hand is 'right' or 'left', not '" + hand.text + "'");
    }
    wire_options(c, w);
    add_wire(std::move(w));
  }

  Wire new_wire(TokenCursor& c, const Token& keyword) {
    const Token& name = c.expect_name("a name for the " + keyword.text);
    if (object(name.text)) throw InputError(name.where, "'" + name.text + "' is already the name of an object");
    Wire w;
    w.name = name.text;
    w.where = keyword.where;
    return w;
  }

  /// `radius R` (required) and `segments N` (optional), in any order.
  void wire_options(TokenCursor& c, Wire& w) {
    bool have_radius = false;
    while (!c.at_end()) {
      const Token& option = c.peek();
      if (c.accept_word("radius") && !have_radius) {
        w.radius = positive_length(c, "a wire radius");
        have_radius = true;
      } else if (option.text == "segments" && c.accept_word("segments") && w.segments == 0) {
        const Token& n_token = c.peek();
        const Quantity n = plain(c, "a segment count");
        if (n.value != std::round(n.value) || n.value < 1 || n.value > max_segments_per_wire)
          throw InputError(n_token.where, "segments must be a whole number from 1 to " +
                                              std::to_string(max_segments_per_wire));
        w.segments = static_cast<int>(n.value);
      } else {
        throw InputError(option.where, "unexpected " + quoted(option) + "; a wire takes 'radius R' once and "
                                       "optionally 'segments N' once");
      }
    }
    if (!have_radius) throw InputError(c.peek().where, "wire '" + w.name + "' needs 'radius R'");
  }

  void add_wire(Wire w) {
    if (w.conductivity == 0.0) w.conductivity = m_conductivity_for_all;
    m_objects.emplace(w.name, ObjectIndex{true, m_model.wires.size()});
    m_model.wires.push_back(std::move(w));
  }

  void add_surface(SurfaceShape s) {
    m_objects.emplace(s.name, ObjectIndex{false, m_model.surfaces.size()});
    m_model.surfaces.push_back(std::move(s));
  }

  /// Names are looked up in a hash map: a model of 80,000 wires once took 43 s to parse
  /// when every new name was compared with every old one.
  const ObjectIndex* object(const std::string& name) const {
    const auto found = m_objects.find(name);
    return found == m_objects.end() ? nullptr : &found->second;
  }

  Wire& existing_wire(const Token& name) {
    const ObjectIndex* o = object(name.text);
    if (!o || !o->wire) throw InputError(name.where, "there is no wire named '" + name.text + "'");
    return m_model.wires[o->index];
  }

  SurfaceShape* find_surface(const std::string& name) {
    const ObjectIndex* o = object(name);
    return o && !o->wire ? &m_model.surfaces[o->index] : nullptr;
  }

  /// The transform of a named wire or surface.
  Affine& object_transform(const Token& name) {
    const ObjectIndex* o = object(name.text);
    if (!o) throw InputError(name.where, "there is no wire, plate or body named '" + name.text + "'");
    return o->wire ? m_model.wires[o->index].transform : m_model.surfaces[o->index].transform;
  }

  void copy(TokenCursor& c) {
    const Token& source = c.expect_name("the name of the object to copy");
    object_transform(source);  // it must exist
    c.expect_word("as", "after the copied name");
    const Token& new_name = c.expect_name("the name of the copy");
    if (object(new_name.text))
      throw InputError(new_name.where, "'" + new_name.text + "' is already the name of an object");
    Affine transform = object_transform(source);
    while (!c.at_end()) {
      if (c.accept_word("shift")) transform = Eigen::Translation3d(point(c)) * transform;
      else if (c.accept_word("turn")) transform = rotation(c) * transform;
      else throw InputError(c.peek().where, "unexpected " + quoted(c.peek()) + "; copy takes 'shift V' and 'turn about AXIS by A'");
    }
    const ObjectIndex o = *object(source.text);
    if (o.wire) {
      Wire w = m_model.wires[o.index];
      w.name = new_name.text;
      w.where = source.where;
      w.transform = transform;
      add_wire(std::move(w));
    } else {
      SurfaceShape s = m_model.surfaces[o.index];
      s.name = new_name.text;
      s.where = source.where;
      s.transform = transform;
      add_surface(std::move(s));
    }
  }

  void shift(TokenCursor& c) {
    Affine& transform = object_transform(c.expect_name("the name of the object to shift"));
    c.expect_word("by", "after the name");
    transform = Eigen::Translation3d(point(c)) * transform;
  }

  void turn(TokenCursor& c) {
    Affine& transform = object_transform(c.expect_name("the name of the object to turn"));
    transform = rotation(c) * transform;
  }

  /// `about x|y|z|V by A`: a rotation about an axis through the origin.
  Affine rotation(TokenCursor& c) {
    c.expect_word("about", "to name the axis");
    Vec3 axis;
    if (c.accept_word("x")) axis = Vec3::UnitX();
    else if (c.accept_word("y")) axis = Vec3::UnitY();
    else if (c.accept_word("z")) axis = Vec3::UnitZ();
    else axis = direction(c);
    c.expect_word("by", "after the axis");
    const Real a = angle(c);
    return Affine(Eigen::AngleAxisd(a, axis));
  }

  void mirror(TokenCursor& c) {
    Affine& transform = object_transform(c.expect_name("the name of the object to mirror"));
    c.expect_word("across", "after the name");
    const Token& plane = c.expect_name("a plane: xy, yz or zx");
    Eigen::Matrix3d m = Eigen::Matrix3d::Identity();
    if (plane.text == "xy" || plane.text == "yx") m(2, 2) = -1;
    else if (plane.text == "yz" || plane.text == "zy") m(0, 0) = -1;
    else if (plane.text == "zx" || plane.text == "xz") m(1, 1) = -1;
    else throw InputError(plane.where, "mirror plane is xy, yz or zx, not '" + plane.text + "'");
    Affine reflection = Affine::Identity();
    reflection.linear() = m;
    transform = reflection * transform;
  }

  SurfaceShape new_surface(TokenCursor& c, const Token& keyword) {
    const Token& name = c.expect_name("a name for the " + keyword.text);
    if (object(name.text)) throw InputError(name.where, "'" + name.text + "' is already the name of an object");
    SurfaceShape s;
    s.name = name.text;
    s.where = keyword.where;
    return s;
  }

  void plate(TokenCursor& c, const Token& keyword) {
    SurfaceShape s = new_surface(c, keyword);
    outline(c, s, true);
    add_surface(std::move(s));
  }

  /// A rectangle, polygon or disc outline; a plate states its own normal, a cut takes its
  /// plate's (the one already in `s`).
  void outline(TokenCursor& c, SurfaceShape& s, bool own_normal) {
    const Token& kind = c.expect_name("'rectangle', 'polygon' or 'disc'");
    if (kind.text == "rectangle") {
      s.kind = SurfaceKind::rectangle;
      c.expect_word("corner", "after 'rectangle'");
      s.corner = point(c);
      c.expect_word("size", "after the corner");
      c.expect_symbol('(', "to start the size (width, length)");
      s.width = positive_length(c, "a width");
      c.expect_symbol(',', "between width and length");
      s.length = positive_length(c, "a length");
      c.expect_symbol(')', "to close the size");
      if (own_normal && c.accept_word("normal")) s.normal = direction(c);
    } else if (kind.text == "polygon") {
      s.kind = SurfaceKind::polygon;
      s.polygon.clear();
      while (c.peek_symbol('(')) s.polygon.push_back(point(c));
      // Closing the outline by repeating the first corner is a common way to write it.
      if (s.polygon.size() > 3 && s.polygon.back() == s.polygon.front()) s.polygon.pop_back();
      if (s.polygon.size() < 3) throw InputError(c.peek().where, "a polygon needs at least three corners");
    } else if (kind.text == "disc") {
      s.kind = SurfaceKind::disc;
      c.expect_word("center", "after 'disc'");
      s.corner = point(c);
      if (own_normal) {
        c.expect_word("normal", "after the centre");
        s.normal = direction(c);
      }
      c.expect_word("diameter", own_normal ? "after the normal" : "after the centre");
      s.diameter = positive_length(c, "a disc diameter");
    } else {
      throw InputError(kind.where, "an outline is a 'rectangle', 'polygon' or 'disc', not '" + kind.text + "'");
    }
  }

  void cut(TokenCursor& c, const Token& keyword) {
    const Token& name = c.expect_name("the name of the plate to cut");
    for (auto& plate : m_model.surfaces) {
      if (plate.name != name.text) continue;
      if (plate.kind == SurfaceKind::sphere || plate.kind == SurfaceKind::box)
        throw InputError(name.where, "'" + name.text + "' is a closed body; only plates can be cut");
      SurfaceShape hole;
      hole.name = "cut in " + plate.name;
      hole.where = keyword.where;
      hole.normal = plate.normal;
      outline(c, hole, false);
      plate.cuts.push_back(std::move(hole));
      return;
    }
    throw InputError(name.where, "there is no plate named '" + name.text + "'");
  }

  void sphere(TokenCursor& c, const Token& keyword) {
    SurfaceShape s = new_surface(c, keyword);
    s.kind = SurfaceKind::sphere;
    c.expect_word("center", "after the sphere's name");
    s.corner = point(c);
    c.expect_word("diameter", "after the centre");
    s.diameter = positive_length(c, "a sphere diameter");
    add_surface(std::move(s));
  }

  void box(TokenCursor& c, const Token& keyword) {
    SurfaceShape s = new_surface(c, keyword);
    s.kind = SurfaceKind::box;
    c.expect_word("corner", "after the box's name");
    s.corner = point(c);
    c.expect_word("size", "after the corner");
    const Token& at = c.peek();
    s.size = point(c);
    if (!(s.size.minCoeff() > 0.0)) throw InputError(at.where, "a box's sizes must all be above zero");
    add_surface(std::move(s));
  }

  void mesh(TokenCursor& c) {
    const Token& name = c.expect_name("the name of a plate or body");
    c.expect_word("size", "after the name");
    const Real size = positive_length(c, "a mesh size");
    SurfaceShape* s = find_surface(name.text);
    if (!s) throw InputError(name.where, "there is no plate or body named '" + name.text + "'");
    s->mesh_size = size;
  }

  void wave(TokenCursor& c, const Token& keyword) {
    if (m_model.wave) throw InputError(keyword.where, "the model already has a wave");
    PlaneWave w;
    w.where = keyword.where;
    c.expect_word("theta", "after 'wave'");
    const Token& theta_at = c.peek();
    w.theta = angle(c);
    if (w.theta < -1e-12 || w.theta > pi + 1e-12) throw InputError(theta_at.where, "theta must lie from 0 to 180 deg");
    c.expect_word("phi", "after theta");
    w.phi = angle(c);
    c.expect_word("polarization", "after phi");
    const Token& pol = c.expect_name("'theta' or 'phi'");
    if (pol.text == "theta") w.theta_polarized = true;
    else if (pol.text == "phi") w.theta_polarized = false;
    else throw InputError(pol.where, "polarization is 'theta' or 'phi', not '" + pol.text + "'");
    if (c.accept_word("amplitude")) {
      const Token& at = c.peek();
      w.amplitude = quantity_in(c, dimension::voltage / dimension::length, 1.0, "a field strength (V/m)").value;
      if (!(w.amplitude > 0.0)) throw InputError(at.where, "the wave's amplitude must be above zero");
    }
    m_model.wave = w;
  }

  WirePosition position(TokenCursor& c) {
    c.expect_word("on", "after the name");
    return position_on(c, c.expect_name("a wire name"));
  }

  /// The position on the wire just named: `at start|middle|end|FRACTION`.
  WirePosition position_on(TokenCursor& c, const Token& wire_name) {
    WirePosition p{wire_name.text, wire_name.where, 0.5};
    c.expect_word("at", "after the wire name");
    if (c.accept_word("start")) p.fraction = 0.0;
    else if (c.accept_word("middle")) p.fraction = 0.5;
    else if (c.accept_word("end")) p.fraction = 1.0;
    else {
      const Token& at = c.peek();
      const Quantity f = plain(c, "a position: start, middle, end or a fraction from 0 to 1");
      if (f.value < 0.0 || f.value > 1.0)
        throw InputError(at.where, "the position fraction must be from 0 to 1, got " + number_text(f.value));
      p.fraction = f.value;
    }
    return p;
  }

  void port(TokenCursor& c, const Token& keyword) {
    Port p;
    const Token& name = c.expect_name("a port name");
    for (const auto& other : m_model.ports)
      if (other.name == name.text) throw InputError(name.where, "a port named '" + name.text + "' already exists");
    p.name = name.text;
    p.where = keyword.where;
    if (c.peek_word("on") && c.peek_word("along", 2)) {
      c.expect_word("on", "after the name");
      const Token& plate = c.expect_name("a plate name");
      c.expect_word("along", "after the plate name");
      PlateLine line{plate.text, plate.where, point(c), Vec3::Zero()};
      c.expect_word("to", "after the line's first point");
      const Token& to = c.peek();
      line.to = point(c);
      if ((line.to - line.from).norm() == 0.0) throw InputError(to.where, "a port line needs two different points");
      p.line = line;
    } else if (c.accept_word("at")) {
      const Token& node = c.expect_name("the name of a free point of the feed network");
      p.node = node.text;
      m_node_uses.push_back({node.text, node.where, "port '" + p.name + "'"});
    } else {
      p.position = position(c);
    }
    Real amplitude = 1.0, phase = 0.0;
    std::set<std::string> seen;
    while (!c.at_end()) {
      const Token& option = c.next();
      if (!seen.insert(option.text).second) throw InputError(option.where, "'" + option.text + "' is given twice");
      if (option.text == "voltage") amplitude = quantity_in(c, dimension::voltage, 1.0, "a voltage").value;
      else if (option.text == "phase") phase = angle(c);
      else throw InputError(option.where, "unexpected " + quoted(option) + "; a port takes 'voltage V' and 'phase A'");
    }
    p.voltage = std::polar(amplitude, phase);
    m_model.ports.push_back(p);
  }

  /// load NAME on WIRE at POS | at NODE | from END to END, then its values.
  void load(TokenCursor& c, const Token& keyword) {
    Load l;
    const Token& name = c.expect_name("a load name");
    require_new_part_name(name);
    l.name = name.text;
    l.where = keyword.where;
    NetworkElement part;
    if (c.peek_word("on")) {
      l.position = position(c);
    } else {
      part.name = l.name;
      part.where = l.where;
      part.kind = NetworkKind::lumped;
      part.ends = c.peek_word("from") ? two_ends(c, part.name) : std::vector<CircuitEnd>{one_end(c, part.name)};
    }
    l.values = lumped_values(c, keyword, l.name);
    if (part.ends.empty()) {
      m_model.loads.push_back(l);
    } else {
      part.part = l.values;
      m_model.network.push_back(part);
    }
  }

  LumpedValues lumped_values(TokenCursor& c, const Token& keyword, const std::string& name) {
    LumpedValues l;
    std::set<std::string> seen;
    bool any = false;
    while (!c.at_end()) {
      const Token& option = c.next();
      if (!seen.insert(option.text).second) throw InputError(option.where, "'" + option.text + "' is given twice");
      if (option.text == "resistance") l.resistance = non_negative(c, dimension::resistance, 1.0, "a resistance");
      else if (option.text == "inductance") l.inductance = non_negative(c, dimension::inductance, 0.0, "an inductance");
      else if (option.text == "capacitance") {
        const Token& at = c.peek();
        l.capacitance = non_negative(c, dimension::capacitance, 0.0, "a capacitance");
        if (*l.capacitance <= 0.0) throw InputError(at.where, "a capacitance must be above zero");
      } else if (option.text == "series" || option.text == "parallel") {
        if (seen.count("series") && seen.count("parallel"))
          throw InputError(option.where, "a load is either series or parallel");
        l.parallel = option.text == "parallel";
        continue;
      } else
        throw InputError(option.where, "unexpected " + quoted(option) +
                                           "; a load takes resistance, inductance, capacitance and series or parallel");
      any = true;
    }
    if (!any) throw InputError(keyword.where, "load '" + name + "' needs a resistance, inductance or capacitance");
    if (l.parallel && ((seen.count("resistance") && l.resistance == 0.0) || (seen.count("inductance") && l.inductance == 0.0)))
      throw InputError(keyword.where, "a parallel load with a zero resistance or inductance is a short circuit; leave it out");
    return l;
  }

  // ---- feed network ------------------------------------------------------------------
  /// Loads, lines, stubs and transformers share one namespace: results name them.
  void require_new_part_name(const Token& name) const {
    for (const auto& other : m_model.loads)
      if (other.name == name.text) throw InputError(name.where, "a load named '" + name.text + "' already exists");
    for (const auto& other : m_model.network)
      if (other.name == name.text) throw InputError(name.where, "a part named '" + name.text + "' already exists");
  }

  /// `WIRE at POSITION` (a gap on a wire) or `NODE` (a free point of the network).
  CircuitEnd circuit_end(TokenCursor& c, const std::string& part) {
    const Token& name = c.expect_name("a wire name with 'at POSITION', or the name of a free point");
    CircuitEnd end;
    end.where = name.where;
    if (c.peek_word("at")) {
      end.wire = position_on(c, name);
    } else {
      end.node = name.text;
      m_node_uses.push_back({name.text, name.where, "'" + part + "'"});
    }
    return end;
  }

  /// `on WIRE at POSITION` or `at NODE`: where a stub or a part across one end sits.
  CircuitEnd one_end(TokenCursor& c, const std::string& part) {
    if (c.peek_word("on")) {
      CircuitEnd end;
      end.where = c.peek(1).where;
      end.wire = position(c);
      return end;
    }
    c.expect_word("at", "after the name (or 'on WIRE at POSITION')");
    CircuitEnd end;
    const Token& node = c.expect_name("the name of a free point of the feed network");
    end.where = node.where;
    end.node = node.text;
    m_node_uses.push_back({node.text, node.where, "'" + part + "'"});
    return end;
  }

  /// `from END to END`, two different places.
  std::vector<CircuitEnd> two_ends(TokenCursor& c, const std::string& part) {
    c.expect_word("from", "after the name");
    CircuitEnd from = circuit_end(c, part);
    c.expect_word("to", "after the first end");
    CircuitEnd to = circuit_end(c, part);
    const bool same_wire_place = from.wire && to.wire && from.wire->wire == to.wire->wire &&
                                 from.wire->fraction == to.wire->fraction;
    if (same_wire_place || (!from.wire && !to.wire && from.node == to.node))
      throw InputError(to.where, "'" + part + "' joins a place to itself; its two ends must differ");
    return {from, to};
  }

  /// impedance Z0 length L velocity VF [loss ...]: what a line and a stub share, in any
  /// order among the options of `extra` (handled by the caller, which returns false for a
  /// word it does not know).
  template <typename Extra>
  void line_values(TokenCursor& c, const Token& keyword, NetworkElement& e, Extra extra) {
    std::set<std::string> seen;
    while (!c.at_end()) {
      const Token& option = c.next();
      if (!seen.insert(option.text).second) throw InputError(option.where, "'" + option.text + "' is given twice");
      if (option.text == "impedance") {
        const Token& at = c.peek();
        e.impedance = quantity_in(c, dimension::resistance, 1.0, "a characteristic impedance").value;
        if (!(e.impedance > 0.0 && e.impedance <= 1e4))
          throw InputError(at.where, "the characteristic impedance must be above 0 and at most 10 kohm");
      } else if (option.text == "length") {
        e.length = positive_length(c, "the line's length");
      } else if (option.text == "velocity") {
        const Token& at = c.peek();
        e.velocity_factor = plain(c, "a velocity factor").value;
        if (!(e.velocity_factor > 0.0 && e.velocity_factor <= 1.0))
          throw InputError(at.where, "the velocity factor is the speed on the line over the speed of light: above 0, "
                                     "at most 1 (solid polyethylene coax 0.66, foam 0.8 to 0.85, air-spaced 1)");
      } else if (option.text == "loss") {
        e.loss = line_loss(c);
      } else if (!extra(option)) {
        throw InputError(option.where, "unexpected " + quoted(option) + "; '" + e.name +
                                           "' takes impedance, length, velocity, loss" +
                                           (e.kind == NetworkKind::stub ? " and open or short" : " and crossed"));
      }
    }
    for (const char* needed : {"impedance", "length", "velocity"})
      if (!seen.count(needed))
        throw InputError(keyword.where, "'" + e.name + "' needs its " + needed +
                                            (std::string(needed) == "velocity" ? " factor (1 for an air line)" : ""));
  }

  /// A data sheet's attenuation: `A dB per LENGTH at F` once (taken as conductor loss, ∝ √f)
  /// or twice joined by `and` (split into conductor and dielectric loss, a √f + b f).
  LineLoss line_loss(TokenCursor& c) {
    struct Point {
      Real f, db_per_metre;
      SourceLocation where;
    };
    auto point = [&] {
      const Token& at = c.peek();
      const Real db = plain(c, "a loss in dB").value;
      c.expect_word("dB", "after the loss");
      c.expect_word("per", "after 'dB'");
      const Real per = positive_length(c, "the length the loss is given for");
      c.expect_word("at", "after the length");
      const Real f = frequency_value(c);
      if (!(db >= 0.0) || db / per > 1000.0)
        throw InputError(at.where, "a line's loss must be from 0 to 1000 dB per metre");
      return Point{f, db / per, at.where};
    };
    const Point first = point();
    LineLoss loss;
    if (!c.accept_word("and")) {
      loss.conductor = first.db_per_metre / std::sqrt(first.f);
      return loss;
    }
    const Point second = point();
    if (second.f == first.f) throw InputError(second.where, "the two loss points need different frequencies");
    // a √f1 + b f1 = A1, a √f2 + b f2 = A2.
    const Real s1 = std::sqrt(first.f), s2 = std::sqrt(second.f);
    const Real det = s1 * second.f - s2 * first.f;
    loss.conductor = (first.db_per_metre * second.f - second.db_per_metre * first.f) / det;
    loss.dielectric = (s1 * second.db_per_metre - s2 * first.db_per_metre) / det;
    if (loss.conductor < 0.0 || loss.dielectric < 0.0)
      throw InputError(second.where, "these two loss points do not fit a sqrt(f) conductor loss plus an f dielectric "
                                     "loss, both positive; check them against the data sheet, or give one point");
    return loss;
  }

  /// A network element of `kind` with its (new) name read.
  NetworkElement new_element(TokenCursor& c, const Token& keyword, NetworkKind kind, const std::string& what) {
    NetworkElement e;
    const Token& name = c.expect_name(what);
    require_new_part_name(name);
    e.name = name.text;
    e.where = keyword.where;
    e.kind = kind;
    return e;
  }

  /// line NAME from END to END impedance Z0 length L velocity VF [loss ...] [crossed]
  void line(TokenCursor& c, const Token& keyword) {
    NetworkElement e = new_element(c, keyword, NetworkKind::line, "a line name");
    e.ends = two_ends(c, e.name);
    line_values(c, keyword, e, [&](const Token& option) { return option.text == "crossed" && (e.crossed = true); });
    m_model.network.push_back(e);
  }

  /// stub NAME (on WIRE at POS | at NODE) impedance Z0 length L velocity VF (open | short) [loss ...]
  void stub(TokenCursor& c, const Token& keyword) {
    NetworkElement e = new_element(c, keyword, NetworkKind::stub, "a stub name");
    e.ends = {one_end(c, e.name)};
    int terminations = 0;
    line_values(c, keyword, e, [&](const Token& option) {
      if (option.text != "open" && option.text != "short") return false;
      if (++terminations > 1) throw InputError(option.where, "a stub is either open or short at its far end");
      e.shorted = option.text == "short";
      return true;
    });
    if (terminations == 0) throw InputError(keyword.where, "stub '" + e.name + "' needs 'open' or 'short' (its far end)");
    m_model.network.push_back(e);
  }

  /// transformer NAME from END to END ratio R: the impedance at `to` is R times that at `from`.
  void transformer(TokenCursor& c, const Token& keyword) {
    NetworkElement e = new_element(c, keyword, NetworkKind::transformer, "a transformer name");
    e.ends = two_ends(c, e.name);
    c.expect_word("ratio", "after the ends (the impedance ratio, 'to' over 'from', e.g. 4 for a 4:1 balun)");
    const Token& at = c.peek();
    e.ratio = plain(c, "an impedance ratio").value;
    if (!(e.ratio >= 1e-3 && e.ratio <= 1e3))
      throw InputError(at.where, "the impedance ratio must be from 0.001 to 1000, got " + number_text(e.ratio));
    m_model.network.push_back(e);
  }

  void conductor(TokenCursor& c) {
    const Token& target = c.expect_name("a wire, plate or body name, or 'all'");
    c.expect_word("conductivity", "after the name");
    const Token& at = c.peek();
    const Real sigma = quantity_in(c, dimension::conductivity, 1.0, "a conductivity").value;
    if (!(sigma > 0.0)) throw InputError(at.where, "conductivity must be above zero");
    Real thickness = 0.0;
    if (!c.at_end() && c.peek().text == "thickness") {
      const Token& word = c.next();
      if (target.text != "all" && !find_surface(target.text))
        throw InputError(word.where, "'thickness' is the metal's thickness of a plate or body; a wire has its radius");
      thickness = positive_length(c, "the thickness");
    }
    if (target.text == "all") {
      for (auto& w : m_model.wires) w.conductivity = sigma;
      for (auto& s : m_model.surfaces) s.conductivity = sigma, s.conductor_thickness = thickness;
      m_conductivity_for_all = sigma;
      m_conductor_thickness_for_all = thickness;
    } else if (SurfaceShape* surface = find_surface(target.text)) {
      surface->conductivity = sigma;
      surface->conductor_thickness = thickness;
    } else {
      existing_wire(target).conductivity = sigma;
    }
  }

  /// ground none | perfect | real permittivity E conductivity S [system R]
  void ground(TokenCursor& c, const Token& keyword) {
    const Token& kind = c.expect_name("'none', 'perfect' or 'real'");
    m_model.real_ground.reset();
    if (kind.text == "none") m_model.ground_perfect = false;
    else if (kind.text == "perfect") m_model.ground_perfect = true;
    else if (kind.text == "real") m_model.real_ground = real_ground(c, keyword), m_model.ground_perfect = false;
    else throw InputError(kind.where, "ground is 'none', 'perfect' or 'real', not '" + kind.text + "'");
    if (!m_model.ground_perfect && m_model.substrate) throw substrate_without_ground(keyword.where);
    m_ground_none_where = m_model.ground_perfect ? std::nullopt : std::optional<SourceLocation>(keyword.where);
  }

  RealGround real_ground(TokenCursor& c, const Token& keyword) {
    RealGround g;
    g.where = keyword.where;
    c.expect_word("permittivity", "after 'real'");
    const Token& eps_at = c.peek();
    g.permittivity = quantity_in(c, dimension::none, 1.0, "a relative permittivity").value;
    if (!(g.permittivity >= 1.0 && g.permittivity <= 100.0))
      throw InputError(eps_at.where, "the soil's relative permittivity must be from 1 to 100 (dry sand about 3 to 5, "
                                     "sea water 80), got " + number_text(g.permittivity));
    c.expect_word("conductivity", "after the permittivity");
    const Token& sigma_at = c.peek();
    g.conductivity = quantity_in(c, dimension::conductivity, 1.0, "a conductivity").value;
    if (!(g.conductivity >= 0.0 && g.conductivity <= 1e8))
      throw InputError(sigma_at.where, "the soil's conductivity must be from 0 to 1e8 S/m (poor soil about 0.001, "
                                       "sea water 5), got " + number_text(g.conductivity));
    if (c.accept_word("system")) {
      const Token& at = c.peek();
      g.system_resistance = quantity_in(c, dimension::resistance, 1.0, "the ground system's loss resistance").value;
      if (!(*g.system_resistance >= 0.0 && *g.system_resistance <= 1e4))
        throw InputError(at.where, "the ground system's loss resistance must be from 0 to 10 kohm, got " +
                                       number_text(*g.system_resistance));
    }
    return g;
  }

  InputError substrate_without_ground(const SourceLocation& where) const {
    return InputError(where, std::string("a substrate lies on the ground plane; it cannot be used with 'ground ") +
                                 (m_model.real_ground ? "real" : "none") + "'");
  }

  /// substrate NAME thickness H permittivity E [loss-tangent T]
  void substrate(TokenCursor& c, const Token& keyword) {
    if (m_model.substrate)
      throw InputError(keyword.where, "the substrate is already given (line " + std::to_string(m_model.substrate->where.line) +
                                          "); a model has one board");
    if (m_ground_none_where) throw substrate_without_ground(keyword.where);
    Substrate board;
    board.where = keyword.where;
    board.name = c.expect_name("a substrate name").text;
    c.expect_word("thickness", "after the substrate name");
    const Token& thickness_at = c.peek();
    board.thickness = positive_length(c, "the thickness");
    // Below this the quasi-static images the fill integrates one by one (depths 2nh within
    // two triangle sizes) run into the hundreds; no circuit board is this thin.
    if (board.thickness < thinnest_board)
      throw InputError(thickness_at.where, "the thickness must be at least " + number_text(thinnest_board * 1e6) +
                                               " um, got " + number_text(board.thickness * 1e6) + " um");
    c.expect_word("permittivity", "after the thickness");
    const Token& at = c.peek();
    board.permittivity = quantity_in(c, dimension::none, 1.0, "a relative permittivity").value;
    if (!(board.permittivity >= 1.0 && board.permittivity <= 100.0))
      throw InputError(at.where, "the relative permittivity must be from 1 to 100, got " + number_text(board.permittivity));
    // "loss-tangent" is three tokens (the lexer reads '-' as a symbol), written without spaces.
    const auto adjacent = [&](std::size_t ahead) {
      return c.peek(ahead + 1).where.column == c.peek(ahead).where.column + static_cast<int>(c.peek(ahead).text.size());
    };
    if (c.peek_word("loss") && c.peek(1).text == "-" && c.peek_word("tangent", 2) && adjacent(0) && adjacent(1)) {
      c.next();
      c.next();
      c.next();
      const Token& loss_at = c.peek();
      board.loss_tangent = quantity_in(c, dimension::none, 1.0, "a loss tangent").value;
      if (!(board.loss_tangent >= 0.0 && board.loss_tangent <= 1.0))
        throw InputError(loss_at.where, "the loss tangent must be from 0 to 1, got " + number_text(board.loss_tangent));
    }
    m_model.substrate = board;
    m_model.ground_perfect = true;
  }

  /// frequency F | F, F, … | F1 to F2 count N | F1 to F2 step DF. A model may have several
  /// (two bands, say): their frequencies are merged, sorted, and one given twice kept once.
  void frequency(TokenCursor& c, const Token& keyword) {
    if (m_model.frequencies_hz.empty()) m_model.frequency_where = keyword.where;
    std::vector<Real> values{frequency_value(c)};
    if (c.accept_word("to")) {
      range_frequencies(c, values);
    } else {
      while (c.accept_symbol(',')) values.push_back(frequency_value(c));
    }
    std::vector<Real>& f = m_model.frequencies_hz;
    f.insert(f.end(), values.begin(), values.end());
    std::sort(f.begin(), f.end());
    f.erase(std::unique(f.begin(), f.end(), [](Real a, Real b) { return b - a <= 1e-12 * b; }), f.end());
    if (f.size() > static_cast<std::size_t>(max_frequency_count))
      throw InputError(keyword.where, "the model's frequency statements give more than " +
                                          std::to_string(max_frequency_count) + " frequencies");
  }

  /// The rest of `F1 to F2 count N` or `F1 to F2 step DF`, F1 already in `values`.
  void range_frequencies(TokenCursor& c, std::vector<Real>& values) {
    const Real first = values.front();
    values.clear();
    const Token& stop_token = c.peek();
    const Real last = frequency_value(c);
    if (last < first) throw InputError(stop_token.where, "the last frequency is below the first");
    if (c.accept_word("count")) {
      const Token& n_token = c.peek();
      const Quantity n = plain(c, "a frequency count");
      if (n.value != std::round(n.value) || n.value < 1 || n.value > max_frequency_count)
        throw InputError(n_token.where, "count must be a whole number from 1 to " + std::to_string(max_frequency_count));
      const int count = static_cast<int>(n.value);
      if (count == 1 && last != first) throw InputError(n_token.where, "a range with count 1 needs equal ends");
      for (int i = 0; i < count; ++i) values.push_back(count == 1 ? first : first + (last - first) * i / (count - 1));
    } else if (c.accept_word("step")) {
      const Token& step_token = c.peek();
      const Real step = frequency_value(c);
      const Real count = std::floor((last - first) / step + 1e-9) + 1;
      if (count > max_frequency_count)
        throw InputError(step_token.where, "this step gives more than " + std::to_string(max_frequency_count) + " frequencies");
      for (int i = 0; i < static_cast<int>(count); ++i) values.push_back(first + i * step);
    } else {
      throw InputError(c.peek().where, "expected 'count N' or 'step DF' after the frequency range, found " + quoted(c.peek()));
    }
    // The same frequency twice in one range means a step or count too fine for the numbers.
    for (std::size_t i = 1; i < values.size(); ++i)
      if (values[i] - values[i - 1] <= 1e-12 * values[i])
        throw InputError(stop_token.where, "this range gives frequency " + std::to_string(i + 1) +
                                               " equal to the one before it; widen the range or give fewer frequencies");
  }

  void reference(TokenCursor& c) {
    const Token& at = c.peek();
    const Real z = quantity_in(c, dimension::resistance, 1.0, "a resistance").value;
    if (!(z > 0.0)) throw InputError(at.where, "the reference impedance must be above zero");
    m_model.reference_ohm = z;
  }

  void band(TokenCursor& c) {
    const Token& name = c.expect_name("a band name");
    for (const auto& b : m_model.bands)
      if (b.name == name.text) throw InputError(name.where, "a band named '" + name.text + "' already exists");
    Band b{name.text, frequency_value(c), 0.0};
    c.expect_word("to", "after the band's low edge");
    const Token& high = c.peek();
    b.high_hz = frequency_value(c);
    if (b.high_hz <= b.low_hz) throw InputError(high.where, "the band's high edge must be above its low edge");
    m_model.bands.push_back(b);
  }

  void pattern(TokenCursor& c) {
    m_pattern_where = c.peek().where;
    PatternGrid& g = m_model.pattern;
    c.expect_word("theta", "after 'pattern'");
    angle_range(c, g.theta_start, g.theta_stop, g.theta_step, 0.0, 180.0, "theta");
    c.expect_word("phi", "after the theta range");
    angle_range(c, g.phi_start, g.phi_stop, g.phi_step, -360.0, 360.0, "phi");
    const long points = static_cast<long>(g.thetas().size()) * static_cast<long>(g.phis().size());
    if (points > max_pattern_points)
      throw InputError(c.peek().where, "the pattern grid has " + std::to_string(points) + " directions; at most " +
                                           std::to_string(max_pattern_points) + " are allowed");
  }

  void angle_range(TokenCursor& c, Real& start, Real& stop, Real& step, Real low_deg, Real high_deg, const char* what) {
    const Token& start_token = c.peek();
    start = angle(c);
    c.expect_word("to", std::string("in the ") + what + " range");
    const Token& stop_token = c.peek();
    stop = angle(c);
    c.expect_word("step", std::string("in the ") + what + " range");
    const Token& step_token = c.peek();
    step = angle(c);
    const Real low = low_deg * pi / 180.0 - 1e-12, high = high_deg * pi / 180.0 + 1e-12;
    if (start < low || start > high) throw InputError(start_token.where, std::string(what) + " must lie from " + number_text(low_deg) + " to " + number_text(high_deg) + " deg");
    if (stop < start || stop > high) throw InputError(stop_token.where, std::string(what) + " range must end at or after its start and by " + number_text(high_deg) + " deg");
    if (!(step > 0.0)) throw InputError(step_token.where, "the step must be above zero");
    if ((stop - start) / step > 100000) throw InputError(step_token.where, "the step is too small for this range");
  }

  // ---- values ----------------------------------------------------------------------
  Quantity plain(TokenCursor& c, const std::string& what) {
    const Token& at = c.peek();
    const Quantity q = parse_expression(c, m_symbols);
    if (!q.dim.is_none()) throw InputError(at.where, "expected " + what + " (a plain number), got " + dimension_name(q.dim));
    return q;
  }

  /// A value of dimension `want`; a plain number is read in `bare_scale` units, or is an
  /// error when `bare_scale` is 0 (no unit can be assumed for it).
  Quantity quantity_in(TokenCursor& c, const Dimension& want, Real bare_scale, const std::string& what) {
    const Token& at = c.peek();
    Quantity q = parse_expression(c, m_symbols);
    if (q.dim.is_none()) {
      if (bare_scale == 0.0) throw InputError(at.where, "expected " + what + " with a unit; a plain number is ambiguous here");
      return {q.value * bare_scale, want};
    }
    if (q.dim != want) throw InputError(at.where, "expected " + what + ", got " + dimension_name(q.dim));
    return q;
  }

  Real non_negative(TokenCursor& c, const Dimension& want, Real bare_scale, const std::string& what) {
    const Token& at = c.peek();
    const Real v = quantity_in(c, want, bare_scale, what).value;
    if (v < 0.0) throw InputError(at.where, what + " cannot be negative");
    return v;
  }

  /// A length no larger than any antenna this tool can solve: beyond it the arithmetic,
  /// not the physics, decides (coordinates overflow, far fields lose every digit).
  Real length(TokenCursor& c, const std::string& what) {
    const Token& at = c.peek();
    const Real v = quantity_in(c, dimension::length, m_model.length_unit, what).value;
    if (!(std::abs(v) <= largest_length))
      throw InputError(at.where, what + " must lie within " + number_text(largest_length / 1e3) + " km of the origin, got " +
                                     number_text(v) + " m");
    return v;
  }

  /// A size (radius, width, diameter, pitch, mesh size): above zero and no smaller than a
  /// tenth of a micrometre, below which no wire or plate is built and the thin-wire kernel's
  /// quadrature would chase a vanishing radius without end.
  Real positive_length(TokenCursor& c, const std::string& what) {
    const Token& at = c.peek();
    const Real v = length(c, what);
    if (!(v > 0.0)) throw InputError(at.where, what + " must be above zero, got " + number_text(v) + " m");
    if (v < smallest_length)
      throw InputError(at.where, what + " must be at least " + number_text(smallest_length * 1e6) + " um, got " +
                                     number_text(v) + " m");
    return v;
  }

  /// An angle; a plain number is read in degrees.
  Real angle(TokenCursor& c) { return quantity_in(c, dimension::angle, pi / 180.0, "an angle").value; }

  Real frequency_value(TokenCursor& c) {
    const Token& at = c.peek();
    const Real f = quantity_in(c, dimension::frequency, 0.0, "a frequency").value;
    if (!(f > 0.0)) throw InputError(at.where, "a frequency must be above zero");
    return f;
  }

  Vec3 point(TokenCursor& c) {
    c.expect_symbol('(', "to start a point (x, y, z)");
    Vec3 p;
    for (int i = 0; i < 3; ++i) {
      p[i] = length(c, "a coordinate (a length)");
      if (i < 2) c.expect_symbol(',', "between coordinates");
    }
    c.expect_symbol(')', "to close the point");
    return p;
  }

  /// A direction (x, y, z): plain numbers or lengths, normalised.
  Vec3 direction(TokenCursor& c) {
    const Token& at = c.peek();
    c.expect_symbol('(', "to start a direction (x, y, z)");
    Vec3 v;
    Dimension dim;
    for (int i = 0; i < 3; ++i) {
      const Token& component = c.peek();
      const Quantity q = parse_expression(c, m_symbols);
      if (i == 0) dim = q.dim;
      if (q.dim != dim || !(q.dim.is_none() || q.dim == dimension::length))
        throw InputError(component.where, "a direction's components must all be plain numbers or all lengths");
      v[i] = q.value;
      if (i < 2) c.expect_symbol(',', "between components");
    }
    c.expect_symbol(')', "to close the direction");
    if (v.norm() == 0.0) throw InputError(at.where, "a direction cannot be (0, 0, 0)");
    return v.normalized();
  }

  static std::string number_text(Real v) {
    std::ostringstream s;
    s << v;
    return s.str();
  }

  // ---- whole-model checks ------------------------------------------------------------
  void finish() {
    const SourceLocation end_of_file{m_file, m_last_line, 1};
    for (const auto& [name, o] : m_overrides)
      if (!m_used_overrides.count(name))
        throw InputError(o.where, o.where.file + " " + name + ": the model has no 'let " + name + "'");
    if (m_model.wires.empty() && m_model.surfaces.empty())
      throw InputError(end_of_file, "the model has no wire, arc, helix, plate or body");
    if (m_model.frequencies_hz.empty()) throw InputError(end_of_file, "the model has no 'frequency' statement");
    for (auto& s : m_model.surfaces)
      if (s.conductivity == 0.0) s.conductivity = m_conductivity_for_all, s.conductor_thickness = m_conductor_thickness_for_all;
    if (m_model.wave && !m_model.ports.empty())
      throw InputError(m_model.wave->where, "a model is either lit by a plane wave or driven by ports, not both");
    if (!m_model.wave && m_model.ports.empty())
      throw InputError(end_of_file, "the model has no port; add one such as 'port feed on WIRE at middle' or "
                                    "'port feed on PLATE along (x, y, z) to (x, y, z)', or light the model with a 'wave'");
    const double rows = static_cast<double>(m_model.frequencies_hz.size()) * m_model.pattern.thetas().size() *
                        m_model.pattern.phis().size();
    if (rows > max_pattern_rows)
      throw InputError(m_pattern_where, "the pattern grid at every frequency makes " + number_text(rows) +
                                            " far-field rows; at most " + number_text(max_pattern_rows) +
                                            " are allowed: use a coarser grid or fewer frequencies");
    auto check_position = [&](const WirePosition& p) {
      if (const ObjectIndex* o = object(p.wire); !o || !o->wire) throw InputError(p.wire_where, "there is no wire named '" + p.wire + "'");
    };
    for (const auto& p : m_model.ports) {
      if (!p.node.empty()) continue;
      if (!p.line) {
        check_position(p.position);
        continue;
      }
      const SurfaceShape* plate = find_surface(p.line->plate);
      if (!plate) throw InputError(p.line->plate_where, "there is no plate named '" + p.line->plate + "'");
      if (plate->kind == SurfaceKind::sphere || plate->kind == SurfaceKind::box)
        throw InputError(p.line->plate_where, "'" + p.line->plate + "' is a closed body; a port line goes across a plate");
    }
    for (const auto& l : m_model.loads) check_position(l.position);
    for (const auto& e : m_model.network)
      for (const auto& end : e.ends)
        if (end.wire) check_position(*end.wire);
    check_free_points();
  }

  /// A free point joins at least two things (a port counts); its name is not a wire's or a
  /// plate's, which would read as a place on it.
  void check_free_points() const {
    std::map<std::string, std::vector<const NodeUse*>> uses;
    for (const NodeUse& use : m_node_uses) uses[use.node].push_back(&use);
    for (const auto& [node, list] : uses) {
      const NodeUse& first = *list.front();
      if (object(node))
        throw InputError(first.where, "'" + node + "' is a wire or plate; a place on it is written '" + node +
                                          " at POSITION'");
      int ports = 0;
      for (const NodeUse* use : list) ports += use->by.rfind("port", 0) == 0;
      if (ports > 1) throw InputError(list.back()->where, "two ports at free point '" + node + "'; one source per point");
      if (list.size() < 2)
        throw InputError(first.where, "free point '" + node + "' is used only by " + first.by +
                                          "; a free point joins two or more parts or ports (a misspelt name?)");
    }
  }

  /// A free point of the feed network, where it is named and by what.
  struct NodeUse {
    std::string node;
    SourceLocation where;
    std::string by;
  };

  std::string m_file;
  Model m_model;
  std::vector<NodeUse> m_node_uses;
  SymbolTable m_symbols;
  std::map<std::string, Override> m_overrides;
  std::unordered_map<std::string, ObjectIndex> m_objects;
  std::set<std::string> m_used_overrides;
  Real m_conductivity_for_all = 0.0;
  Real m_conductor_thickness_for_all = 0.0;
  std::optional<SourceLocation> m_ground_none_where;
  int m_last_line = 1;
  SourceLocation m_pattern_where{m_file, 1, 1};
};

}  // namespace

Model parse_model(const std::string& text, const std::string& file, const std::vector<Override>& overrides) {
  ModelParser parser(file, overrides);
  return parser.parse(text);
}

Override parse_override(const std::string& option, int index, const std::string& option_name) {
  const SourceLocation where{option_name, index, 1};
  const auto equals = option.find('=');
  if (equals == std::string::npos || equals == 0)
    throw InputError(where, option_name + " takes NAME=VALUE, got '" + option + "'");
  Override o{option.substr(0, equals), option.substr(equals + 1), where};
  o.where.column = static_cast<int>(equals) + 2;
  return o;
}

Band parse_band_option(const std::string& option, int index) {
  const SourceLocation where{"--band", index, 1};
  const auto colon = option.find(':');
  if (colon == std::string::npos) throw InputError(where, "--band takes LOW:HIGH, such as 2.4GHz:2.4835GHz");
  auto edge = [&](const std::string& text, std::size_t column) {
    std::vector<Token> tokens = tokenize_line(text, "--band", index);
    for (Token& t : tokens) t.where.column += static_cast<int>(column);
    TokenCursor c(tokens);
    const SourceLocation at = c.peek().where;
    const Quantity q = parse_expression(c, SymbolTable{});
    if (!c.at_end()) throw InputError(c.peek().where, "unexpected text after the band edge");
    if (!(q.dim == dimension::frequency) || !(q.value > 0.0))
      throw InputError(at, "a band edge is a frequency above zero with its unit, such as 2.4GHz");
    return q.value;
  };
  std::string name;
  for (char ch : option)
    if (!std::isspace(static_cast<unsigned char>(ch))) name += ch;
  Band band{name, edge(option.substr(0, colon), 0), edge(option.substr(colon + 1), colon + 1)};
  if (band.high_hz <= band.low_hz)
    throw InputError({"--band", index, static_cast<int>(colon) + 2}, "the band's high edge must be above its low edge");
  return band;
}

namespace {

/// The `count` colon-separated expressions of a range, all of one dimension.
std::vector<Quantity> range_parts(const std::string& rest, int index, std::size_t offset, std::size_t count,
                                  const std::string& name) {
  std::vector<Quantity> parts;
  std::size_t start = 0;
  while (true) {
    const std::size_t colon = rest.find(':', start);
    std::vector<Token> tokens =
        tokenize_line(rest.substr(start, colon == std::string::npos ? std::string::npos : colon - start), "--vary", index);
    for (Token& t : tokens) t.where.column += static_cast<int>(offset + start);
    TokenCursor c(tokens);
    parts.push_back(parse_expression(c, SymbolTable{}));
    if (!c.at_end()) throw InputError(c.peek().where, "unexpected text in the range");
    if (colon == std::string::npos) break;
    start = colon + 1;
  }
  const SourceLocation where{"--vary", index, 1};
  if (parts.size() != count) throw InputError(where, count == 3 ? "a range is START:STOP:STEP" : "a range is MIN:MAX");
  for (const auto& p : parts)
    if (!(p.dim == parts[0].dim)) throw InputError(where, "the ends of --vary " + name + " must have the same unit");
  return parts;
}

/// The unit text that makes an SI value an override of a `let` of dimension d.
std::string override_unit(const Dimension& d, const SourceLocation& where) {
  if (d == dimension::length) return " m";
  if (d == dimension::frequency) return " Hz";
  if (d == dimension::angle) return " rad";
  if (d == Dimension{}) return "";
  throw InputError(where, "a range takes plain numbers, lengths, frequencies or angles; list other values as A,B,C");
}

/// The unit the first part of a range ("20deg" of "20deg:65deg:5deg") is written in.
ShownUnit shown_unit(const std::string& rest, int index) {
  const std::vector<Token> tokens = tokenize_line(rest.substr(0, rest.find(':')), "--vary", index);
  if (tokens.size() < 2 || tokens[tokens.size() - 2].kind != TokenKind::identifier) return {};
  const std::string unit = tokens[tokens.size() - 2].text;
  if (!is_unit_name(unit)) return {};
  std::vector<Token> one = tokenize_line("1 " + unit, "--vary", index);
  TokenCursor c(one);
  return {unit, parse_expression(c, SymbolTable{}).value};
}

}  // namespace

std::string model_value_text(const ResolvedValue& v, const Model& model) {
  if (v.unit == "m") return exact_text(v.value / model.length_unit) + " " + model.length_unit_name;
  if (v.unit == "rad") return exact_text(v.value * 180.0 / pi) + " deg";
  if (v.unit == "Hz") return exact_text(v.value / 1e6) + " MHz";
  return exact_text(v.value) + (v.unit.empty() ? "" : " " + v.unit);
}

std::string shown_text(Real value, const ShownUnit& shown) {
  char text[40];
  std::snprintf(text, sizeof text, "%.10g", value / shown.scale);
  return shown.name.empty() ? std::string(text) : std::string(text) + " " + shown.name;
}

TunedName parse_tune_option(const std::string& option, int index) {
  const SourceLocation where{"--vary", index, 1};
  const auto equals = option.find('=');
  if (equals == std::string::npos || equals == 0) throw InputError(where, "--vary takes NAME=MIN:MAX, got '" + option + "'");
  TunedName tuned{option.substr(0, equals), 0.0, 0.0, "", shown_unit(option.substr(equals + 1), index)};
  const std::vector<Quantity> parts = range_parts(option.substr(equals + 1), index, equals + 1, 2, tuned.name);
  tuned.unit = override_unit(parts[0].dim, where);
  tuned.low = parts[0].value;
  tuned.high = parts[1].value;
  if (!(tuned.high > tuned.low)) throw InputError(where, "MAX must be above MIN");
  return tuned;
}

VariedName parse_vary_option(const std::string& option, int index) {
  const SourceLocation where{"--vary", index, 1};
  const auto equals = option.find('=');
  if (equals == std::string::npos || equals == 0)
    throw InputError(where, "--vary takes NAME=START:STOP:STEP or NAME=A,B,C, got '" + option + "'");
  VariedName varied{option.substr(0, equals), {}, {}};
  const std::string rest = option.substr(equals + 1);
  if (rest.find(':') == std::string::npos) {
    std::size_t start = 0;
    while (true) {
      const std::size_t comma = rest.find(',', start);
      const std::string text = rest.substr(start, comma == std::string::npos ? std::string::npos : comma - start);
      if (text.find_first_not_of(' ') == std::string::npos)
        throw InputError({"--vary", index, static_cast<int>(equals + start) + 2}, "an empty value in the list");
      varied.values.push_back(text);
      const std::size_t first = text.find_first_not_of(' '), last = text.find_last_not_of(' ');
      varied.labels.push_back(text.substr(first, last - first + 1));
      if (comma == std::string::npos) break;
      start = comma + 1;
    }
  } else {
    const std::vector<Quantity> parts = range_parts(rest, index, equals + 1, 3, varied.name);
    const std::string unit = override_unit(parts[0].dim, where);
    const Real first = parts[0].value, last = parts[1].value, step = parts[2].value;
    if (!(step > 0.0) || last < first) throw InputError(where, "a range needs STOP at or above START and a STEP above zero");
    const double count = std::floor((last - first) / step + 1e-9) + 1;
    if (count > max_sweep_values) throw InputError(where, "the range has more than " + std::to_string(max_sweep_values) + " values");
    const ShownUnit shown = shown_unit(rest, index);
    for (int i = 0; i < static_cast<int>(count); ++i) {
      varied.values.push_back(exact_text(first + i * step) + unit);
      varied.labels.push_back(shown_text(first + i * step, shown));
    }
  }
  return varied;
}

}  // namespace lobe
