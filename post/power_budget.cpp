#include "post/power_budget.hpp"

#include <algorithm>

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
  const std::vector<Real> loads = load_powers(problem, solution);
  for (std::size_t l = 0; l < loads.size(); ++l)
    if (problem.network.load_is_stamped(l)) budget.load_loss += loads[l];
  const std::vector<Real> network = network_powers(problem, solution);
  for (std::size_t e = 0; e < network.size(); ++e)
    (problem.network.element_is_lumped(e) ? budget.load_loss : budget.line_loss) += network[e];
  return budget;
}

std::vector<Real> network_powers(const AntennaProblem& problem, const FrequencySolution& solution) {
  if (problem.network.empty()) return {};
  return problem.network.element_powers(solution.network_voltages, solution.network_currents);
}

std::vector<Real> load_powers(const AntennaProblem& problem, const FrequencySolution& solution) {
  std::vector<Real> powers;
  const std::vector<Real> network = network_powers(problem, solution);
  for (std::size_t l = 0; l < problem.model.loads.size(); ++l) {
    if (!problem.network.load_is_stamped(l)) {
      const auto& joined = problem.network.joined_loads();
      const std::size_t k = std::find(joined.begin(), joined.end(), l) - joined.begin();
      powers.push_back(network[problem.network.element_count() - joined.size() + k]);
      continue;
    }
    const Complex current = problem.load_vectors.col(static_cast<Eigen::Index>(l)).cast<Complex>().dot(solution.coefficients);
    powers.push_back(0.5 * std::norm(current) * load_impedance(problem.model.loads[l].values, solution.frequency_hz).real());
  }
  return powers;
}

}  // namespace lobe
