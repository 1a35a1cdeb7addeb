#pragma once
/// Every figure reported at one frequency, computed from the solved currents.
#include <optional>
#include <vector>

#include "post/beam_figures.hpp"
#include "post/far_field.hpp"
#include "post/polarization.hpp"
#include "post/port_quantities.hpp"
#include "post/power_budget.hpp"

namespace lobe {

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
  PatternResult sphere;  ///< over the whole sphere, when FigureOptions::sphere_step_deg asks for it
  BeamFigures beam;
  PolarizationFigures polarization;  ///< at the main beam, or where FigureOptions::toward says
  std::vector<std::array<Complex, 2>> segment_currents;
  std::vector<Eigen::Vector3cd> surface_currents;  ///< A/m at each triangle's centroid
  SolveReport report;
  bool interpolated = false;  ///< from an adaptive sweep's interpolant, not solved
};

/// What a study asks of the figures beyond the model.
struct FigureOptions {
  /// The direction the polarisation figures are judged in; none: the main beam.
  std::optional<Direction> toward;
  /// Above 0: also the pattern over the whole sphere at this step (degrees), for 3-D views.
  Real sphere_step_deg = 0.0;
};

/// Ports, powers, the pattern on the model's grid (OpenMP-parallel over directions) and the
/// main beam's figures. Throws NumericalError if any of it is not finite.
FrequencyResult evaluate_frequency(const AntennaProblem& problem, const FrequencySolution& solution,
                                   const FigureOptions& options = {});

/// Throws NumericalError when any reported figure is not finite, so that nothing
/// non-finite is ever written.
void require_finite(const FrequencyResult& result);

}  // namespace lobe
