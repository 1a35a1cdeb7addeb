#include "solver/sommerfeld_integral.hpp"

#include <algorithm>
#include <cmath>
#include <vector>

#include "core/constants.hpp"
#include "solver/adaptive_quadrature.hpp"
#include "solver/complex_bessel.hpp"

namespace lobe {

Complex sommerfeld_integral(const std::function<Complex(Complex)>& spectrum, Real rho, const SommerfeldPath& path,
                            Real relative) {
  const Real a = path.detour_end;
  // |J0| grows like e^{height·ρ} off the axis: keeping height·ρ ≤ 1 costs at most e in
  // cancellation, and the height k0 at small ρ keeps the path well clear of the poles.
  const Real height = std::min(path.k0, 1.0 / rho);
  const auto on_detour = [&](Real t) {
    const Real angle = pi * t / a;
    const Complex k_rho(t, height * std::sin(angle));
    const Complex slope(1.0, height * pi / a * std::cos(angle));
    return spectrum(k_rho) * bessel_j0(k_rho * rho) * k_rho * slope;
  };
  const auto on_axis = [&](Real t) {
    return spectrum(Complex(t)) * bessel_j0(Complex(t * rho)) * t;
  };
  const Complex detour = integrate_adaptive(on_detour, 0.0, a, 0.1 * relative);

  // Where a half-period π/ρ is much longer than a, the spectrum may decay within a small
  // part of the first one, and a rule spread over all of it would miss it: the tail starts
  // with intervals of a, 2a, 4a, … until they reach a half-period.
  const Real period = pi / rho;
  Real start = a;
  Complex head = 0.0;
  for (Real length = a; length < period; length *= 2.0) {
    head += integrate_adaptive(on_axis, start, start + length, 0.1 * relative, 0.01 * relative * std::abs(detour + head));
    start += length;
  }
  // Then half-period by half-period: the partial sums alternate, and ε accelerates them.
  std::vector<Complex> partial;
  Complex sum = head, previous_limit = 0.0;
  int settled = 0;
  for (int i = 0; i < 400; ++i) {
    sum += integrate_adaptive(on_axis, start + i * period, start + (i + 1) * period, 0.1 * relative,
                              0.01 * relative * std::abs(detour + sum));
    partial.push_back(sum);
    const Complex limit = wynn_epsilon_limit(partial);
    const bool close = std::abs(limit - previous_limit) <= relative * std::abs(detour + limit);
    settled = close ? settled + 1 : 0;
    previous_limit = limit;
    if (settled >= 3 && i >= 4) break;
  }
  return (detour + previous_limit) / (2.0 * pi);
}

}  // namespace lobe
