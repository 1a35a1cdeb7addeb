// Solves a thin half-wave dipole through lobe's libraries and prints its input impedance.
#include <cstdio>

#include "geometry/model_parser.hpp"
#include "post/frequency_result.hpp"
#include "solver/antenna_problem.hpp"

int main() {
  const lobe::Model model = lobe::parse_model(
      "wire d from (0,0,-0.2425) to (0,0,0.2425) radius 0.1 mm segments 41\nport p on d at middle\nfrequency 300 MHz\n",
      "dipole");
  const lobe::AntennaProblem problem(model);
  const lobe::FrequencyResult result = lobe::evaluate_frequency(problem, lobe::solve_frequency(problem, 300e6));
  const lobe::Complex z = result.ports.front().impedance;
  std::printf("%.3f %.3f\n", z.real(), z.imag());
  return 0;
}
