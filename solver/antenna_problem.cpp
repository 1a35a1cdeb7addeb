#include "solver/antenna_problem.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>

#include "core/check.hpp"
#include "core/constants.hpp"
#include "core/formatted_text.hpp"
#include "geometry/surface_contact.hpp"
#include "solver/assembly.hpp"
#include "solver/excitation.hpp"
#include "solver/fill_geometry.hpp"
#include "solver/frequency_limits.hpp"

namespace lobe {
namespace {

/// The wire nodes that touch a plate or body, and the surface point each meets.
struct NodeContacts {
  std::vector<int> nodes;
  std::vector<Vec3> points;
};

std::string millimetres(Real metres) {
  char text[64];
  std::snprintf(text, sizeof text, "%.3g mm", metres * 1e3);
  return text;
}

/// Every node within touching distance of a surface attaches to it, whatever the number of
/// wire ends there and on whichever side they come from. A free wire end that stops short
/// of a surface by less than its segment is refused, almost always a modelling slip that
/// the solver would take literally.
NodeContacts contacts_of(const Model& model, const WireMesh& mesh) {
  NodeContacts contacts;
  if (model.surfaces.empty()) return contacts;
  const SurfaceContact surfaces(model.surfaces);
  for (std::size_t n = 0; n < mesh.nodes.size(); ++n) {
    const MeshNode& node = mesh.nodes[n];
    if (node.on_ground) continue;
    Real shortest = INFINITY;
    for (const SegmentEnd& e : node.ends) shortest = std::min(shortest, mesh.segments[e.segment].length());
    std::size_t nearest = 0;
    Real gap = INFINITY;
    for (std::size_t k = 0; k < surfaces.size(); ++k) {
      const Real d = surfaces.distance(k, node.position);
      if (d < gap) gap = d, nearest = k;
    }
    if (gap <= touch_tolerance(shortest)) {
      contacts.nodes.push_back(static_cast<int>(n));
      contacts.points.push_back(surfaces.nearest_point(nearest, node.position));
    } else if (node.ends.size() == 1 && gap < shortest) {
      const Wire& wire = model.wires[mesh.segments[node.ends.front().segment].wire];
      throw InputError(wire.where, "wire '" + wire.name + "' ends " + millimetres(gap) + " from '" +
                                       model.surfaces[nearest].name + "' without touching it; end it on the surface or "
                                       "at least a segment (" + millimetres(shortest) + ") away");
    }
  }
  return contacts;
}

/// Wire nodes touching a surface must become surface vertices, and plate ports need mesh
/// edges along their lines.
MeshConstraints constraints_of(const Model& model, const WireMesh& mesh) {
  MeshConstraints c;
  if (model.surfaces.empty()) return c;
  c.points = contacts_of(model, mesh).points;
  for (const auto& p : model.ports)
    if (p.line) c.lines.push_back({p.line->from, p.line->to});
  return c;
}

/// The plate's normal as given, turned and mirrored with the plate.
Vec3 plate_normal(const SurfaceShape& shape) {
  Vec3 n = shape.normal;
  if (shape.kind == SurfaceKind::polygon) n = (shape.polygon[1] - shape.polygon[0]).cross(shape.polygon[2] - shape.polygon[0]);
  return (shape.transform.linear() * n).normalized();
}

int shape_index(const Model& model, const std::string& name) {
  for (std::size_t s = 0; s < model.surfaces.size(); ++s)
    if (model.surfaces[s].name == name) return static_cast<int>(s);
  return -1;
}

/// What a substrate model may hold: plates printed on the board's top face, fed by port
/// lines or by probes. Wires in the air above the board and plane waves need the slab's
/// kernels for sources and observers off its face, and are refused rather than computed
/// with the wrong Green's function.
void check_on_substrate(const Model& model, const SurfaceMeshReport& surfaces) {
  const Substrate& board = *model.substrate;
  if (model.wave)
    throw InputError(model.wave->where, "plane waves on a substrate model are not modelled yet");
  const Real tolerance = 1e-6 * board.thickness;
  for (std::size_t t = 0; t < surfaces.mesh.triangles.size(); ++t)
    for (int v : surfaces.mesh.triangles[t])
      if (std::abs(surfaces.mesh.vertices[v].z() - board.thickness) > tolerance) {
        const SurfaceShape& shape = model.surfaces[surfaces.region[t]];
        throw InputError(shape.where, "'" + shape.name + "' is not on the top face of substrate '" + board.name +
                                          "' (z = " + millimetres(board.thickness) +
                                          "); only plates printed on the board's top face are modelled");
      }
}

/// A probe's current is taken as uniform from the ground to the plate: true within a few
/// per cent while the board is thinner than this fraction of the wavelength in it.
constexpr Real thickest_probe_in_wavelengths = 0.05;

/// Every wire on a substrate must be a probe: straight up from the ground through the
/// board to a plate on its top face, one segment, electrically short at the highest
/// frequency.
std::vector<Probe> probes_of(const Model& model, const WireMesh& mesh, const std::vector<int>& node_vertex) {
  std::vector<Probe> probes;
  if (!model.substrate) return probes;
  const Substrate& board = *model.substrate;
  const Real tolerance = 1e-6 * board.thickness;
  const auto is_probe_line = [&](const Vec3& from, const Vec3& to) {
    return std::abs(from.x() - to.x()) <= tolerance && std::abs(from.y() - to.y()) <= tolerance &&
           std::abs(from.z()) <= tolerance && std::abs(to.z() - board.thickness) <= tolerance;
  };
  // Every wire's ends first, so that a wire above the board is named as such, not as a
  // probe's neighbour. A wire's segments follow each other from its start to its end.
  struct Span {
    Vec3 start, end;
    int segments = 0;
  };
  std::vector<Span> spans(model.wires.size());
  for (const Segment& seg : mesh.segments) {
    Span& span = spans[seg.wire];
    if (span.segments++ == 0) span.start = seg.start;
    span.end = seg.end;
  }
  for (std::size_t w = 0; w < spans.size(); ++w) {
    const Wire& wire = model.wires[w];
    if (spans[w].segments == 0) continue;
    if (!is_probe_line(spans[w].start, spans[w].end))
      throw InputError(wire.where, "wire '" + wire.name + "' on substrate '" + board.name +
                                       "': only probes are modelled, straight up from the ground (z = 0) to a plate on "
                                       "the top face (z = " + millimetres(board.thickness) +
                                       "); wires in the air above the board are not modelled yet");
    if (spans[w].segments > 1)
      throw InputError(wire.where, "probe '" + wire.name + "' must be one segment: its current is taken as uniform "
                                   "through the board (remove 'segments')");
  }
  for (std::size_t s = 0; s < mesh.segments.size(); ++s) {
    const Segment& seg = mesh.segments[s];
    const Wire& wire = model.wires[seg.wire];
    if (node_vertex[seg.node[1]] < 0)
      throw InputError(wire.where, "probe '" + wire.name + "' does not end on a plate printed on the top face");
    if (mesh.nodes[seg.node[1]].ends.size() != 1)
      throw InputError(wire.where, "probe '" + wire.name + "' shares its top with another wire; one probe per point");
    if (seg.radius >= 0.5 * board.thickness)
      throw InputError(wire.where, "probe '" + wire.name + "' is too thick for its board: its radius (" +
                                       millimetres(seg.radius) + ") must be under half the thickness for the thin-wire model");
    const Real wavelength_in_board = speed_of_light / (model.highest_frequency() * std::sqrt(board.permittivity));
    if (board.thickness > thickest_probe_in_wavelengths * wavelength_in_board)
      throw InputError(wire.where, "probe '" + wire.name + "' through " + millimetres(board.thickness) + " of substrate '" +
                                       board.name + "' is too long at the highest frequency: the board is more than " +
                                       "a twentieth of the wavelength in it, where the probe's current is no longer uniform; "
                                       "use a thinner board or feed the plate with a port line");
    probes.push_back({static_cast<int>(s), -1, -1, seg.start, seg.radius});
  }
  return probes;
}

/// Below this height in wavelengths the reflection-coefficient image misjudges the near
/// interaction with real ground by more than a few per cent: lower wires take the
/// Sommerfeld integrals.
constexpr Real sommerfeld_below_height = 0.25;
/// The Sommerfeld term is integrated by points along each segment; a segment much longer
/// than its height would need more than the rule has. Closer than a few radii the
/// thin-wire kernel cannot see the soil.
constexpr Real longest_segment_over_height = 5.0;
constexpr Real lowest_height_in_radii = 3.0;

/// Over real ground: wires only (plates, bodies and plane waves need the ground's kernels
/// for surfaces and its reflected wave, not modelled yet), and the near interaction chosen
/// by the lowest wire's height: the reflection-coefficient image above a quarter
/// wavelength (at the lowest frequency), the Sommerfeld integrals below.
void choose_real_ground_method(const Model& model, const WireMesh& mesh, Medium& medium) {
  if (model.wave) throw InputError(model.wave->where, "plane waves over real ground are not modelled yet");
  // Over a stated ground system the near interaction is the exact image's, which takes
  // wires on the ground and plates as over a perfect ground.
  if (model.real_ground->system_resistance) return;
  if (!model.surfaces.empty())
    throw InputError(model.surfaces.front().where, "plates and bodies over real ground are not modelled yet (without "
                                                   "a ground system); model the structure with wires, or use 'ground "
                                                   "perfect'");
  if (mesh.segments.empty()) return;
  const Real lowest_frequency = *std::min_element(model.frequencies_hz.begin(), model.frequencies_hz.end());
  Real lowest = INFINITY;
  for (const Segment& seg : mesh.segments) {
    const Real z = std::min(seg.start.z(), seg.end.z());
    const Wire& wire = model.wires[seg.wire];
    lowest = std::min(lowest, z);
    if (z < lowest_height_in_radii * seg.radius)
      throw InputError(wire.where, "wire '" + wire.name + "' comes within " + millimetres(z) + " of the real ground, "
                                   "closer than three of its radii: the thin-wire model cannot see the soil that close");
    if (seg.length() > longest_segment_over_height * z && z < sommerfeld_below_height * speed_of_light / lowest_frequency)
      throw InputError(wire.where, "wire '" + wire.name + "' has segments of " + millimetres(seg.length()) +
                                       " at " + millimetres(z) + " above the real ground; near the soil a segment may "
                                       "be at most five times its height: give the wire more segments");
  }
  if (lowest < sommerfeld_below_height * speed_of_light / lowest_frequency) medium.use_sommerfeld_near_ground();
}

void check_surfaces_above_ground(const Model& model, const Medium& medium, const SurfaceMeshReport& surfaces) {
  if (model.substrate) return check_on_substrate(model, surfaces);
  if (!medium.has_ground()) return;
  for (std::size_t t = 0; t < surfaces.mesh.triangles.size(); ++t)
    for (int v : surfaces.mesh.triangles[t])
      if (surfaces.mesh.vertices[v].z() <= 0.0) {
        const SurfaceShape& shape = model.surfaces[surfaces.region[t]];
        throw InputError(shape.where, "'" + shape.name + "' touches or dips below the ground plane z = 0; plates and "
                                      "bodies over a ground must lie wholly above it");
      }
}

/// Per wire node, the surface vertex it is attached to, or −1 (constraint points come in
/// the order of contacts_of).
std::vector<int> attachment_vertices(const Model& model, const WireMesh& mesh, const SurfaceMeshReport& surfaces) {
  std::vector<int> vertex(mesh.nodes.size(), -1);
  const NodeContacts contacts = contacts_of(model, mesh);
  LOBE_CHECK(contacts.nodes.size() == surfaces.point_vertex.size() || model.surfaces.empty(),
             "surface mesh made for other constraint points");
  for (std::size_t c = 0; c < contacts.nodes.size(); ++c) {
    const int n = contacts.nodes[c];
    vertex[n] = surfaces.point_vertex[c];
    if (vertex[n] < 0) {
      const Wire& wire = model.wires[mesh.segments[mesh.nodes[n].ends.front().segment].wire];
      throw InputError(wire.where, "wire '" + wire.name + "' touches a surface where the mesher could not place a "
                                       "vertex; move the wire's end a little");
    }
  }
  return vertex;
}

/// Refuses a wire attached where the surface is not flat (a curved body, a body's edge or
/// corner, plates meeting at an angle): the junction basis spreads the wire's current over
/// the triangles around the vertex as in one plane, and on a bent star the solution does
/// not settle as the mesh is refined (a monopole on a sphere of 0.4 λ swung by 40 Ω and
/// lost 1.4 % of its power balance).
void require_flat_attachment(const Model& model, const WireMesh& mesh, const SurfaceMeshReport& surfaces,
                             const JunctionStar& star, int node) {
  const Vec3 first = surfaces.mesh.normal(star.triangles.front().triangle);
  for (const StarTriangle& t : star.triangles) {
    if (std::abs(surfaces.mesh.normal(t.triangle).dot(first)) > 1.0 - 1e-9) continue;
    const Wire& wire = model.wires[mesh.segments[mesh.nodes[node].ends.front().segment].wire];
    throw InputError(wire.where, "wire '" + wire.name + "' meets '" + model.surfaces[surfaces.region[t.triangle]].name +
                                     "' where its surface is not flat (a curved body, an edge or corner, or plates "
                                     "meeting at an angle); lobe joins wires to surfaces only where the surface around "
                                     "the joint is flat: attach it to a plate or a flat face");
  }
}

std::vector<bool> attached(const std::vector<int>& node_vertex) {
  std::vector<bool> flags(node_vertex.size());
  for (std::size_t n = 0; n < node_vertex.size(); ++n) flags[n] = node_vertex[n] >= 0;
  return flags;
}

/// The coupling of a plate port: edge length times ±1 on every RWG function across its line.
Eigen::VectorXd line_vector(const Model& model, const Port& port, const std::vector<std::array<int, 2>>& edges,
                            const SurfaceMeshReport& surfaces, const RwgBasis& rwg, int unknowns) {
  Eigen::VectorXd p = Eigen::VectorXd::Zero(unknowns);
  const int plate = shape_index(model, port.line->plate);
  const Vec3 across = (port.line->to - port.line->from).cross(plate_normal(model.surfaces[plate]));
  for (const auto& [a, b] : edges) {
    const int function = rwg.function_on(a, b);
    if (function < 0) continue;
    const RwgEdge& edge = rwg.edge(function - rwg.first());
    if (surfaces.region[edge.plus] != plate || surfaces.region[edge.minus] != plate) continue;
    const Vec3 flow = surfaces.mesh.centroid(edge.minus) - surfaces.mesh.centroid(edge.plus);
    p[function] = (flow.dot(across) > 0.0 ? 1.0 : -1.0) * edge.length;
  }
  if (p.isZero())
    throw InputError(port.where, "port '" + port.name + "': its line does not run across plate '" + port.line->plate +
                                     "' (it must lie in the plate, inside its outline)");
  return p;
}

/// Ports on the antenna whose couplings are dependent (two at one place, or one on every
/// wire of a junction) have no port impedance matrix: refused here rather than divided by
/// zero. Ports at free points of a feed network have no coupling and are not among them.
void require_independent_ports(const Model& model, const Eigen::MatrixXd& port_vectors) {
  std::vector<Eigen::Index> on_antenna;
  for (std::size_t p = 0; p < model.ports.size(); ++p)
    if (model.ports[p].node.empty()) on_antenna.push_back(static_cast<Eigen::Index>(p));
  const Eigen::MatrixXd couplings = port_vectors(Eigen::all, on_antenna);
  if (couplings.cols() == 0 || Eigen::FullPivLU<Eigen::MatrixXd>(couplings).rank() == couplings.cols()) return;
  for (Eigen::Index k = 1; k < couplings.cols(); ++k)
    if (Eigen::FullPivLU<Eigen::MatrixXd>(couplings.leftCols(k + 1)).rank() < k + 1) {
      const Port& port = model.ports[on_antenna[k]];
      throw InputError(port.where, "port '" + port.name + "' is not independent of the ports before it (two ports at "
                                                         "one place, or a port on every wire of one junction)");
    }
}

/// Per wire node on the ground, the coupling of the basis currents to the current flowing
/// into the ground there: the sum over the wire ends at the node, each with the sense of
/// its segment (into the node at a segment's end, out of it at its start).
Eigen::MatrixXd ground_connections(const WireMesh& mesh, const WireBasis& basis, int unknowns) {
  std::vector<Eigen::VectorXd> columns;
  for (std::size_t n = 0; n < mesh.nodes.size(); ++n) {
    const MeshNode& node = mesh.nodes[n];
    if (!node.on_ground) continue;
    Eigen::VectorXd p = Eigen::VectorXd::Zero(unknowns);
    for (const SegmentEnd& e : node.ends)
      p.head(basis.size()) += (e.end == 1 ? 1.0 : -1.0) * basis.gap_vector(Gap{e, static_cast<int>(n), {}, ""});
    columns.push_back(p);
  }
  Eigen::MatrixXd vectors(unknowns, static_cast<Eigen::Index>(columns.size()));
  for (std::size_t c = 0; c < columns.size(); ++c) vectors.col(static_cast<Eigen::Index>(c)) = columns[c];
  return vectors;
}

}  // namespace

AntennaProblem::AntennaProblem(const Model& m) : AntennaProblem(m, mesh_wires(m)) {}

namespace {

/// Refuses, before meshing the surfaces, a model whose matrices could never fit in memory.
const WireMesh& checked_before_meshing(const Model& model, const WireMesh& wires) {
  require_system_memory(model, static_cast<double>(wires.segments.size()) + estimated_surface_functions(model), true);
  return wires;
}

/// One star per wire node attached to a surface, each refused where the surface is not flat.
std::vector<JunctionStar> stars_of(const Model& model, const WireMesh& mesh, const SurfaceMeshReport& surfaces,
                                   const std::vector<int>& node_vertex, const WireBasis& basis) {
  std::vector<JunctionStar> stars;
  for (std::size_t n = 0; n < mesh.nodes.size(); ++n) {
    if (node_vertex[n] < 0) continue;
    stars.push_back(junction_star(surfaces.mesh, node_vertex[n]));
    require_flat_attachment(model, mesh, surfaces, stars.back(), static_cast<int>(n));
    stars.back().bases = basis.functions_into_surface(static_cast<int>(n));
  }
  return stars;
}

/// The surface mesh, refused where it touches or dips below a ground.
const SurfaceMeshReport& checked_above_ground(const Model& model, const Medium& medium,
                                             const SurfaceMeshReport& surfaces) {
  check_surfaces_above_ground(model, medium, surfaces);
  return surfaces;
}

}  // namespace

AntennaProblem::AntennaProblem(const Model& m, const WireMesh& wires)
    : AntennaProblem(m, wires, mesh_model_surfaces(m, constraints_of(m, checked_before_meshing(m, wires)))) {}

AntennaProblem::AntennaProblem(const Model& m, WireMesh wires, SurfaceMeshReport meshed_surfaces)
    : model(m),
      medium(Medium::of(m)),
      mesh(std::move(wires)),
      surfaces(std::move(meshed_surfaces)),
      node_vertex(attachment_vertices(m, mesh, checked_above_ground(m, medium, surfaces))),
      basis(mesh, attached(node_vertex), m.substrate.has_value()),
      rwg(surfaces.mesh, basis.size()),
      stars(stars_of(m, mesh, surfaces, node_vertex, basis)),
      geometry(std::make_shared<const FillGeometry>(mesh, surfaces.mesh, stars, medium)),
      probes(probes_of(m, mesh, node_vertex)),
      samples(basis_samples(m.substrate ? WireMesh{} : mesh, basis, surfaces.mesh, rwg, stars)) {
  for (Probe& probe : probes) {
    probe.basis = basis.pieces_on(probe.segment).front().basis;
    for (std::size_t j = 0; j < stars.size(); ++j)
      if (stars[j].bases.front() == probe.basis) probe.star = static_cast<int>(j);
  }
  for (MeshWarning& w : check_frequency_limits(m, medium, mesh, surfaces.mesh)) mesh.warnings.push_back(std::move(w));
  if (m.real_ground) choose_real_ground_method(m, mesh, medium);
  if (m.substrate)
    mesh.warnings.push_back(
        {m.substrate->where, "substrate '" + m.substrate->name + "' and its ground are modelled as infinite: a real "
                             "board's edges radiate and reflect its surface waves, which moves the gain, the back "
                             "lobe and a little of the match, the more so on a board under a few wavelengths across"});
  require_current_at_gaps(mesh, attached(node_vertex));
  if (unknowns() == 0) throw InputError({m.file, 1, 1}, "the model has no place for current to flow (no unknowns)");
  port_vectors.resize(unknowns(), static_cast<Eigen::Index>(m.ports.size()));
  std::size_t line = 0, gap = 0;
  for (std::size_t p = 0; p < m.ports.size(); ++p) {
    if (m.ports[p].line) {
      port_vectors.col(p) = line_vector(m, m.ports[p], surfaces.line_edges[line++], surfaces, rwg, unknowns());
    } else {
      // A port at a free point of the feed network couples to the antenna only through it.
      port_vectors.col(p).setZero();
      if (m.ports[p].node.empty()) port_vectors.col(p).head(basis.size()) = basis.gap_vector(mesh.port_gaps[gap++]);
    }
  }
  require_independent_ports(m, port_vectors);
  load_vectors = Eigen::MatrixXd::Zero(unknowns(), static_cast<Eigen::Index>(mesh.load_gaps.size()));
  for (std::size_t l = 0; l < mesh.load_gaps.size(); ++l)
    load_vectors.col(l).head(basis.size()) = basis.gap_vector(mesh.load_gaps[l]);
  std::vector<Eigen::VectorXd> network_gap_vectors;
  for (const Gap& g : mesh.network_gaps) {
    network_gap_vectors.push_back(Eigen::VectorXd::Zero(unknowns()));
    network_gap_vectors.back().head(basis.size()) = basis.gap_vector(g);
  }
  network = FeedNetwork(m, port_vectors, load_vectors, network_gap_vectors);
  if (m.real_ground && m.real_ground->system_resistance) ground_system_vectors = ground_connections(mesh, basis, unknowns());
}

void require_solvable(const AntennaProblem& problem) {
  require_system_memory(problem.model, static_cast<double>(problem.unknowns()));
}

FrequencySolution solve_frequency(const AntennaProblem& problem, Real frequency_hz) {
  const std::unique_ptr<SystemMatrix> matrix = make_system_matrix(problem.model, problem.unknowns());
  return solve_frequency(problem, frequency_hz, *matrix);
}

namespace {

void add_segment_currents(const AntennaProblem& problem, FrequencySolution& solution) {
  solution.segment_currents.assign(problem.mesh.segments.size(), {Complex(0.0), Complex(0.0)});
  for (std::size_t s = 0; s < problem.mesh.segments.size(); ++s)
    for (const BasisPiece& piece : problem.basis.pieces_on(static_cast<int>(s)))
      solution.segment_currents[s][piece.peak_end] += piece.sign * solution.coefficients[piece.basis];
}

/// Z⁻¹ times each of `couplings`' columns (unit drives at gaps) and, under the model's wave,
/// its excitation in one more column after them.
ComplexMatrix responses_to(const AntennaProblem& problem, const Eigen::MatrixXd& couplings, Real frequency_hz,
                           const SystemMatrix& matrix, SolveReport& report) {
  const Eigen::Index drives = couplings.cols();
  ComplexMatrix rhs(problem.unknowns(), drives + (problem.model.wave ? 1 : 0));
  rhs.leftCols(drives) = couplings.cast<Complex>();
  if (problem.model.wave) rhs.col(drives) = plane_wave_vector(problem, incident_wave(*problem.model.wave), frequency_hz);
  return matrix.solve(rhs, report);
}

ComplexVector model_port_voltages(const Model& model) {
  ComplexVector v(static_cast<Eigen::Index>(model.ports.size()));
  for (Eigen::Index p = 0; p < v.size(); ++p) v[p] = model.ports[p].voltage;
  return v;
}

/// With a feed network: the antenna's admittance at every terminal from one solve for each
/// terminal's unit drive (and the wave), then the network with it (solver/feed_network.hpp).
FrequencySolution solve_with_network(const AntennaProblem& problem, Real frequency_hz, const SystemMatrix& matrix) {
  const FeedNetwork& network = problem.network;
  const Eigen::MatrixXd& couplings = network.couplings();
  const Eigen::Index terminals = couplings.cols();
  const auto ports = static_cast<Eigen::Index>(problem.model.ports.size());
  const bool lit = problem.model.wave.has_value();
  FrequencySolution solution;
  solution.frequency_hz = frequency_hz;
  const ComplexMatrix responses = responses_to(problem, couplings, frequency_hz, matrix, solution.report);
  const ComplexMatrix drives = couplings.transpose().cast<Complex>();
  const ComplexMatrix antenna_admittance = drives * responses.leftCols(terminals);
  const ComplexVector short_circuit = lit ? ComplexVector(drives * responses.col(terminals)) : ComplexVector();
  const NetworkSolution ns = network.solve(frequency_hz, antenna_admittance, short_circuit);

  solution.port_admittance = ns.port_admittance;
  solution.port_voltages = model_port_voltages(problem.model);
  solution.port_currents = solution.port_admittance * solution.port_voltages;
  solution.network_voltages = ns.terminal_voltages.leftCols(ports) * solution.port_voltages;
  solution.network_currents = ns.element_currents.leftCols(ports) * solution.port_voltages;
  if (lit) {
    solution.received_currents = ns.received_currents;
    solution.network_voltages += ns.terminal_voltages.col(ports);
    solution.network_currents += ns.element_currents.col(ports);
  }
  ComplexVector antenna_voltages(terminals);
  for (std::size_t t = 0; t < network.terminals().size(); ++t)
    if (const int c = network.terminals()[t].coupling; c >= 0)
      antenna_voltages[c] = solution.network_voltages[static_cast<Eigen::Index>(t)];
  solution.coefficients = responses.leftCols(terminals) * antenna_voltages;
  if (lit) solution.coefficients += responses.col(terminals);
  add_segment_currents(problem, solution);
  return solution;
}

}  // namespace

FrequencySolution solve_frequency(const AntennaProblem& problem, Real frequency_hz, SystemMatrix& matrix) {
  LOBE_CHECK(matrix.size() == problem.unknowns(), "system matrix of the wrong size");
  matrix.clear();
  assemble_system(problem, frequency_hz, matrix);
  matrix.factor();

  if (!problem.network.empty()) return solve_with_network(problem, frequency_hz, matrix);
  // One solve for every port's unit drive and the wave.
  const auto ports = static_cast<Eigen::Index>(problem.model.ports.size());
  FrequencySolution solution;
  solution.frequency_hz = frequency_hz;
  const ComplexMatrix responses = responses_to(problem, problem.port_vectors, frequency_hz, matrix, solution.report);
  const ComplexMatrix drives = problem.port_vectors.transpose().cast<Complex>();
  const auto unit_responses = responses.leftCols(ports);
  solution.port_admittance = drives * unit_responses;
  solution.port_voltages = model_port_voltages(problem.model);
  solution.coefficients = unit_responses * solution.port_voltages;
  solution.port_currents = solution.port_admittance * solution.port_voltages;
  if (problem.model.wave) {
    solution.coefficients += responses.col(ports);
    solution.received_currents = drives * responses.col(ports);
  }

  add_segment_currents(problem, solution);
  return solution;
}

std::vector<Eigen::Vector3cd> triangle_current_density(const AntennaProblem& problem, const ComplexVector& coefficients) {
  const SurfaceMesh& mesh = problem.surfaces.mesh;
  std::vector<Eigen::Vector3cd> density = centroid_current_density(mesh, problem.rwg, coefficients);
  for (const JunctionStar& star : problem.stars) {
    Complex current = 0.0;
    for (int b : star.bases) current += coefficients[b];
    for (const StarTriangle& tri : star.triangles) {
      // f = K (1 − s²) (r − v)/|r − v|², with s = 2/3 at the centroid.
      const Vec3 w = mesh.centroid(tri.triangle) - star.vertex;
      density[tri.triangle] += (current * star.scale * (5.0 / 9.0) / w.squaredNorm()) * w.cast<Complex>();
    }
  }
  return density;
}

}  // namespace lobe
