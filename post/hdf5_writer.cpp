#include "post/hdf5_writer.hpp"

#include <hdf5.h>

#include <algorithm>
#include <functional>
#include <stdexcept>
#include <vector>

#include "core/constants.hpp"
#include "post/hdf5_handle.hpp"
#include "post/band_report.hpp"
#include "post/beam_band_report.hpp"
#include "post/hdf5_memory_file.hpp"
#include "post/run_summary.hpp"
#include "post/scattering_result.hpp"

namespace lobe {
namespace {

using Handle = Hdf5Handle;

void check(herr_t status) {
  if (status < 0) throw std::runtime_error("HDF5 write failed");
}

void string_attribute(hid_t object, const char* name, const std::string& value) {
  Handle type(H5Tcopy(H5T_C_S1), H5Tclose);
  check(H5Tset_size(type, std::max<std::size_t>(1, value.size())));
  Handle space(H5Screate(H5S_SCALAR), H5Sclose);
  Handle attribute(H5Acreate2(object, name, type, space, H5P_DEFAULT, H5P_DEFAULT), H5Aclose);
  check(H5Awrite(attribute, type, value.c_str()));
}

void int_attribute(hid_t object, const char* name, long value) {
  Handle space(H5Screate(H5S_SCALAR), H5Sclose);
  Handle attribute(H5Acreate2(object, name, H5T_NATIVE_LONG, space, H5P_DEFAULT, H5P_DEFAULT), H5Aclose);
  check(H5Awrite(attribute, H5T_NATIVE_LONG, &value));
}

void write_reals(hid_t group, const char* name, const std::vector<hsize_t>& dims, const std::vector<Real>& data,
                 const std::string& unit) {
  Handle space(H5Screate_simple(static_cast<int>(dims.size()), dims.data(), nullptr), H5Sclose);
  Handle set(H5Dcreate2(group, name, H5T_IEEE_F64LE, space, H5P_DEFAULT, H5P_DEFAULT, H5P_DEFAULT), H5Dclose);
  if (!data.empty()) check(H5Dwrite(set, H5T_NATIVE_DOUBLE, H5S_ALL, H5S_ALL, H5P_DEFAULT, data.data()));
  string_attribute(set, "unit", unit);
}

void write_ints(hid_t group, const char* name, const std::vector<hsize_t>& dims, const std::vector<int>& data) {
  Handle space(H5Screate_simple(static_cast<int>(dims.size()), dims.data(), nullptr), H5Sclose);
  Handle set(H5Dcreate2(group, name, H5T_STD_I32LE, space, H5P_DEFAULT, H5P_DEFAULT, H5P_DEFAULT), H5Dclose);
  if (!data.empty()) check(H5Dwrite(set, H5T_NATIVE_INT, H5S_ALL, H5S_ALL, H5P_DEFAULT, data.data()));
}

void write_strings(hid_t group, const char* name, const std::vector<std::string>& values) {
  Handle type(H5Tcopy(H5T_C_S1), H5Tclose);
  check(H5Tset_size(type, H5T_VARIABLE));
  const hsize_t dims[1] = {values.size()};
  Handle space(H5Screate_simple(1, dims, nullptr), H5Sclose);
  Handle set(H5Dcreate2(group, name, type, space, H5P_DEFAULT, H5P_DEFAULT, H5P_DEFAULT), H5Dclose);
  std::vector<const char*> pointers;
  for (const auto& v : values) pointers.push_back(v.c_str());
  if (!values.empty()) check(H5Dwrite(set, type, H5S_ALL, H5S_ALL, H5P_DEFAULT, pointers.data()));
}

void write_string(hid_t group, const char* name, const std::string& value) {
  Handle type(H5Tcopy(H5T_C_S1), H5Tclose);
  check(H5Tset_size(type, std::max<std::size_t>(1, value.size())));
  Handle space(H5Screate(H5S_SCALAR), H5Sclose);
  Handle set(H5Dcreate2(group, name, type, space, H5P_DEFAULT, H5P_DEFAULT, H5P_DEFAULT), H5Dclose);
  check(H5Dwrite(set, type, H5S_ALL, H5S_ALL, H5P_DEFAULT, value.c_str()));
}

Handle group(hid_t parent, const char* name) {
  return Handle(H5Gcreate2(parent, name, H5P_DEFAULT, H5P_DEFAULT, H5P_DEFAULT), H5Gclose);
}

/// Gathers one value per (frequency, item) into a flat frequency-major array.
std::vector<Real> per_frequency(const RunRecord& run, std::size_t items,
                                const std::function<Real(const FrequencyResult&, std::size_t)>& value) {
  std::vector<Real> data;
  data.reserve(run.results.size() * items);
  for (const auto& r : run.results)
    for (std::size_t i = 0; i < items; ++i) data.push_back(value(r, i));
  return data;
}

void write_model(hid_t file, const RunRecord& run) {
  const Model& model = run.problem.model;
  Handle g = group(file, "model");
  write_string(g, "source", model.text);
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
  write_strings(g, "warnings", warnings);
  write_strings(g, "value_names", names);
  write_reals(g, "values", {values.size()}, values, "SI, per value_units");
  write_strings(g, "value_units", units);
  write_ints(g, "value_overridden", {overridden.size()}, overridden);
  string_attribute(g, "file", model.file);
  string_attribute(g, "ground", run.problem.medium.name());
  if (run.problem.medium.has_real_ground()) string_attribute(g, "ground_method", run.problem.medium.ground_method());
  if (const auto& board = model.substrate) {
    string_attribute(g, "substrate", board->name);
    write_reals(g, "substrate_thickness_m", {1}, {board->thickness}, "m");
    write_reals(g, "substrate_permittivity", {1}, {board->permittivity}, "1");
    write_reals(g, "substrate_loss_tangent", {1}, {board->loss_tangent}, "1");
  }
  write_reals(g, "reference_ohm", {1}, {model.reference_ohm}, "ohm");
  if (const auto& soil = model.real_ground) {
    write_reals(g, "ground_permittivity", {1}, {soil->permittivity}, "1 (relative)");
    write_reals(g, "ground_conductivity_s_per_m", {1}, {soil->conductivity}, "S/m");
  }
  std::vector<std::string> band_names;
  std::vector<Real> band_edges;
  for (const auto& b : model.bands) {
    band_names.push_back(b.name);
    band_edges.insert(band_edges.end(), {b.low_hz, b.high_hz});
  }
  write_strings(g, "band_names", band_names);
  write_reals(g, "band_edges_hz", {model.bands.size(), 2}, band_edges, "Hz (low, high)");
}

void write_ports(hid_t file, const RunRecord& run) {
  const Model& model = run.problem.model;
  const std::size_t np = model.ports.size(), nf = run.results.size();
  Handle g = group(file, "ports");
  std::vector<std::string> names;
  for (const auto& p : model.ports) names.push_back(p.name);
  write_strings(g, "names", names);
  const std::vector<hsize_t> dims{nf, np};
  auto port = [&](const char* name, const char* unit, const std::function<Real(const PortResult&)>& f) {
    write_reals(g, name, dims, per_frequency(run, np, [&](const FrequencyResult& r, std::size_t i) { return f(r.ports[i]); }), unit);
  };
  port("resistance_ohm", "ohm", [](const PortResult& p) { return p.impedance.real(); });
  port("reactance_ohm", "ohm", [](const PortResult& p) { return p.impedance.imag(); });
  port("vswr", "1", [](const PortResult& p) { return p.vswr; });
  port("return_loss_db", "dB", [](const PortResult& p) { return p.return_loss_db; });
  port("mismatch_loss_db", "dB", [](const PortResult& p) { return p.mismatch_loss_db; });
  port("reflection_re", "1", [](const PortResult& p) { return p.reflection.real(); });
  port("reflection_im", "1", [](const PortResult& p) { return p.reflection.imag(); });
  port("voltage_re", "V", [](const PortResult& p) { return p.voltage.real(); });
  port("voltage_im", "V", [](const PortResult& p) { return p.voltage.imag(); });
  port("current_re", "A", [](const PortResult& p) { return p.current.real(); });
  port("current_im", "A", [](const PortResult& p) { return p.current.imag(); });
  const std::vector<hsize_t> square{nf, np, np};
  auto matrix = [&](const char* name, const char* unit, const std::function<Real(const FrequencyResult&, std::size_t)>& f) {
    write_reals(g, name, square, per_frequency(run, np * np, f), unit);
  };
  // Row-major [port i, port j] within each frequency.
  matrix("z_matrix_re", "ohm", [np](const FrequencyResult& r, std::size_t k) { return r.z_matrix(k / np, k % np).real(); });
  matrix("z_matrix_im", "ohm", [np](const FrequencyResult& r, std::size_t k) { return r.z_matrix(k / np, k % np).imag(); });
  matrix("s_matrix_re", "1", [np](const FrequencyResult& r, std::size_t k) { return r.s_matrix(k / np, k % np).real(); });
  matrix("s_matrix_im", "1", [np](const FrequencyResult& r, std::size_t k) { return r.s_matrix(k / np, k % np).imag(); });
}

/// The feed network: where it meets the antenna (impedance seen there, as for a port) and
/// the power each of its elements takes.
void write_network(hid_t file, const RunRecord& run) {
  const FeedNetwork& network = run.problem.network;
  if (network.empty()) return;
  Handle g = group(file, "network");
  const std::vector<int> ends = network.antenna_ends();
  std::vector<std::string> places, elements;
  for (int t : ends) places.push_back(network.terminals()[t].label);
  for (std::size_t e = 0; e < network.element_count(); ++e) elements.push_back(network.element_name(e));
  write_strings(g, "antenna_end_places", places);
  const std::size_t nf = run.results.size(), ne = ends.size();
  auto end = [&](const char* name, const char* unit, const std::function<Real(const PortResult&)>& f) {
    write_reals(g, name, {nf, ne}, per_frequency(run, ne, [&](const FrequencyResult& r, std::size_t i) { return f(r.antenna_ends[i]); }), unit);
  };
  end("antenna_end_resistance_ohm", "ohm", [](const PortResult& p) { return p.impedance.real(); });
  end("antenna_end_reactance_ohm", "ohm", [](const PortResult& p) { return p.impedance.imag(); });
  end("antenna_end_vswr", "1", [](const PortResult& p) { return p.vswr; });
  end("antenna_end_return_loss_db", "dB", [](const PortResult& p) { return p.return_loss_db; });
  write_strings(g, "element_names", elements);
  write_reals(g, "element_power_w", {nf, elements.size()},
              per_frequency(run, elements.size(), [](const FrequencyResult& r, std::size_t e) { return r.network_powers[e]; }),
              "W (into the element: a line's or stub's loss, a part's dissipation)");
}

void write_power(hid_t file, const RunRecord& run) {
  Handle g = group(file, "power");
  const std::vector<hsize_t> dims{run.results.size()};
  auto power = [&](const char* name, const char* unit, const std::function<Real(const PowerBudget&)>& f) {
    write_reals(g, name, dims, per_frequency(run, 1, [&](const FrequencyResult& r, std::size_t) { return f(r.power); }), unit);
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

/// The main beam's figures per frequency (post/beam_figures.hpp), under the names of
/// beam_figure_kinds; where a figure is undefined at some frequency (the back of a beam at
/// the zenith over a ground plane), its `_defined` array says where (1) and where not (0,
/// the value then 0).
void write_beam(hid_t file, const RunRecord& run) {
  Handle g = group(file, "beam");
  const std::size_t nf = run.results.size();
  const BeamCurves curves = beam_curves(run.results);
  for (const auto& kind : beam_figure_kinds()) {
    const auto& values = curves.values.at(kind.name);
    std::vector<Real> data;
    std::vector<int> defined;
    for (const auto& v : values) {
      data.push_back(v.value_or(0.0));
      defined.push_back(v.has_value());
    }
    write_reals(g, kind.dataset.c_str(), {nf}, data, kind.unit + " (" + kind.title + ")");
    if (std::count(defined.begin(), defined.end(), 0) > 0)
      write_ints(g, (kind.dataset + "_defined").c_str(), {nf}, defined);
  }
  auto degrees = [&](const char* name, const char* unit, const std::function<Real(const FrequencyResult&)>& f) {
    write_reals(g, name, {nf}, per_frequency(run, 1, [&](const FrequencyResult& r, std::size_t) { return f(r) * 180 / pi; }), unit);
  };
  degrees("peak_theta_deg", "deg (the pattern grid's direction of peak gain)", [](const FrequencyResult& r) { return r.beam.peak.theta; });
  degrees("peak_phi_deg", "deg", [](const FrequencyResult& r) { return r.beam.peak.phi; });
  degrees("polarization_theta_deg", "deg (where the polarisation figures are taken)",
          [](const FrequencyResult& r) { return r.polarization.toward.theta; });
  degrees("polarization_phi_deg", "deg", [](const FrequencyResult& r) { return r.polarization.toward.phi; });
  std::vector<int> hands;
  for (const auto& r : run.results) hands.push_back(static_cast<int>(r.polarization.hand));
  write_ints(g, "hand", {nf}, hands);
}

/// Every named band figure (band_report.hpp) of every band of the model (its `band`
/// statements and any --band): the port figures per port (bands × ports), the beam figures
/// per band; a `_defined` array marks with 0 where a figure is not defined (a band no
/// computed frequency reaches, the back of a zenith beam), the value there being 0.
void write_band_figures(hid_t file, const RunRecord& run) {
  const auto& bands = run.problem.model.bands;
  if (bands.empty()) return;
  Handle g = group(file, "band_figures");
  std::vector<std::string> names;
  for (const auto& b : bands) names.push_back(b.name);
  write_strings(g, "band_names", names);
  const std::size_t np = run.problem.model.ports.size();
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
    std::string dataset = name;
    std::replace(dataset.begin(), dataset.end(), '-', '_');
    const std::vector<hsize_t> dims = per_port ? std::vector<hsize_t>{bands.size(), np} : std::vector<hsize_t>{bands.size()};
    write_reals(g, dataset.c_str(), dims, values, band_figure_title(name) + (per_port ? ", per band and port" : ", per band"));
    if (std::count(defined.begin(), defined.end(), 0) > 0) write_ints(g, (dataset + "_defined").c_str(), dims, defined);
  }
}

void write_pattern(hid_t file, const RunRecord& run) {
  Handle g = group(file, "pattern");
  const PatternGrid& grid = run.problem.model.pattern;
  std::vector<Real> thetas = grid.thetas(), phis = grid.phis();
  for (auto& t : thetas) t *= 180.0 / pi;
  for (auto& p : phis) p *= 180.0 / pi;
  write_reals(g, "theta_deg", {thetas.size()}, thetas, "deg");
  write_reals(g, "phi_deg", {phis.size()}, phis, "deg");
  const std::size_t nt = thetas.size(), np = phis.size();
  const std::vector<hsize_t> dims{run.results.size(), nt, np};
  auto field = [&](const char* name, const char* unit, const std::function<Real(const PatternResult&, Eigen::Index, Eigen::Index)>& f) {
    write_reals(g, name, dims, per_frequency(run, nt * np, [&](const FrequencyResult& r, std::size_t k) {
                  return f(r.pattern, static_cast<Eigen::Index>(k / np), static_cast<Eigen::Index>(k % np));
                }), unit);
  };
  field("gain_dbi", "dBi", [](const PatternResult& p, auto i, auto j) { return p.gain_dbi(i, j); });
  field("directivity_dbi", "dBi", [](const PatternResult& p, auto i, auto j) { return p.directivity_dbi(i, j); });
  field("realized_gain_dbi", "dBi", [](const PatternResult& p, auto i, auto j) { return p.realized_gain_dbi(i, j); });
  field("rhcp_dbi", "dBi", [](const PatternResult& p, auto i, auto j) { return p.rhcp_dbi(i, j); });
  field("lhcp_dbi", "dBi", [](const PatternResult& p, auto i, auto j) { return p.lhcp_dbi(i, j); });
  field("axial_ratio_db", "dB", [](const PatternResult& p, auto i, auto j) { return p.axial_ratio_db(i, j); });
  field("hand", "+1 right, -1 left, 0 linear", [](const PatternResult& p, auto i, auto j) { return Real(p.hand(i, j)); });
  field("e_theta_re", "V (r = 1 m)", [](const PatternResult& p, auto i, auto j) { return p.e_theta(i, j).real(); });
  field("e_theta_im", "V (r = 1 m)", [](const PatternResult& p, auto i, auto j) { return p.e_theta(i, j).imag(); });
  field("e_phi_re", "V (r = 1 m)", [](const PatternResult& p, auto i, auto j) { return p.e_phi(i, j).real(); });
  field("e_phi_im", "V (r = 1 m)", [](const PatternResult& p, auto i, auto j) { return p.e_phi(i, j).imag(); });
}

/// The triangle mesh and, per frequency, the current density at each centroid.
void write_surface_currents(hid_t g, const SurfaceMeshReport& surfaces,
                            const std::vector<const std::vector<Eigen::Vector3cd>*>& densities) {
  const std::size_t nt = surfaces.mesh.triangles.size();
  if (nt == 0) return;
  std::vector<Real> vertices;
  std::vector<int> corners;
  for (const Vec3& v : surfaces.mesh.vertices) vertices.insert(vertices.end(), {v.x(), v.y(), v.z()});
  for (const auto& t : surfaces.mesh.triangles) corners.insert(corners.end(), t.begin(), t.end());
  write_reals(g, "vertex_m", {surfaces.mesh.vertices.size(), 3}, vertices, "m");
  write_ints(g, "triangle_vertices", {nt, 3}, corners);
  write_ints(g, "triangle_object", {nt}, surfaces.region);
  for (int part = 0; part < 2; ++part) {
    std::vector<Real> values;
    for (const auto* density : densities)
      for (const auto& j : *density)
        for (int c = 0; c < 3; ++c) values.push_back(part ? j[c].imag() : j[c].real());
    write_reals(g, part ? "surface_density_im_a_per_m" : "surface_density_re_a_per_m", {densities.size(), nt, 3},
                values, "A/m (at the triangle centroid)");
  }
}

/// The segments and triangles with, per frequency, the current at each segment's ends and
/// the surface density at each triangle's centroid.
void write_currents(hid_t file, const AntennaProblem& problem,
                    const std::vector<const std::vector<std::array<Complex, 2>>*>& segment_currents,
                    const std::vector<const std::vector<Eigen::Vector3cd>*>& densities) {
  Handle g = group(file, "currents");
  const auto& segments = problem.mesh.segments;
  const std::size_t ns = segments.size();
  std::vector<Real> starts, ends, radii;
  std::vector<int> wires;
  for (const auto& s : segments) {
    for (int c = 0; c < 3; ++c) starts.push_back(s.start[c]);
    for (int c = 0; c < 3; ++c) ends.push_back(s.end[c]);
    radii.push_back(s.radius);
    wires.push_back(s.wire);
  }
  write_reals(g, "segment_start_m", {ns, 3}, starts, "m");
  write_reals(g, "segment_end_m", {ns, 3}, ends, "m");
  write_reals(g, "radius_m", {ns}, radii, "m");
  write_ints(g, "wire", {ns}, wires);
  const std::vector<hsize_t> dims{segment_currents.size(), ns};
  for (int end = 0; end < 2; ++end)
    for (int part = 0; part < 2; ++part) {
      const std::string name = std::string(end ? "end" : "start") + (part ? "_im_a" : "_re_a");
      std::vector<Real> values;
      for (const auto* currents : segment_currents)
        for (const auto& c : *currents) values.push_back(part ? c[end].imag() : c[end].real());
      write_reals(g, name.c_str(), dims, values, "A (along the segment)");
    }
  write_surface_currents(g, problem.surfaces, densities);
}

void write_currents(hid_t file, const RunRecord& run) {
  std::vector<const std::vector<std::array<Complex, 2>>*> segment_currents;
  std::vector<const std::vector<Eigen::Vector3cd>*> densities;
  for (const auto& r : run.results) {
    segment_currents.push_back(&r.segment_currents);
    densities.push_back(&r.surface_currents);
  }
  write_currents(file, run.problem, segment_currents, densities);
}

/// What made the file and the conventions its numbers follow, as root attributes.
void write_run_attributes(hid_t file, const RunInfo& info) {
  string_attribute(file, "program", "lobe");
  string_attribute(file, "version", info.version);
  int_attribute(file, "threads", info.threads);
  int_attribute(file, "processes", info.processes);
  string_attribute(file, "command_line", info.command_line);
  string_attribute(file, "time_convention", "exp(+j omega t)");
  string_attribute(file, "angles", "theta from +z, phi from +x toward +y");
}

}  // namespace

void write_hdf5(const std::filesystem::path& path, const RunRecord& run) {
  Hdf5MemoryFile file;
  write_run_attributes(file, run.info);
  // The summary as the run printed it, for reports.
  write_string(file, "summary", run_summary(run));
  const std::vector<hsize_t> nf{run.results.size()};
  write_reals(file, "frequency_hz", nf, per_frequency(run, 1, [](const FrequencyResult& r, std::size_t) { return r.frequency_hz; }), "Hz");
  write_model(file, run);
  write_ports(file, run);
  write_power(file, run);
  write_network(file, run);
  write_pattern(file, run);
  write_beam(file, run);
  write_band_figures(file, run);
  write_currents(file, run);
  Handle solver = group(file, "solver");
  write_reals(solver, "reciprocal_condition", nf, per_frequency(run, 1, [](const FrequencyResult& r, std::size_t) { return r.report.reciprocal_condition; }), "1");
  write_reals(solver, "relative_residual", nf, per_frequency(run, 1, [](const FrequencyResult& r, std::size_t) { return r.report.relative_residual; }), "1");
  // 1 where the frequency was solved in full, 0 where an adaptive sweep interpolated it
  // (its condition and residual are then the nearest solve's).
  std::vector<int> solved;
  for (const auto& r : run.results) solved.push_back(r.interpolated ? 0 : 1);
  write_ints(solver, "solved", nf, solved);
  int_attribute(solver, "unknowns", run.problem.unknowns());
  int_attribute(solver, "segments", static_cast<long>(run.problem.mesh.segments.size()));
  file.save(path);
}

void write_scattering_hdf5(const std::filesystem::path& path, const ScatteringRun& run) {
  Hdf5MemoryFile file;
  write_run_attributes(file, run.info);
  write_string(file, "summary", scattering_summary(run));
  const std::size_t nf = run.results.size();
  std::vector<Real> frequencies, monostatic, rcs, rcond, residual;
  for (const auto& r : run.results) {
    frequencies.push_back(r.frequency_hz);
    monostatic.push_back(r.monostatic_m2);
    rcond.push_back(r.report.reciprocal_condition);
    residual.push_back(r.report.relative_residual);
    for (Eigen::Index i = 0; i < r.rcs_m2.rows(); ++i)
      for (Eigen::Index j = 0; j < r.rcs_m2.cols(); ++j) rcs.push_back(r.rcs_m2(i, j));
  }
  write_reals(file, "frequency_hz", {nf}, frequencies, "Hz");
  {
    Handle model = group(file, "model");
    write_string(model, "source", run.problem.model.text);
    string_attribute(model, "file", run.problem.model.file);
  }
  {
    Handle g = group(file, "scattering");
    const PlaneWave& wave = *run.problem.model.wave;
    write_reals(g, "wave_theta_deg", {1}, {wave.theta * 180 / pi}, "deg");
    write_reals(g, "wave_phi_deg", {1}, {wave.phi * 180 / pi}, "deg");
    write_reals(g, "wave_amplitude", {1}, {wave.amplitude}, "V/m");
    string_attribute(g, "polarization", wave.theta_polarized ? "theta" : "phi");
    std::vector<Real> thetas = run.problem.model.pattern.thetas(), phis = run.problem.model.pattern.phis();
    for (auto& t : thetas) t *= 180 / pi;
    for (auto& p : phis) p *= 180 / pi;
    write_reals(g, "theta_deg", {thetas.size()}, thetas, "deg");
    write_reals(g, "phi_deg", {phis.size()}, phis, "deg");
    write_reals(g, "rcs_m2", {nf, thetas.size(), phis.size()}, rcs, "m2");
    write_reals(g, "monostatic_m2", {nf}, monostatic, "m2");
    const auto& loads = run.problem.model.loads;
    if (!loads.empty()) {
      std::vector<std::string> names;
      std::vector<Real> powers;
      for (const auto& load : loads) names.push_back(load.name);
      for (const auto& r : run.results) powers.insert(powers.end(), r.load_power_w.begin(), r.load_power_w.end());
      write_strings(g, "load_names", names);
      write_reals(g, "load_power_w", {nf, loads.size()}, powers, "W (received by each load)");
    }
  }
  {
    std::vector<const std::vector<std::array<Complex, 2>>*> segment_currents;
    std::vector<const std::vector<Eigen::Vector3cd>*> densities;
    for (const auto& r : run.results) {
      segment_currents.push_back(&r.segment_currents);
      densities.push_back(&r.surface_currents);
    }
    write_currents(file, run.problem, segment_currents, densities);
  }
  Handle solver = group(file, "solver");
  write_reals(solver, "reciprocal_condition", {nf}, rcond, "1");
  write_reals(solver, "relative_residual", {nf}, residual, "1");
  int_attribute(solver, "unknowns", run.problem.unknowns());
  file.save(path);
}

}  // namespace lobe
