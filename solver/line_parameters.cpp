#include "solver/line_parameters.hpp"

#include <cmath>

#include "core/constants.hpp"

namespace lobe {
namespace {

/// cosh γl and sinh γl times e^{−αl}: ½(e^{jβl} ± e^{−2αl − jβl}).
struct ScaledHyperbolic {
  Complex cosh, sinh;
  Real scale;
};

ScaledHyperbolic scaled_hyperbolic(const NetworkElement& line, Real frequency_hz) {
  const Complex gamma_l = propagation_constant(line, frequency_hz) * line.length;
  const Complex forward = std::polar(1.0, gamma_l.imag());
  const Complex backward = std::exp(Complex(-2.0 * gamma_l.real(), -gamma_l.imag()));
  return {0.5 * (forward + backward), 0.5 * (forward - backward), std::exp(-gamma_l.real())};
}

}  // namespace

Complex propagation_constant(const NetworkElement& line, Real frequency_hz) {
  const Real beta = 2 * pi * frequency_hz / (line.velocity_factor * speed_of_light);
  const Real alpha = line.loss.db_per_metre(frequency_hz) * std::log(10.0) / 20.0;
  return {alpha, beta};
}

ChainMatrix line_chain_matrix(const NetworkElement& line, Real frequency_hz) {
  const ScaledHyperbolic h = scaled_hyperbolic(line, frequency_hz);
  const Real sign = line.crossed ? -1.0 : 1.0;
  return {sign * h.cosh, sign * line.impedance * h.sinh, sign * h.sinh / line.impedance, sign * h.cosh, h.scale};
}

ChainMatrix transformer_chain_matrix(const NetworkElement& transformer) {
  const Real n = std::sqrt(transformer.ratio);
  return {1.0 / n, 0.0, 0.0, n, 1.0};
}

ImpedanceRatio stub_input(const NetworkElement& stub, Real frequency_hz) {
  const ScaledHyperbolic h = scaled_hyperbolic(stub, frequency_hz);
  // Shorted far end (v2 = 0): v1/i1 = b/d; open (i2 = 0): v1/i1 = a/c.
  if (stub.shorted) return {stub.impedance * h.sinh, h.cosh};
  return {stub.impedance * h.cosh, h.sinh};
}

ImpedanceRatio lumped_input(const LumpedValues& part, Real frequency_hz) {
  const Real omega = 2 * pi * frequency_hz;
  if (!part.parallel) {
    // R + jωL + 1/(jωC) = (jωC (R + jωL) + 1)/(jωC).
    if (!part.capacitance) return {Complex(part.resistance, omega * part.inductance), 1.0};
    const Complex jwc = j_unit * omega * *part.capacitance;
    return {jwc * Complex(part.resistance, omega * part.inductance) + 1.0, jwc};
  }
  Complex y = 0.0;
  if (part.resistance > 0.0) y += 1.0 / part.resistance;
  if (part.inductance > 0.0) y += 1.0 / (j_unit * omega * part.inductance);
  if (part.capacitance) y += j_unit * omega * *part.capacitance;
  return {1.0, y};
}

}  // namespace lobe
