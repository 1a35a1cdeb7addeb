#include "post/scattering_result.hpp"

#include <cmath>

#include "core/constants.hpp"
#include "post/far_field.hpp"
#include "post/power_budget.hpp"

namespace lobe {

Real to_dbsm(Real rcs_m2) { return to_dbi(rcs_m2); }

Real radar_cross_section(const FarFieldSample& scattered) {
  return 4 * pi * (std::norm(scattered.e_theta) + std::norm(scattered.e_phi));
}

ScatteringResult evaluate_scattering(const AntennaProblem& problem, const FrequencySolution& solution) {
  const Model& model = problem.model;
  const PlaneWave& wave = *model.wave;
  ScatteringResult result;
  result.frequency_hz = solution.frequency_hz;
  result.report = solution.report;
  result.thetas = model.pattern.thetas();
  result.phis = model.pattern.phis();
  const auto nt = static_cast<Eigen::Index>(result.thetas.size()), np = static_cast<Eigen::Index>(result.phis.size());
  result.rcs_m2.resize(nt, np);
  const Real incident = wave.amplitude * wave.amplitude;
  const FarField field(problem, solution);
  auto rcs = [&](Real theta, Real phi) { return radar_cross_section(field.at(theta, phi)) / incident; };
#pragma omp parallel for collapse(2)
  for (Eigen::Index i = 0; i < nt; ++i)
    for (Eigen::Index j = 0; j < np; ++j) result.rcs_m2(i, j) = rcs(result.thetas[i], result.phis[j]);
  result.monostatic_m2 = rcs(wave.theta, wave.phi);
  result.load_power_w = load_powers(problem, solution);
  result.segment_currents = solution.segment_currents;
  result.surface_currents = triangle_current_density(problem, solution.coefficients);
  bool finite = result.rcs_m2.allFinite() && std::isfinite(result.monostatic_m2);
  for (const auto& j : result.surface_currents) finite = finite && j.allFinite();
  for (const auto& c : result.segment_currents) finite = finite && std::isfinite(std::abs(c[0])) && std::isfinite(std::abs(c[1]));
  for (Real p : result.load_power_w) finite = finite && std::isfinite(p);
  if (!finite)
    throw NumericalError("a non-finite cross-section arose at " + std::to_string(result.frequency_hz) + " Hz");
  return result;
}

}  // namespace lobe
