#pragma once
/// One self-describing HDF5 file per run.
#include <filesystem>

#include "post/run_record.hpp"

namespace lobe {

/// Layout (arrays indexed frequency first; every numeric dataset has a "unit" attribute):
///   /frequency_hz
///   /model/source, /model/value_names, /model/values, /model/value_units, and on a substrate
///   /model/substrate_{thickness_m, permittivity, loss_tangent} with its name as an attribute
///   /ports/names, /ports/{resistance_ohm, reactance_ohm, vswr, return_loss_db, ...}
///   /ports/{z_matrix,s_matrix}_{re,im}           [f, port, port]
///   /power/{accepted_w, radiated_w, conductor_loss_w, load_loss_w, surface_wave_w, dielectric_loss_w,
///           efficiency, balance_miss}
///   /pattern/{theta_deg, phi_deg}, /pattern/{gain_dbi, rhcp_dbi, ...} [f, θ, φ]
///   /currents/{segment_start_m, segment_end_m, radius_m, wire}, /currents/{start,end}_{re,im}_a [f, segment]
///   /solver/{reciprocal_condition, relative_residual, solved (1: solved in full, 0: interpolated)}
/// Root attributes: program, version, threads, command_line, time_convention.
void write_hdf5(const std::filesystem::path& path, const RunRecord& run);

struct ScatteringRun;
/// A scattering run: /frequency_hz, /model/source, /scattering/{wave_*, theta_deg, phi_deg,
/// rcs_m2 [f, θ, φ], monostatic_m2 [f]}, /mesh/{vertices_m, triangles, region}, /solver/...
void write_scattering_hdf5(const std::filesystem::path& path, const ScatteringRun& run);

}  // namespace lobe
