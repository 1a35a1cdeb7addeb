#include "solver/lumped_load.hpp"

#include "core/constants.hpp"

namespace lobe {

Complex load_impedance(const Load& load, Real frequency_hz) {
  const Real omega = 2 * pi * frequency_hz;
  if (!load.parallel) {
    Complex z(load.resistance, omega * load.inductance);
    if (load.capacitance) z += 1.0 / (j_unit * omega * *load.capacitance);
    return z;
  }
  Complex y = 0.0;
  if (load.resistance > 0.0) y += 1.0 / load.resistance;
  if (load.inductance > 0.0) y += 1.0 / (j_unit * omega * load.inductance);
  if (load.capacitance) y += j_unit * omega * *load.capacitance;
  return 1.0 / y;
}

}  // namespace lobe
