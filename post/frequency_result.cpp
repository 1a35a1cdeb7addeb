#include "post/frequency_result.hpp"

#include <cmath>

#include "core/constants.hpp"
#include "post/surface_wave_power.hpp"

namespace lobe {
namespace {

/// The far field and the figures from it at every (θ, φ) of the grid (OpenMP-parallel over
/// directions); `accepted`, `radiated` and `incident` powers turn intensity into gains.
void fill_pattern(const FarField& field, const std::vector<Real>& thetas, const std::vector<Real>& phis, Real accepted,
                  Real radiated, Real incident, PatternResult& pattern) {
  pattern.thetas = thetas;
  pattern.phis = phis;
  const auto nt = static_cast<Eigen::Index>(pattern.thetas.size());
  const auto np = static_cast<Eigen::Index>(pattern.phis.size());
  for (auto* a : {&pattern.directivity_dbi, &pattern.gain_dbi, &pattern.realized_gain_dbi, &pattern.rhcp_dbi,
                  &pattern.lhcp_dbi, &pattern.axial_ratio_db})
    a->resize(nt, np);
  pattern.e_theta.resize(nt, np);
  pattern.e_phi.resize(nt, np);
  pattern.hand.resize(nt, np);
#pragma omp parallel for collapse(2)
  for (Eigen::Index i = 0; i < nt; ++i)
    for (Eigen::Index j = 0; j < np; ++j) {
      const FarFieldSample e = field.at(pattern.thetas[i], pattern.phis[j]);
      const CircularComponents c = circular_components(e.e_theta, e.e_phi);
      const Real to_intensity = 1.0 / (2 * eta0);
      const Real u = (std::norm(e.e_theta) + std::norm(e.e_phi)) * to_intensity;
      pattern.e_theta(i, j) = e.e_theta;
      pattern.e_phi(i, j) = e.e_phi;
      pattern.directivity_dbi(i, j) = to_dbi(radiated > 0 ? 4 * pi * u / radiated : 0.0);
      pattern.gain_dbi(i, j) = to_dbi(accepted > 0 ? 4 * pi * u / accepted : 0.0);
      pattern.realized_gain_dbi(i, j) = to_dbi(incident > 0 ? 4 * pi * u / incident : 0.0);
      pattern.rhcp_dbi(i, j) = to_dbi(accepted > 0 ? 4 * pi * std::norm(c.right) * to_intensity / accepted : 0.0);
      pattern.lhcp_dbi(i, j) = to_dbi(accepted > 0 ? 4 * pi * std::norm(c.left) * to_intensity / accepted : 0.0);
      pattern.axial_ratio_db(i, j) = axial_ratio_db(c);
      pattern.hand(i, j) = static_cast<int>(polarization_hand(c));
    }
}

}  // namespace

FrequencyResult evaluate_frequency(const AntennaProblem& problem, const FrequencySolution& solution,
                                   const FigureOptions& options) {
  FrequencyResult result;
  const Real z0 = problem.model.reference_ohm;
  result.frequency_hz = solution.frequency_hz;
  result.ports = port_results(solution, z0);
  result.antenna_ends = antenna_end_results(problem, solution, z0);
  result.network_powers = network_powers(problem, solution);
  result.z_matrix = impedance_matrix(solution);
  result.s_matrix = scattering_matrix(result.z_matrix, z0);
  result.segment_currents = solution.segment_currents;
  result.surface_currents = triangle_current_density(problem, solution.coefficients);
  result.report = solution.report;
  result.interpolated = solution.interpolated;

  const FarField field(problem, solution);
  result.power = power_budget(problem, solution);
  result.power.radiated = field.radiated_power();
  result.power.surface_wave = surface_wave_power(problem, solution);
  const Real remainder = result.power.accepted - result.power.radiated - result.power.surface_wave -
                        result.power.conductor_loss - result.power.load_loss - result.power.line_loss;
  if (problem.medium.has_slab() && problem.medium.slab_permittivity().imag() != 0.0) result.power.dielectric_loss = remainder;
  if (problem.medium.has_real_ground()) result.power.ground_loss = remainder;

  // Incident power of waves a = (V + Z0 I)/(2√Z0) from Z0 sources: realized gain counts
  // the mismatch, G_realized = 4πU / P_incident.
  Real incident = 0.0;
  for (const auto& p : result.ports) incident += 0.5 * std::norm((p.voltage + z0 * p.current) / (2 * std::sqrt(z0)));

  PatternResult& pattern = result.pattern;
  const Real accepted = result.power.accepted, radiated = result.power.radiated;
  fill_pattern(field, problem.model.pattern.thetas(), problem.model.pattern.phis(), accepted, radiated, incident, pattern);
  const auto nt = static_cast<Eigen::Index>(pattern.thetas.size());
  const auto np = static_cast<Eigen::Index>(pattern.phis.size());
  if (options.sphere_step_deg > 0) {
    std::vector<Real> thetas, phis;
    const int rows = static_cast<int>(std::lround(180.0 / options.sphere_step_deg)), columns = 2 * rows;
    for (int i = 0; i <= rows; ++i) thetas.push_back(pi * i / rows);
    for (int j = 0; j < columns; ++j) phis.push_back(2 * pi * j / columns);
    fill_pattern(field, thetas, phis, accepted, radiated, incident, result.sphere);
  }
  if (nt > 0 && np > 0) {
    // The first direction (θ, then φ, ascending) within a rounding margin of the maximum,
    // so that ties (a pattern symmetric about the axis) give a reproducible answer.
    constexpr Real tie_margin_db = 1e-6;
    const Real maximum = pattern.gain_dbi.maxCoeff();
    Eigen::Index pi_index = 0, pj_index = 0;
    bool found = false;
    for (Eigen::Index i = 0; i < nt && !found; ++i)
      for (Eigen::Index j = 0; j < np && !found; ++j)
        if (pattern.gain_dbi(i, j) >= maximum - tie_margin_db) {
          pi_index = i;
          pj_index = j;
          found = true;
        }
    const Direction peak{pattern.thetas[pi_index], pattern.phis[pj_index]};
    const IntensityAt intensity = [&](const Vec3& r) {
      const Direction d = direction_of(r);
      return field.intensity(d.theta, d.phi);
    };
    const bool over_ground = problem.medium.has_ground() || problem.medium.has_slab();
    result.beam = beam_figures(intensity, peak, accepted > 0 ? 4 * pi / accepted : 0.0,
                               incident > 0 ? 4 * pi / incident : 0.0, over_ground);
    const Direction toward = options.toward.value_or(peak);
    const FarFieldSample e = field.at(toward.theta, toward.phi);
    result.polarization =
        polarization_figures(toward, circular_components(e.e_theta, e.e_phi), accepted > 0 ? 4 * pi / accepted : 0.0);
  }
  require_finite(result);
  return result;
}

void require_finite(const FrequencyResult& result) {
  bool finite = result.z_matrix.allFinite() && result.s_matrix.allFinite() && std::isfinite(result.power.accepted) &&
                std::isfinite(result.power.radiated) && result.pattern.gain_dbi.allFinite() &&
                result.pattern.axial_ratio_db.allFinite() && result.pattern.realized_gain_dbi.allFinite() &&
                result.sphere.gain_dbi.allFinite() && result.sphere.axial_ratio_db.allFinite() &&
                std::isfinite(result.beam.gain_dbi + result.beam.realized_gain_dbi + result.beam.beamwidth_theta_deg +
                              result.beam.beamwidth_phi_deg + result.beam.front_to_back_db.value_or(0.0) +
                              result.beam.front_to_side_db.value_or(0.0)) &&
                std::isfinite(result.polarization.axial_ratio_db + result.polarization.rhcp_dbi +
                              result.polarization.lhcp_dbi + result.polarization.cross_polar_discrimination_db);
  for (const auto* ports : {&result.ports, &result.antenna_ends})
    for (const auto& p : *ports) finite = finite && std::isfinite(std::abs(p.impedance)) && std::isfinite(p.vswr);
  for (Real p : result.network_powers) finite = finite && std::isfinite(p);
  for (const auto& j : result.surface_currents) finite = finite && j.allFinite();
  if (!finite)
    throw NumericalError("a non-finite value arose at " + std::to_string(result.frequency_hz) + " Hz");
}

}  // namespace lobe
