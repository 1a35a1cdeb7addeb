#include "post/power_budget.hpp"

#include "solver/stamps.hpp"
#include "solver/surface_loss.hpp"

namespace lobe {

PowerBudget power_budget(const AntennaProblem& problem, const FrequencySolution& solution) {
  PowerBudget budget;
  budget.accepted = 0.5 * solution.port_voltages.dot(solution.port_currents).real();
  for (std::size_t s = 0; s < problem.mesh.segments.size(); ++s) {
    const Segment& seg = problem.mesh.segments[s];
    if (seg.conductivity <= 0.0) continue;
    const Real r = wire_internal_impedance(seg.radius, seg.conductivity, solution.frequency_hz).real();
    const Complex c0 = solution.segment_currents[s][0], c1 = solution.segment_currents[s][1];
    // ∫ |c0 (1−ξ) + c1 ξ|² dl = L (|c0|² + |c1|² + Re(c0 c1*)) / 3.
    const Real squared = (std::norm(c0) + std::norm(c1) + (c0 * std::conj(c1)).real()) * seg.length() / 3.0;
    budget.conductor_loss += 0.5 * r * squared;
  }
  budget.conductor_loss += stamp_power(surface_loss_stamp(problem, solution.frequency_hz), solution.coefficients);
  for (Real p : load_powers(problem, solution)) budget.load_loss += p;
  return budget;
}

std::vector<Real> load_powers(const AntennaProblem& problem, const FrequencySolution& solution) {
  std::vector<Real> powers;
  for (std::size_t l = 0; l < problem.model.loads.size(); ++l) {
    const Complex current = problem.load_vectors.col(static_cast<Eigen::Index>(l)).cast<Complex>().dot(solution.coefficients);
    powers.push_back(0.5 * std::norm(current) * load_impedance(problem.model.loads[l], solution.frequency_hz).real());
  }
  return powers;
}

}  // namespace lobe
