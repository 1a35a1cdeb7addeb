#include "post/result_reader.hpp"

#include <cmath>
#include <cstdio>
#include <vector>

#include "core/input_error.hpp"
#include "post/hdf5_reading.hpp"

namespace lobe {

namespace {

/// Refuses NaN and infinite values: copied on into a Touchstone file or a chart they would
/// pass for results.
template <typename Value>
void require_finite(const std::vector<Value>& values, const std::string& name, const SourceLocation& where) {
  for (const Value& v : values)
    if (!std::isfinite(std::abs(v))) throw InputError(where, "'" + name + "' holds a value that is not a finite number");
}

}  // namespace

std::vector<std::string> read_result_port_names(const std::filesystem::path& path, const std::string& group) {
  const SourceLocation where{path.string(), 1, 1};
  Hdf5Handle file(open_hdf5_for_reading(path), H5Fclose);
  if (!hdf5_exists(file, group + "/ports/port"))
    throw InputError(where, "this is not a lobe antenna result (it has no /ports/port)");
  std::vector<hsize_t> dims, s_dims;
  std::vector<std::string> names = read_strings(file, group + "/ports/port", dims);
  read_complex(file, group + "/ports/s_matrix", s_dims);
  if (names.empty() || dims.size() != 1 || (s_dims.size() == 3 && s_dims[1] != names.size()))
    throw InputError(where, "the port names of this result do not match its ports");
  for (const std::string& name : names)
    if (name.empty()) throw InputError(where, "a port of this result has an empty name");
  return names;
}

PortImpedanceCurve read_result_port_impedance(const std::filesystem::path& path, const std::string& group,
                                              std::size_t port) {
  const SourceLocation where{path.string(), 1, 1};
  const std::size_t ports = read_result_port_names(path, group).size();
  Hdf5Handle file(open_hdf5_for_reading(path), H5Fclose);
  std::vector<hsize_t> f_dims, z_dims, z0_dims;
  PortImpedanceCurve curve;
  curve.frequency_hz = read_reals(file, group + "/frequency", f_dims);
  const std::vector<Complex> z = read_complex(file, group + "/ports/impedance_ohm", z_dims);
  const std::vector<Real> z0 = read_reals(file, group + "/model/reference_ohm", z0_dims);
  const std::size_t nf = curve.frequency_hz.size();
  if (nf == 0 || z.size() != nf * ports || z0.size() != 1 || !(z0[0] > 0.0))
    throw InputError(where, "the port impedances of this result are missing or do not fit its frequencies");
  require_finite(curve.frequency_hz, "/frequency", where);
  require_finite(z, "/ports/impedance_ohm", where);
  for (std::size_t f = 0; f < nf; ++f) {
    curve.impedance.push_back(z[f * ports + port]);
    if (f > 0 && !(curve.frequency_hz[f] > curve.frequency_hz[f - 1]))
      throw InputError(where, "the frequencies of this result do not ascend");
  }
  curve.reference_ohm = z0[0];
  return curve;
}

ResultModel read_result_model(const std::filesystem::path& path, const std::string& group) {
  const SourceLocation where{path.string(), 1, 1};
  Hdf5Handle file(open_hdf5_for_reading(path), H5Fclose);
  if (!hdf5_exists(file, group + "/model/source")) throw InputError(where, "this result holds no model source");
  ResultModel model;
  model.source = read_text(file, group + "/model/source");
  if (!hdf5_exists(file, group + "/model/value")) return model;
  std::vector<hsize_t> dims;
  const std::vector<std::string> names = read_strings(file, group + "/model/value", dims);
  const std::vector<std::string> units = read_strings(file, group + "/model/value_units", dims);
  const std::vector<Real> values = read_reals(file, group + "/model/values", dims);
  const std::vector<Real> overridden = read_reals(file, group + "/model/value_overridden", dims);
  if (units.size() != names.size() || values.size() != names.size() || overridden.size() != names.size())
    throw InputError(where, "the model values of this result do not fit their names");
  char text[64];
  for (std::size_t i = 0; i < names.size(); ++i) {
    if (overridden[i] == 0.0) continue;
    if (!std::isfinite(values[i])) throw InputError(where, "a model value of this result is not a finite number");
    std::snprintf(text, sizeof text, "%.17g", values[i]);
    model.set_options.push_back(names[i] + "=" + text + (units[i].empty() ? "" : " " + units[i]));
  }
  return model;
}

PatternData read_result_pattern(const std::filesystem::path& path) {
  Hdf5Handle file(open_hdf5_for_reading(path), H5Fclose);
  if (!hdf5_exists(file, "/pattern/gain_dbi"))
    throw InputError({path.string(), 1, 1}, "this is not a lobe antenna result (it has no /pattern)");
  PatternData d;
  std::vector<hsize_t> dims;
  d.frequency_hz = read_reals(file, "/frequency", dims);
  d.theta_deg = read_reals(file, "/pattern/theta", dims);
  d.phi_deg = read_reals(file, "/pattern/phi", dims);
  d.gain_dbi = read_reals(file, "/pattern/gain_dbi", dims);
  d.rhcp_dbi = read_reals(file, "/pattern/rhcp_dbi", dims);
  d.lhcp_dbi = read_reals(file, "/pattern/lhcp_dbi", dims);
  d.axial_ratio_db = read_reals(file, "/pattern/axial_ratio_db", dims);
  const SourceLocation where{path.string(), 1, 1};
  const std::size_t points = d.frequency_hz.size() * d.theta_deg.size() * d.phi_deg.size();
  if (points == 0 || d.gain_dbi.size() != points || d.rhcp_dbi.size() != points || d.lhcp_dbi.size() != points ||
      d.axial_ratio_db.size() != points)
    throw InputError(where, "the pattern arrays of this result are empty or do not fit its grid");
  for (const auto* values : {&d.frequency_hz, &d.theta_deg, &d.phi_deg, &d.gain_dbi, &d.rhcp_dbi, &d.lhcp_dbi, &d.axial_ratio_db})
    require_finite(*values, "/pattern", where);
  return d;
}

std::string read_result_summary(const std::filesystem::path& path, const std::string& group) {
  Hdf5Handle file(open_hdf5_for_reading(path), H5Fclose);
  if (!hdf5_exists(file, group + "/summary")) return "";
  return read_text(file, group + "/summary");
}

bool is_scattering_result(const std::filesystem::path& path) {
  Hdf5Handle file(open_hdf5_for_reading(path), H5Fclose);
  return hdf5_exists(file, "/scattering/rcs_m2");
}

RcsData read_result_rcs(const std::filesystem::path& path) {
  const SourceLocation where{path.string(), 1, 1};
  Hdf5Handle file(open_hdf5_for_reading(path), H5Fclose);
  std::vector<hsize_t> dims;
  RcsData d;
  d.frequency_hz = read_reals(file, "/frequency", dims);
  d.theta_deg = read_reals(file, "/scattering/theta", dims);
  d.phi_deg = read_reals(file, "/scattering/phi", dims);
  d.rcs_m2 = read_reals(file, "/scattering/rcs_m2", dims);
  d.monostatic_m2 = read_reals(file, "/scattering/monostatic_m2", dims);
  auto wave_theta = read_reals(file, "/scattering/wave_theta_deg", dims);
  auto wave_phi = read_reals(file, "/scattering/wave_phi_deg", dims);
  const std::size_t points = d.frequency_hz.size() * d.theta_deg.size() * d.phi_deg.size();
  if (points == 0 || d.rcs_m2.size() != points || d.monostatic_m2.size() != d.frequency_hz.size() || wave_theta.size() != 1 ||
      wave_phi.size() != 1)
    throw InputError(where, "this is not a lobe scattering result (its /scattering arrays are missing or do not fit)");
  for (const auto* values : {&d.frequency_hz, &d.theta_deg, &d.phi_deg, &d.rcs_m2, &d.monostatic_m2, &wave_theta, &wave_phi})
    require_finite(*values, "/scattering", where);
  d.wave_theta_deg = wave_theta.front();
  d.wave_phi_deg = wave_phi.front();
  return d;
}

BeamCurves read_result_beam(const std::filesystem::path& path, const std::string& group) {
  const SourceLocation where{path.string(), 1, 1};
  Hdf5Handle file(open_hdf5_for_reading(path), H5Fclose);
  std::vector<hsize_t> dims;
  BeamCurves curves;
  curves.frequency_hz = read_reals(file, group + "/frequency", dims);
  require_finite(curves.frequency_hz, "/frequency", where);
  for (const auto& kind : beam_figure_kinds()) {
    const std::string name = group + "/beam/" + kind.dataset;
    if (!hdf5_exists(file, name))
      throw InputError(where, "this result has no beam figures (" + name + "): run the model again with this version");
    const std::vector<Real> values = read_reals(file, name, dims);
    std::vector<Real> defined(values.size(), 1.0);
    if (hdf5_exists(file, name + "_defined")) defined = read_reals(file, name + "_defined", dims);
    if (values.size() != curves.frequency_hz.size() || defined.size() != values.size())
      throw InputError(where, "the beam figure " + name + " does not have one value per frequency");
    require_finite(values, name, where);
    auto& curve = curves.values[kind.name];
    for (std::size_t k = 0; k < values.size(); ++k)
      curve.push_back(defined[k] != 0.0 ? std::optional<Real>(values[k]) : std::nullopt);
  }
  curves.peak_theta_deg = read_reals(file, group + "/beam/peak_theta_deg", dims);
  curves.peak_phi_deg = read_reals(file, group + "/beam/peak_phi_deg", dims);
  if (curves.peak_theta_deg.size() != curves.frequency_hz.size() || curves.peak_phi_deg.size() != curves.frequency_hz.size())
    throw InputError(where, "the beam directions of this result do not have one value per frequency");
  require_finite(curves.peak_theta_deg, "/beam/peak_theta_deg", where);
  require_finite(curves.peak_phi_deg, "/beam/peak_phi_deg", where);
  return curves;
}

BandFigures read_result_band_figures(const std::filesystem::path& path, const std::string& group, const Band& band,
                                     bool with_beam) {
  const NetworkData network = read_result_network(path, group);
  ReflectionCurve curve{network.frequency_hz, {}};
  for (const auto& s : network.s) curve.reflection.push_back(s(0, 0));
  const BeamCurves beam = with_beam ? read_result_beam(path, group) : BeamCurves{network.frequency_hz, {}, {}, {}};
  return band_figures(curve, beam, band.low_hz, band.high_hz);
}

std::vector<Band> read_result_bands(const std::filesystem::path& path, const std::string& group) {
  Hdf5Handle file(open_hdf5_for_reading(path), H5Fclose);
  if (!hdf5_exists(file, group + "/model/band")) return {};
  std::vector<hsize_t> dims;
  const std::vector<std::string> names = read_strings(file, group + "/model/band", dims);
  const std::vector<Real> edges = read_reals(file, group + "/model/band_edges_hz", dims);
  std::vector<Band> bands;
  for (std::size_t b = 0; b < names.size() && 2 * b + 1 < edges.size(); ++b)
    if (std::isfinite(edges[2 * b]) && std::isfinite(edges[2 * b + 1]) && edges[2 * b] > 0.0 && edges[2 * b] <= edges[2 * b + 1])
      bands.push_back({names[b], edges[2 * b], edges[2 * b + 1]});
  return bands;
}

NetworkData read_result_network(const std::filesystem::path& path, const std::string& group) {
  const SourceLocation where{path.string(), 1, 1};
  Hdf5Handle file(open_hdf5_for_reading(path), H5Fclose);
  std::vector<hsize_t> f_dims, s_dims, r_dims;
  if (!group.empty() && !hdf5_exists(file, group)) throw InputError(where, "the file has no group '" + group + "'");
  const std::vector<Real> frequencies = read_reals(file, group + "/frequency", f_dims);
  const std::vector<Complex> s_matrix = read_complex(file, group + "/ports/s_matrix", s_dims);
  const std::vector<Real> reference = read_reals(file, group + "/model/reference_ohm", r_dims);
  if (frequencies.empty() || s_matrix.empty() || s_dims.size() != 3 || s_dims[0] != frequencies.size() || s_dims[1] == 0 ||
      s_dims[1] != s_dims[2] || reference.size() != 1)
    throw InputError(where, "this is not a lobe antenna result (it lacks /ports/s_matrix and its companions)");
  require_finite(frequencies, "/frequency", where);
  require_finite(s_matrix, "/ports/s_matrix", where);
  for (std::size_t k = 0; k < frequencies.size(); ++k)
    if (!(frequencies[k] > 0.0) || (k > 0 && !(frequencies[k] > frequencies[k - 1])))
      throw InputError(where, "the frequencies of this result are not positive and ascending");
  if (!(std::isfinite(reference.front()) && reference.front() > 0.0))
    throw InputError(where, "the reference impedance of this result is not a positive number");
  NetworkData data;
  data.reference_ohm = reference.front();
  data.frequency_hz = frequencies;
  const auto n = static_cast<Eigen::Index>(s_dims[1]);
  for (std::size_t k = 0; k < frequencies.size(); ++k) {
    ComplexMatrix s(n, n);
    for (Eigen::Index i = 0; i < n; ++i)
      for (Eigen::Index j = 0; j < n; ++j) {
        const std::size_t at = (k * n + i) * n + j;
        s(i, j) = s_matrix[at];
      }
    data.s.push_back(s);
  }
  return data;
}

}  // namespace lobe
