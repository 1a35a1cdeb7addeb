#include "solver/excitation.hpp"


namespace lobe {

ComplexVector plane_wave_vector(const AntennaProblem& problem, const IncidentWave& wave, Real frequency_hz) {
  const Real k = problem.medium.wavenumber(frequency_hz);
  const std::vector<IncidentWave> waves = problem.medium.waves_reaching(wave);
  ComplexVector v = ComplexVector::Zero(problem.unknowns());
  for (const BasisSample& sample : problem.samples) {
    Eigen::Vector3cd field = Eigen::Vector3cd::Zero();
    // The wave's phase grows toward the direction it comes from.
    for (const IncidentWave& w : waves) field += (w.amplitude * std::polar(1.0, k * w.from.dot(sample.r))) * w.polarization;
    for (const BasisWeight& weight : sample.weights) v[weight.basis] += weight.moment.cast<Complex>().dot(field);
  }
  return v;
}

}  // namespace lobe
