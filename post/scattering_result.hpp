#pragma once
/// Radar cross-sections computed from the solved surface currents.
#include <filesystem>
#include <string>
#include <vector>

#include "post/run_record.hpp"
#include "solver/scattering_problem.hpp"

namespace lobe {

struct ScatteringResult {
  Real frequency_hz = 0.0;
  std::vector<Real> thetas, phis;  ///< rad, the model's pattern grid
  Eigen::ArrayXXd rcs_m2;          ///< bistatic RCS on the grid (θ index, φ index), m²
  Real monostatic_m2 = 0.0;        ///< back toward the direction the wave comes from, m²
  std::vector<Eigen::Vector3cd> surface_currents;  ///< A/m at each triangle's centroid
  SolveReport report;
};

/// σ = 4π r² |E_s|² / |E_inc|² on the pattern grid and back toward the source
/// (OpenMP-parallel over directions). Throws NumericalError on non-finite values.
ScatteringResult evaluate_scattering(const ScatteringProblem& problem, const ScatteringSolution& solution);

/// 10 log10(σ / 1 m²), floored at gain_floor_dbi.
Real to_dbsm(Real rcs_m2);

/// A run of scattering results with how it was run.
struct ScatteringRun {
  const ScatteringProblem& problem;
  std::vector<ScatteringResult> results;
  RunInfo info;
};

/// One row per frequency and direction; header frequency_hz,theta_deg,phi_deg,rcs_m2,rcs_dbsm.
void write_scattering_csv(const std::filesystem::path& path, const ScatteringRun& run);
/// Per frequency the monostatic RCS, the largest bistatic RCS and where, then cautions.
std::string scattering_summary(const ScatteringRun& run);

}  // namespace lobe
