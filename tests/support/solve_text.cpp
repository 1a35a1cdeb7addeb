#include "support/solve_text.hpp"

#include <gtest/gtest.h>

#include <cstdio>

#include "core/constants.hpp"

namespace lobe::testing {

Solved solve_text(const std::string& text) {
  Solved s;
  s.model = std::make_unique<Model>(parse_model(text, "test"));
  s.problem = std::make_unique<AntennaProblem>(*s.model);
  s.solution = solve_frequency(*s.problem, s.model->frequencies_hz.front());
  s.result = evaluate_frequency(*s.problem, s.solution);
  return s;
}

std::string dipole_text(Real length, Real radius, int segments) {
  char buffer[512];
  std::snprintf(buffer, sizeof buffer,
                "units m\n"
                "wire d from (0, 0, %.17g) to (0, 0, %.17g) radius %.17g segments %d\n"
                "port feed on d at middle\n"
                "frequency %.17g Hz\n",
                -length / 2, length / 2, radius, segments, one_metre_wavelength_hz);
  return buffer;
}

void expect_power_balance(const Solved& solved) {
  EXPECT_LT(std::abs(solved.result.power.imbalance()), power_balance_tolerance)
      << "accepted " << solved.result.power.accepted << " W, radiated " << solved.result.power.radiated << " W";
}

Real peak_directivity(const Solved& solved) {
  const FarField field(*solved.problem, solved.solution);
  const Real radiated = field.radiated_power();
  Real best = 0.0;
  for (int i = 0; i <= 1800; ++i) best = std::max(best, 4 * pi * field.intensity(pi * i / 1800.0, 0.0) / radiated);
  return best;
}

}  // namespace lobe::testing
