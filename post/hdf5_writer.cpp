#include "post/hdf5_writer.hpp"

#include <hdf5.h>

#include <algorithm>
#include <functional>
#include <type_traits>
#include <vector>

#include "core/constants.hpp"
#include "post/band_report.hpp"
#include "post/beam_band_report.hpp"
#include "post/hdf5_layout.hpp"
#include "post/hdf5_memory_file.hpp"
#include "post/run_summary.hpp"
#include "post/scattering_result.hpp"

namespace lobe {
namespace {

using hdf5::Axis;

/// Gathers one value per (frequency, item) into a flat frequency-major array; the values'
/// type is what `value` returns.
template <typename Result, typename ValueOf>
auto per_frequency(const std::vector<Result>& results, std::size_t items, const ValueOf& value) {
  std::vector<std::invoke_result_t<ValueOf, const Result&, std::size_t>> data;
  data.reserve(results.size() * items);
  for (const auto& r : results)
    for (std::size_t i = 0; i < items; ++i) data.push_back(value(r, i));
  return data;
}

std::vector<Real> degrees(std::vector<Real> radians) {
  for (auto& a : radians) a *= 180.0 / pi;
  return radians;
}

/// The axes shared by a run's groups.
struct RunAxes {
  Axis frequency, port, driven_port, theta, phi;
};

std::vector<std::string> port_names(const Model& model) {
  std::vector<std::string> names;
  for (const auto& p : model.ports) names.push_back(p.name);
  return names;
}

std::vector<std::string> band_names(const Model& model) {
  std::vector<std::string> names;
  for (const auto& b : model.bands) names.push_back(b.name);
  return names;
}

void write_model(hid_t file, const RunRecord& run) {
  const Model& model = run.problem.model;
  hdf5::Handle g = hdf5::create_group(file, "/model");
  hdf5::write_text(file, "/model/source", model.text);
  std::vector<std::string> names, units;
  std::vector<Real> values;
  std::vector<int> overridden;
  for (const auto& v : model.values) {
    names.push_back(v.name);
    units.push_back(v.unit);
    values.push_back(v.value);
    overridden.push_back(v.overridden ? 1 : 0);
  }
  std::vector<std::string> warnings;
  for (const auto* list : {&run.problem.mesh.warnings, &run.problem.surfaces.warnings})
    for (const auto& w : *list) warnings.push_back(w.formatted());
  for (const auto& w : power_balance_warnings(run)) warnings.push_back("warning: " + w);
  hdf5::text_axis(file, "/model", "warnings", warnings);
  const Axis value = hdf5::text_axis(file, "/model", "value", names);
  hdf5::write_reals(file, "/model/values", {value}, values, "SI, per value_units");
  hdf5::write_texts(file, "/model/value_units", {value}, units);
  hdf5::write_ints(file, "/model/value_overridden", {value}, overridden, "1: set on the command line, 0: as the model says");
  hdf5::text_attribute(g, "file", model.file);
  hdf5::text_attribute(g, "ground", run.problem.medium.name());
  if (run.problem.medium.has_real_ground()) hdf5::text_attribute(g, "ground_method", run.problem.medium.ground_method());
  if (const auto& board = model.substrate) {
    hdf5::text_attribute(g, "substrate", board->name);
    hdf5::write_reals(file, "/model/substrate_thickness_m", {}, {board->thickness}, "m");
    hdf5::write_reals(file, "/model/substrate_permittivity", {}, {board->permittivity}, "1");
    hdf5::write_reals(file, "/model/substrate_loss_tangent", {}, {board->loss_tangent}, "1");
  }
  hdf5::write_reals(file, "/model/reference_ohm", {}, {model.reference_ohm}, "ohm");
  if (const auto& soil = model.real_ground) {
    hdf5::write_reals(file, "/model/ground_permittivity", {}, {soil->permittivity}, "1 (relative)");
    hdf5::write_reals(file, "/model/ground_conductivity_s_per_m", {}, {soil->conductivity}, "S/m");
  }
  std::vector<Real> band_edges;
  for (const auto& b : model.bands) band_edges.insert(band_edges.end(), {b.low_hz, b.high_hz});
  const Axis band = hdf5::text_axis(file, "/model", "band", band_names(model));
  const Axis edge = hdf5::text_axis(file, "/model", "edge", {"low", "high"});
  hdf5::write_reals(file, "/model/band_edges_hz", {band, edge}, band_edges, "Hz");
}

void write_ports(hid_t file, const RunRecord& run, RunAxes& axes) {
  const Model& model = run.problem.model;
  const std::size_t np = model.ports.size();
  hdf5::Handle g = hdf5::create_group(file, "/ports");
  axes.port = hdf5::text_axis(file, "/ports", "port", port_names(model));
  axes.driven_port = hdf5::text_axis(file, "/ports", "driven_port", port_names(model));
  const std::vector<Axis> per_port{axes.frequency, axes.port};
  auto real = [&](const char* name, const char* units, const std::function<Real(const PortResult&)>& f) {
    hdf5::write_reals(file, std::string("/ports/") + name, per_port,
                      per_frequency(run.results, np, [&](const FrequencyResult& r, std::size_t i) { return f(r.ports[i]); }),
                      units);
  };
  auto complex = [&](const char* name, const char* units, const std::function<Complex(const PortResult&)>& f) {
    hdf5::write_complex(file, std::string("/ports/") + name, per_port,
                        per_frequency(run.results, np, [&](const FrequencyResult& r, std::size_t i) { return f(r.ports[i]); }),
                        units);
  };
  const bool several_driven = std::count_if(model.ports.begin(), model.ports.end(), [](const Port& p) { return p.voltage != 0.0; }) > 1;
  complex("impedance_ohm", several_driven ? "ohm (active impedance: every driven port driven at once)" : "ohm",
          [](const PortResult& p) { return p.impedance; });
  real("vswr", "1", [](const PortResult& p) { return p.vswr; });
  real("return_loss_db", "dB", [](const PortResult& p) { return p.return_loss_db; });
  real("mismatch_loss_db", "dB", [](const PortResult& p) { return p.mismatch_loss_db; });
  complex("reflection", "1", [](const PortResult& p) { return p.reflection; });
  complex("voltage_v", "V", [](const PortResult& p) { return p.voltage; });
  complex("current_a", "A", [](const PortResult& p) { return p.current; });
  // [frequency, port, driven port]: row i, column j is port i's response to port j alone.
  const std::vector<Axis> square{axes.frequency, axes.port, axes.driven_port};
  auto matrix = [&](const char* name, const char* units, const std::function<Complex(const FrequencyResult&, std::size_t)>& f) {
    hdf5::write_complex(file, std::string("/ports/") + name, square, per_frequency(run.results, np * np, f), units);
  };
  matrix("z_matrix_ohm", "ohm", [np](const FrequencyResult& r, std::size_t k) { return r.z_matrix(k / np, k % np); });
  matrix("s_matrix", "1", [np](const FrequencyResult& r, std::size_t k) { return r.s_matrix(k / np, k % np); });
}

/// The feed network: where it meets the antenna (impedance seen there, as for a port) and
/// the power each of its elements takes.
void write_network(hid_t file, const RunRecord& run, const RunAxes& axes) {
  const FeedNetwork& network = run.problem.network;
  if (network.empty()) return;
  hdf5::Handle g = hdf5::create_group(file, "/network");
  const std::vector<int> ends = network.antenna_ends();
  std::vector<std::string> places, elements;
  for (int t : ends) places.push_back(network.terminals()[t].label);
  for (std::size_t e = 0; e < network.element_count(); ++e) elements.push_back(network.element_name(e));
  const Axis end_axis = hdf5::text_axis(file, "/network", "antenna_end", places);
  const std::vector<Axis> per_end{axes.frequency, end_axis};
  const std::size_t ne = ends.size();
  auto end = [&](const char* name, const char* units, const std::function<Real(const PortResult&)>& f) {
    hdf5::write_reals(file, std::string("/network/") + name, per_end,
                      per_frequency(run.results, ne, [&](const FrequencyResult& r, std::size_t i) { return f(r.antenna_ends[i]); }),
                      units);
  };
  hdf5::write_complex(file, "/network/antenna_end_impedance_ohm", per_end,
                      per_frequency(run.results, ne, [](const FrequencyResult& r, std::size_t i) { return r.antenna_ends[i].impedance; }),
                      "ohm");
  end("antenna_end_vswr", "1", [](const PortResult& p) { return p.vswr; });
  end("antenna_end_return_loss_db", "dB", [](const PortResult& p) { return p.return_loss_db; });
  const Axis element = hdf5::text_axis(file, "/network", "element", elements);
  hdf5::write_reals(file, "/network/element_power_w", {axes.frequency, element},
                    per_frequency(run.results, elements.size(), [](const FrequencyResult& r, std::size_t e) { return r.network_powers[e]; }),
                    "W (into the element: a line's or stub's loss, a part's dissipation)");
}

void write_power(hid_t file, const RunRecord& run, const RunAxes& axes) {
  hdf5::Handle g = hdf5::create_group(file, "/power");
  auto power = [&](const char* name, const char* units, const std::function<Real(const PowerBudget&)>& f) {
    hdf5::write_reals(file, std::string("/power/") + name, {axes.frequency},
                      per_frequency(run.results, 1, [&](const FrequencyResult& r, std::size_t) { return f(r.power); }), units);
  };
  power("accepted_w", "W", [](const PowerBudget& p) { return p.accepted; });
  power("radiated_w", "W", [](const PowerBudget& p) { return p.radiated; });
  power("conductor_loss_w", "W", [](const PowerBudget& p) { return p.conductor_loss; });
  power("load_loss_w", "W", [](const PowerBudget& p) { return p.load_loss; });
  power("surface_wave_w", "W", [](const PowerBudget& p) { return p.surface_wave; });
  power("dielectric_loss_w", "W", [](const PowerBudget& p) { return p.dielectric_loss; });
  power("line_loss_w", "W", [](const PowerBudget& p) { return p.line_loss; });
  power("ground_loss_w", "W (over real ground: the rest of the balance)", [](const PowerBudget& p) { return p.ground_loss; });
  power("efficiency", "1", [](const PowerBudget& p) { return p.efficiency(); });
  power("balance_miss", "1", [](const PowerBudget& p) { return p.imbalance(); });
}

constexpr const char* hand_meaning = "1: right-hand, -1: left-hand, 0: not circular (IEEE Std 145 senses)";

/// The main beam's figures per frequency (post/beam_figures.hpp), under the names of
/// beam_figure_kinds; where a figure is undefined at some frequency (the back of a beam at
/// the zenith over a ground plane), its `_defined` array says where (1) and where not (0,
/// the value then 0).
void write_beam(hid_t file, const RunRecord& run, const RunAxes& axes) {
  hdf5::Handle g = hdf5::create_group(file, "/beam");
  const BeamCurves curves = beam_curves(run.results);
  for (const auto& kind : beam_figure_kinds()) {
    std::vector<Real> data;
    std::vector<int> defined;
    for (const auto& v : curves.values.at(kind.name)) {
      data.push_back(v.value_or(0.0));
      defined.push_back(v.has_value());
    }
    const std::string path = "/beam/" + kind.dataset;
    hdf5::write_reals(file, path, {axes.frequency}, data, kind.unit + " (" + kind.title + ")");
    if (std::count(defined.begin(), defined.end(), 0) > 0)
      hdf5::write_ints(file, path + "_defined", {axes.frequency}, defined, "1: defined, 0: not defined here");
  }
  auto angle = [&](const char* name, const char* units, const std::function<Real(const FrequencyResult&)>& f) {
    hdf5::write_reals(file, std::string("/beam/") + name, {axes.frequency},
                      per_frequency(run.results, 1, [&](const FrequencyResult& r, std::size_t) { return f(r) * 180 / pi; }),
                      units);
  };
  angle("peak_theta_deg", "deg (the pattern grid's direction of peak gain)", [](const FrequencyResult& r) { return r.beam.peak.theta; });
  angle("peak_phi_deg", "deg", [](const FrequencyResult& r) { return r.beam.peak.phi; });
  angle("polarization_theta_deg", "deg (where the polarisation figures are taken)",
        [](const FrequencyResult& r) { return r.polarization.toward.theta; });
  angle("polarization_phi_deg", "deg", [](const FrequencyResult& r) { return r.polarization.toward.phi; });
  std::vector<int> hands;
  for (const auto& r : run.results) hands.push_back(static_cast<int>(r.polarization.hand));
  hdf5::write_ints(file, "/beam/hand", {axes.frequency}, hands, hand_meaning);
}

/// Every named band figure (band_report.hpp) of every band of the model (its `band`
/// statements and any --band): the port figures per band and port, the beam figures per
/// band; a `_defined` array marks with 0 where a figure is not defined (a band no computed
/// frequency reaches, the back of a zenith beam), the value there being 0.
void write_band_figures(hid_t file, const RunRecord& run) {
  const auto& bands = run.problem.model.bands;
  if (bands.empty()) return;
  hdf5::Handle g = hdf5::create_group(file, "/band_figures");
  const std::size_t np = run.problem.model.ports.size();
  // The group's own axes: netCDF readers (xarray) find axes only in a group or its parents.
  const Axis band = hdf5::text_axis(file, "/band_figures", "band", band_names(run.problem.model));
  const Axis port = hdf5::text_axis(file, "/band_figures", "port", port_names(run.problem.model));
  std::vector<std::optional<std::vector<BandFigures>>> figures;  // per band, per port
  for (const auto& band : bands) figures.push_back(run_band_figures(run.results, np, band));
  for (const auto& name : band_figure_names()) {
    const bool per_port = !is_beam_figure(name);
    const std::size_t columns = per_port ? np : 1;
    std::vector<Real> values;
    std::vector<int> defined;
    for (std::size_t b = 0; b < bands.size(); ++b)
      for (std::size_t p = 0; p < columns; ++p) {
        const auto value = figures[b] ? band_figure((*figures[b])[p], name) : std::nullopt;
        values.push_back(value.value_or(0.0));
        defined.push_back(value.has_value());
      }
    std::string dataset = "/band_figures/" + name;
    std::replace(dataset.begin(), dataset.end(), '-', '_');
    const std::vector<Axis> shape = per_port ? std::vector<Axis>{band, port} : std::vector<Axis>{band};
    hdf5::write_reals(file, dataset, shape, values, band_figure_title(name));
    if (std::count(defined.begin(), defined.end(), 0) > 0)
      hdf5::write_ints(file, dataset + "_defined", shape, defined, "1: defined, 0: not defined in this band");
  }
}

void write_pattern(hid_t file, const RunRecord& run, RunAxes& axes) {
  hdf5::Handle g = hdf5::create_group(file, "/pattern");
  const PatternGrid& grid = run.problem.model.pattern;
  axes.theta = hdf5::real_axis(file, "/pattern", "theta", degrees(grid.thetas()), "deg (from +z)");
  axes.phi = hdf5::real_axis(file, "/pattern", "phi", degrees(grid.phis()), "deg (from +x toward +y)");
  const std::size_t np = axes.phi.length, points = axes.theta.length * np;
  const std::vector<Axis> shape{axes.frequency, axes.theta, axes.phi};
  auto field = [&](const char* name, const char* units, const std::function<Real(const PatternResult&, Eigen::Index, Eigen::Index)>& f) {
    hdf5::write_reals(file, std::string("/pattern/") + name, shape,
                      per_frequency(run.results, points, [&](const FrequencyResult& r, std::size_t k) {
                                            return f(r.pattern, static_cast<Eigen::Index>(k / np), static_cast<Eigen::Index>(k % np));
                                          }),
                      units);
  };
  field("gain_dbi", "dBi", [](const PatternResult& p, auto i, auto j) { return p.gain_dbi(i, j); });
  field("directivity_dbi", "dBi", [](const PatternResult& p, auto i, auto j) { return p.directivity_dbi(i, j); });
  field("realized_gain_dbi", "dBi", [](const PatternResult& p, auto i, auto j) { return p.realized_gain_dbi(i, j); });
  field("rhcp_dbi", "dBi", [](const PatternResult& p, auto i, auto j) { return p.rhcp_dbi(i, j); });
  field("lhcp_dbi", "dBi", [](const PatternResult& p, auto i, auto j) { return p.lhcp_dbi(i, j); });
  field("axial_ratio_db", "dB", [](const PatternResult& p, auto i, auto j) { return p.axial_ratio_db(i, j); });
  std::vector<int> hands;
  for (const auto& r : run.results)
    for (std::size_t k = 0; k < points; ++k) hands.push_back(r.pattern.hand(static_cast<Eigen::Index>(k / np), static_cast<Eigen::Index>(k % np)));
  hdf5::write_ints(file, "/pattern/hand", shape, hands, hand_meaning);
  auto component = [&](const char* name, const std::function<Complex(const PatternResult&, Eigen::Index, Eigen::Index)>& f) {
    hdf5::write_complex(file, std::string("/pattern/") + name, shape,
                        per_frequency(run.results, points, [&](const FrequencyResult& r, std::size_t k) {
                                                 return f(r.pattern, static_cast<Eigen::Index>(k / np), static_cast<Eigen::Index>(k % np));
                                               }),
                        "V (far field times r, r in m)");
  };
  component("e_theta_v", [](const PatternResult& p, auto i, auto j) { return p.e_theta(i, j); });
  component("e_phi_v", [](const PatternResult& p, auto i, auto j) { return p.e_phi(i, j); });
}

/// The plates' and bodies' triangles and, per frequency, the current density at each centroid.
void write_surface_currents(hid_t file, const AntennaProblem& problem, const Axis& frequency, const Axis& component,
                            const std::vector<const std::vector<Eigen::Vector3cd>*>& densities) {
  const SurfaceMeshReport& surfaces = problem.surfaces;
  const std::size_t nt = surfaces.mesh.triangles.size();
  if (nt == 0) return;
  std::vector<Real> vertices;
  std::vector<int> corners;
  std::vector<std::string> shapes;
  for (const Vec3& v : surfaces.mesh.vertices) vertices.insert(vertices.end(), {v.x(), v.y(), v.z()});
  for (const auto& t : surfaces.mesh.triangles) corners.insert(corners.end(), t.begin(), t.end());
  for (int region : surfaces.region) shapes.push_back(problem.model.surfaces[region].name);
  const Axis vertex = hdf5::counting_axis(file, "/currents", "vertex", surfaces.mesh.vertices.size());
  const Axis triangle = hdf5::counting_axis(file, "/currents", "triangle", nt);
  const Axis corner = hdf5::counting_axis(file, "/currents", "corner", 3);
  hdf5::write_reals(file, "/currents/vertex_m", {vertex, component}, vertices, "m");
  hdf5::write_ints(file, "/currents/triangle_vertices", {triangle, corner}, corners, "row of vertex_m, counted from 0");
  hdf5::write_texts(file, "/currents/triangle_surface", {triangle}, shapes);
  std::vector<Complex> values;
  for (const auto* density : densities)
    for (const auto& j : *density) values.insert(values.end(), {j.x(), j.y(), j.z()});
  hdf5::write_complex(file, "/currents/surface_density_a_per_m", {frequency, triangle, component}, values,
                      "A/m (at the triangle's centroid)");
}

/// The segments and triangles with, per frequency, the current at each segment's ends and
/// the surface density at each triangle's centroid.
void write_currents(hid_t file, const AntennaProblem& problem, const Axis& frequency,
                    const std::vector<const std::vector<std::array<Complex, 2>>*>& segment_currents,
                    const std::vector<const std::vector<Eigen::Vector3cd>*>& densities) {
  hdf5::Handle g = hdf5::create_group(file, "/currents");
  const auto& segments = problem.mesh.segments;
  std::vector<Real> starts, ends, radii;
  std::vector<std::string> wires;
  for (const auto& s : segments) {
    starts.insert(starts.end(), {s.start.x(), s.start.y(), s.start.z()});
    ends.insert(ends.end(), {s.end.x(), s.end.y(), s.end.z()});
    radii.push_back(s.radius);
    wires.push_back(problem.model.wires[s.wire].name);
  }
  const Axis segment = hdf5::counting_axis(file, "/currents", "segment", segments.size());
  const Axis component = hdf5::text_axis(file, "/currents", "component", {"x", "y", "z"});
  hdf5::write_texts(file, "/currents/wire", {segment}, wires);
  hdf5::write_reals(file, "/currents/distance_m", {segment}, distances_along_wires(problem.mesh),
                    "m (the segment's midpoint, along its wire from the wire's start)");
  hdf5::write_reals(file, "/currents/segment_start_m", {segment, component}, starts, "m");
  hdf5::write_reals(file, "/currents/segment_end_m", {segment, component}, ends, "m");
  hdf5::write_reals(file, "/currents/radius_m", {segment}, radii, "m");
  for (int end = 0; end < 2; ++end) {
    std::vector<Complex> values;
    for (const auto* currents : segment_currents)
      for (const auto& c : *currents) values.push_back(c[end]);
    hdf5::write_complex(file, end ? "/currents/end_current_a" : "/currents/start_current_a", {frequency, segment}, values,
                        "A (along the segment, from its start to its end)");
  }
  write_surface_currents(file, problem, frequency, component, densities);
}

template <typename Result>
void write_currents(hid_t file, const AntennaProblem& problem, const Axis& frequency, const std::vector<Result>& results) {
  std::vector<const std::vector<std::array<Complex, 2>>*> segment_currents;
  std::vector<const std::vector<Eigen::Vector3cd>*> densities;
  for (const auto& r : results) {
    segment_currents.push_back(&r.segment_currents);
    densities.push_back(&r.surface_currents);
  }
  write_currents(file, problem, frequency, segment_currents, densities);
}

/// What made the file and the conventions its numbers follow, as root attributes.
void write_run_attributes(hid_t file, const RunInfo& info, const std::string& format) {
  hdf5::mark_format(file, format);
  hdf5::text_attribute(file, "program", "lobe");
  hdf5::text_attribute(file, "version", info.version);
  hdf5::integer_attribute(file, "threads", info.threads);
  hdf5::integer_attribute(file, "processes", info.processes);
  hdf5::text_attribute(file, "command_line", info.command_line);
  hdf5::text_attribute(file, "time_convention", "exp(+j omega t)");
  hdf5::text_attribute(file, "angles", "theta from +z, phi from +x toward +y");
}

template <typename Result>
void write_solver(hid_t file, const AntennaProblem& problem, const Axis& frequency, const std::vector<Result>& results) {
  hdf5::Handle solver = hdf5::create_group(file, "/solver");
  std::vector<Real> condition, residual;
  for (const auto& r : results) {
    condition.push_back(r.report.reciprocal_condition);
    residual.push_back(r.report.relative_residual);
  }
  hdf5::write_reals(file, "/solver/reciprocal_condition", {frequency}, condition, "1");
  hdf5::write_reals(file, "/solver/relative_residual", {frequency}, residual, "1");
  hdf5::integer_attribute(solver, "unknowns", problem.unknowns());
  hdf5::integer_attribute(solver, "segments", static_cast<long>(problem.mesh.segments.size()));
}

}  // namespace

void write_hdf5(const std::filesystem::path& path, const RunRecord& run) {
  Hdf5MemoryFile file;
  write_run_attributes(file, run.info, "lobe-antenna-result");
  hdf5::write_text(file, "/summary", run_summary(run));
  RunAxes axes;
  axes.frequency = hdf5::real_axis(file, "", "frequency",
                                   per_frequency(run.results, 1, [](const FrequencyResult& r, std::size_t) { return r.frequency_hz; }),
                                   "Hz");
  write_model(file, run);
  write_ports(file, run, axes);
  write_power(file, run, axes);
  write_network(file, run, axes);
  write_pattern(file, run, axes);
  write_beam(file, run, axes);
  write_band_figures(file, run);
  write_currents(file, run.problem, axes.frequency, run.results);
  write_solver(file, run.problem, axes.frequency, run.results);
  // 1 where the frequency was solved in full, 0 where an adaptive sweep interpolated it
  // (its condition and residual are then the nearest solve's).
  std::vector<int> solved;
  for (const auto& r : run.results) solved.push_back(r.interpolated ? 0 : 1);
  hdf5::write_ints(file, "/solver/solved", {axes.frequency}, solved, "1: solved in full, 0: interpolated by the adaptive sweep");
  file.save(path);
}

void write_scattering_hdf5(const std::filesystem::path& path, const ScatteringRun& run) {
  Hdf5MemoryFile file;
  write_run_attributes(file, run.info, "lobe-scattering-result");
  hdf5::write_text(file, "/summary", scattering_summary(run));
  std::vector<Real> frequencies, monostatic, rcs;
  for (const auto& r : run.results) {
    frequencies.push_back(r.frequency_hz);
    monostatic.push_back(r.monostatic_m2);
    for (Eigen::Index i = 0; i < r.rcs_m2.rows(); ++i)
      for (Eigen::Index j = 0; j < r.rcs_m2.cols(); ++j) rcs.push_back(r.rcs_m2(i, j));
  }
  const Axis frequency = hdf5::real_axis(file, "", "frequency", frequencies, "Hz");
  {
    hdf5::Handle model = hdf5::create_group(file, "/model");
    hdf5::write_text(file, "/model/source", run.problem.model.text);
    hdf5::text_attribute(model, "file", run.problem.model.file);
  }
  {
    hdf5::Handle g = hdf5::create_group(file, "/scattering");
    const PlaneWave& wave = *run.problem.model.wave;
    hdf5::write_reals(file, "/scattering/wave_theta_deg", {}, {wave.theta * 180 / pi}, "deg");
    hdf5::write_reals(file, "/scattering/wave_phi_deg", {}, {wave.phi * 180 / pi}, "deg");
    hdf5::write_reals(file, "/scattering/wave_amplitude", {}, {wave.amplitude}, "V/m");
    hdf5::text_attribute(g, "polarization", wave.theta_polarized ? "theta" : "phi");
    const Axis theta = hdf5::real_axis(file, "/scattering", "theta", degrees(run.problem.model.pattern.thetas()), "deg (from +z)");
    const Axis phi = hdf5::real_axis(file, "/scattering", "phi", degrees(run.problem.model.pattern.phis()), "deg (from +x toward +y)");
    hdf5::write_reals(file, "/scattering/rcs_m2", {frequency, theta, phi}, rcs, "m2");
    hdf5::write_reals(file, "/scattering/monostatic_m2", {frequency}, monostatic, "m2");
    const auto& loads = run.problem.model.loads;
    if (!loads.empty()) {
      std::vector<std::string> names;
      std::vector<Real> powers;
      for (const auto& load : loads) names.push_back(load.name);
      for (const auto& r : run.results) powers.insert(powers.end(), r.load_power_w.begin(), r.load_power_w.end());
      const Axis load = hdf5::text_axis(file, "/scattering", "load", names);
      hdf5::write_reals(file, "/scattering/load_power_w", {frequency, load}, powers, "W (received by each load)");
    }
  }
  write_currents(file, run.problem, frequency, run.results);
  write_solver(file, run.problem, frequency, run.results);
  file.save(path);
}

}  // namespace lobe
