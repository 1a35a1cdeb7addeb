#include "geometry/model.hpp"

#include <algorithm>
#include <cmath>

namespace lobe {
namespace {

std::vector<Real> inclusive_range(Real start, Real stop, Real step) {
  std::vector<Real> values;
  // The small allowance keeps a stop that is a whole number of steps away despite rounding.
  const auto count = static_cast<long>(std::floor((stop - start) / step + 1e-9)) + 1;
  for (long i = 0; i < count; ++i) values.push_back(start + static_cast<Real>(i) * step);
  return values;
}

}  // namespace

std::vector<Real> PatternGrid::thetas() const { return inclusive_range(theta_start, theta_stop, theta_step); }
std::vector<Real> PatternGrid::phis() const { return inclusive_range(phi_start, phi_stop, phi_step); }

Real LineLoss::db_per_metre(Real frequency_hz) const {
  return conductor * std::sqrt(frequency_hz) + dielectric * frequency_hz;
}

Real Model::highest_frequency() const {
  return frequencies_hz.empty() ? 0.0 : *std::max_element(frequencies_hz.begin(), frequencies_hz.end());
}

}  // namespace lobe
