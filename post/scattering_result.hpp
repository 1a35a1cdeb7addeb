#pragma once
/// Radar cross-sections computed from the currents a plane wave drives on wires, plates and
/// bodies (in free space or over a ground), with the same far field as antennas.
#include <array>
#include <filesystem>
#include <string>
#include <vector>

#include "post/run_record.hpp"
#include "post/far_field.hpp"
#include "solver/antenna_problem.hpp"

namespace lobe {

struct ScatteringResult {
  Real frequency_hz = 0.0;
  std::vector<Real> thetas, phis;  ///< rad, the model's pattern grid
  Eigen::ArrayXXd rcs_m2;          ///< bistatic RCS on the grid (θ index, φ index), m²
  Real monostatic_m2 = 0.0;        ///< back toward the direction the wave comes from, m²
  std::vector<Real> load_power_w;  ///< received by each lumped load, W
  std::vector<std::array<Complex, 2>> segment_currents;  ///< A, at each segment's start and end
  std::vector<Eigen::Vector3cd> surface_currents;  ///< A/m at each triangle's centroid
  SolveReport report;
};

/// σ = 4π r² |E_s|² / |E_inc|² on the pattern grid and back toward the source
/// (OpenMP-parallel over directions). Over a ground, E_s is the field of the currents and
/// their images (the wave the bare ground reflects is not counted). Throws NumericalError
/// on non-finite values.
ScatteringResult evaluate_scattering(const AntennaProblem& problem, const FrequencySolution& solution);

/// Radar cross-section 4π |E_scattered|² at r = 1 m for a 1 V/m incident wave, m².
Real radar_cross_section(const FarFieldSample& scattered);

/// 10 log10(σ / 1 m²), floored at gain_floor_dbi.
Real to_dbsm(Real rcs_m2);

/// A run of scattering results with how it was run.
struct ScatteringRun {
  const AntennaProblem& problem;
  std::vector<ScatteringResult> results;
  RunInfo info;
};

/// One row per frequency and direction; header frequency_hz,theta_deg,phi_deg,rcs_m2,rcs_dbsm.
void write_scattering_csv(const std::filesystem::path& path, const ScatteringRun& run);
/// Per frequency the monostatic RCS and the largest bistatic RCS and where; with loads, the
/// power each receives and its effective area P / S_incident.
std::string scattering_summary(const ScatteringRun& run);

}  // namespace lobe
