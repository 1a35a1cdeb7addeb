#pragma once
/// Every figure reported at one frequency, computed from the solved currents.
#include <vector>

#include "post/far_field.hpp"
#include "post/polarization.hpp"
#include "post/port_quantities.hpp"
#include "post/power_budget.hpp"

namespace lobe {

/// Gains below this are reported as this value (no field, e.g. under a ground plane).
constexpr Real gain_floor_dbi = -150.0;

/// Far-field figures on the model's θ/φ grid; arrays are (θ index, φ index).
struct PatternResult {
  std::vector<Real> thetas;  ///< rad
  std::vector<Real> phis;    ///< rad
  Eigen::ArrayXXcd e_theta, e_phi;  ///< V at r = 1 m, e^{−jkr} removed
  Eigen::ArrayXXd directivity_dbi, gain_dbi, realized_gain_dbi, rhcp_dbi, lhcp_dbi, axial_ratio_db;
  Eigen::ArrayXXi hand;  ///< +1 right, −1 left, 0 linear
};

struct FrequencyResult {
  Real frequency_hz = 0.0;
  std::vector<PortResult> ports;
  /// Where a feed network meets the antenna (post/port_quantities.hpp); empty without one.
  std::vector<PortResult> antenna_ends;
  /// Power into each feed-network element, W (post/power_budget.hpp).
  std::vector<Real> network_powers;
  ComplexMatrix z_matrix;  ///< ohm
  ComplexMatrix s_matrix;
  PowerBudget power;
  PatternResult pattern;
  Real peak_gain_dbi = gain_floor_dbi;
  Real peak_theta = 0.0, peak_phi = 0.0;  ///< rad, on the grid
  Real peak_axial_ratio_db = axial_ratio_ceiling_db;
  Real peak_rhcp_dbi = gain_floor_dbi, peak_lhcp_dbi = gain_floor_dbi;  ///< in the peak's direction
  Hand peak_hand = Hand::linear;
  std::vector<std::array<Complex, 2>> segment_currents;
  std::vector<Eigen::Vector3cd> surface_currents;  ///< A/m at each triangle's centroid
  SolveReport report;
  bool interpolated = false;  ///< from an adaptive sweep's interpolant, not solved
};

/// Ports, powers and the pattern on the model's grid (OpenMP-parallel over directions).
/// Throws NumericalError if any of it is not finite.
FrequencyResult evaluate_frequency(const AntennaProblem& problem, const FrequencySolution& solution);

/// Throws NumericalError when any reported figure is not finite, so that nothing
/// non-finite is ever written.
void require_finite(const FrequencyResult& result);

/// 10 log10(x) with gain_floor_dbi for zero or tiny values.
Real to_dbi(Real ratio);

}  // namespace lobe
