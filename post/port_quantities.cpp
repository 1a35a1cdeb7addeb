#include "post/port_quantities.hpp"

#include <cmath>

namespace lobe {

Complex reflection_coefficient(Complex impedance, Real reference_ohm) {
  return (impedance - reference_ohm) / (impedance + reference_ohm);
}

Real vswr_from_reflection(Real magnitude) {
  if (magnitude >= 1.0) return vswr_ceiling;
  return std::min(vswr_ceiling, (1.0 + magnitude) / (1.0 - magnitude));
}

Real return_loss_db(Real magnitude) {
  if (magnitude <= 0.0) return return_loss_ceiling_db;
  return std::min(return_loss_ceiling_db, -20.0 * std::log10(magnitude));
}

Real mismatch_loss_db(Real magnitude) {
  const Real accepted = 1.0 - magnitude * magnitude;
  if (accepted <= 0.0) return return_loss_ceiling_db;
  return std::min(return_loss_ceiling_db, -10.0 * std::log10(accepted));
}

ComplexMatrix impedance_matrix(const FrequencySolution& solution) { return solution.port_admittance.inverse(); }

ComplexMatrix scattering_matrix(const ComplexMatrix& impedance, Real reference_ohm) {
  const auto n = impedance.rows();
  const ComplexMatrix identity = ComplexMatrix::Identity(n, n);
  return (impedance - reference_ohm * identity) * (impedance + reference_ohm * identity).inverse();
}

namespace {

/// `impedance` as the caller reads it from the voltage and current.
PortResult port_result(Complex voltage, Complex current, Complex impedance, Real reference_ohm) {
  PortResult r;
  r.voltage = voltage;
  r.current = current;
  r.driven = std::abs(r.voltage) > 0.0 && std::abs(r.current) > 0.0;
  r.impedance = impedance;
  r.reflection = reflection_coefficient(r.impedance, reference_ohm);
  const Real magnitude = std::abs(r.reflection);
  r.vswr = vswr_from_reflection(magnitude);
  r.return_loss_db = lobe::return_loss_db(magnitude);
  r.mismatch_loss_db = lobe::mismatch_loss_db(magnitude);
  return r;
}

}  // namespace

std::vector<PortResult> antenna_end_results(const AntennaProblem& problem, const FrequencySolution& solution,
                                            Real reference_ohm) {
  std::vector<PortResult> results;
  for (int t : problem.network.antenna_ends()) {
    const Eigen::VectorXd& p = problem.network.couplings().col(problem.network.terminals()[t].coupling);
    const Complex current = p.cast<Complex>().dot(solution.coefficients);
    const Complex voltage = solution.network_voltages[t];
    // No current into the antenna: an open circuit there, shown as the largest impedance
    // the VSWR ceiling allows, so that every figure stays finite.
    const Complex impedance = std::abs(current) > 0.0 ? voltage / current : Complex(vswr_ceiling * reference_ohm);
    results.push_back(port_result(voltage, current, impedance, reference_ohm));
  }
  return results;
}

std::vector<PortResult> port_results(const FrequencySolution& solution, Real reference_ohm) {
  const ComplexMatrix z = impedance_matrix(solution);
  std::vector<PortResult> results;
  for (Eigen::Index p = 0; p < solution.port_voltages.size(); ++p) {
    const Complex v = solution.port_voltages[p], i = solution.port_currents[p];
    const bool driven = std::abs(v) > 0.0 && std::abs(i) > 0.0;
    results.push_back(port_result(v, i, driven ? v / i : z(p, p), reference_ohm));
  }
  return results;
}

Real reflected_power_w(Real forward_w, Real magnitude) { return forward_w * magnitude * magnitude; }

}  // namespace lobe
