#pragma once
/// Reads back what `lobe run` wrote, for commands that work on results (export, compare).
#include <filesystem>
#include <string>
#include <vector>

#include "geometry/model.hpp"
#include "post/band_report.hpp"
#include "post/beam_band_report.hpp"
#include "post/touchstone.hpp"

namespace lobe {

/// The port S-matrices and reference impedance of an antenna result file. Throws
/// InputError (at FILE:1:1) when the file is not a lobe antenna result.
/// `group` reads a case of a sweep file ("/case-000001"); empty reads a run's file.
NetworkData read_result_network(const std::filesystem::path& path, const std::string& group = "");

/// The port names of an antenna result file, in port order; `group` as above.
std::vector<std::string> read_result_port_names(const std::filesystem::path& path, const std::string& group = "");

/// One port's impedance at every frequency of an antenna result, as the run drove its
/// ports (the active impedance when several are driven); `group` as above.
struct PortImpedanceCurve {
  std::vector<Real> frequency_hz;
  std::vector<Complex> impedance;  ///< ohm
  Real reference_ohm = 50.0;
};
PortImpedanceCurve read_result_port_impedance(const std::filesystem::path& path, const std::string& group,
                                              std::size_t port);

/// The model behind a result: its source text, and the `let` values the run overrode as
/// --set options (NAME=VALUE in SI units), so that parsing gives the model that was solved.
struct ResultModel {
  std::string source;
  std::vector<std::string> set_options;
};
ResultModel read_result_model(const std::filesystem::path& path, const std::string& group = "");

/// The far field on a result's pattern grid, flat arrays indexed (frequency, θ, φ).
struct PatternData {
  std::vector<Real> frequency_hz, theta_deg, phi_deg;
  std::vector<Real> gain_dbi, rhcp_dbi, lhcp_dbi, axial_ratio_db;
  std::size_t at(std::size_t f, std::size_t t, std::size_t p) const {
    return (f * theta_deg.size() + t) * phi_deg.size() + p;
  }
};
PatternData read_result_pattern(const std::filesystem::path& path);

/// The main beam's figures per frequency (the /beam group); `group` as for
/// read_result_network. Throws InputError when the file has none (written before they were).
BeamCurves read_result_beam(const std::filesystem::path& path, const std::string& group = "");

/// A scatterer's radar cross-section: bistatic on the pattern grid, indexed
/// (frequency, θ, φ), and monostatic per frequency.
struct RcsData {
  std::vector<Real> frequency_hz, theta_deg, phi_deg, rcs_m2, monostatic_m2;
  Real wave_theta_deg = 0.0, wave_phi_deg = 0.0;  ///< where the wave comes from
  std::size_t at(std::size_t f, std::size_t t, std::size_t p) const {
    return (f * theta_deg.size() + t) * phi_deg.size() + p;
  }
};
/// Whether the file is a result of a model lit by a wave (it has /scattering).
bool is_scattering_result(const std::filesystem::path& path);
RcsData read_result_rcs(const std::filesystem::path& path);

/// The summary the run printed, as it stored it; empty for a file written before summaries
/// were stored. `group` as for read_result_network.
std::string read_result_summary(const std::filesystem::path& path, const std::string& group = "");

/// The first port's band figures of a result over `band`, and the beam's when `with_beam`
/// (without, they are absent); `group` as for read_result_network. Throws
/// std::invalid_argument when the band lies outside the result's frequencies.
BandFigures read_result_band_figures(const std::filesystem::path& path, const std::string& group, const Band& band,
                                     bool with_beam);

/// The bands of the model behind a result (the model's `band` statements and any --band);
/// `group` as for read_result_network.
std::vector<Band> read_result_bands(const std::filesystem::path& path, const std::string& group = "");

}  // namespace lobe
