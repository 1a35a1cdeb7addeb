#include "post/scattering_result.hpp"

#include <cmath>

#include "core/constants.hpp"
#include "post/surface_far_field.hpp"

namespace lobe {

Real to_dbsm(Real rcs_m2) { return to_dbi(rcs_m2); }

ScatteringResult evaluate_scattering(const ScatteringProblem& problem, const ScatteringSolution& solution) {
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
  auto rcs = [&](Real theta, Real phi) {
    return radar_cross_section(surface_far_field(problem.surfaces.mesh, problem.basis, solution.currents,
                                                 solution.frequency_hz, theta, phi)) / incident;
  };
#pragma omp parallel for collapse(2)
  for (Eigen::Index i = 0; i < nt; ++i)
    for (Eigen::Index j = 0; j < np; ++j) result.rcs_m2(i, j) = rcs(result.thetas[i], result.phis[j]);
  result.monostatic_m2 = rcs(wave.theta, wave.phi);
  result.surface_currents = centroid_current_density(problem.surfaces.mesh, problem.basis, solution.currents);
  bool finite = result.rcs_m2.allFinite() && std::isfinite(result.monostatic_m2);
  for (const auto& j : result.surface_currents) finite = finite && j.allFinite();
  if (!finite)
    throw NumericalError("a non-finite cross-section arose at " + std::to_string(result.frequency_hz) + " Hz");
  return result;
}

}  // namespace lobe
