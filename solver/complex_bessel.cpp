// Power series for |z| < 12, where they lose at most four digits to cancellation, and the
// Hankel asymptotic expansion beyond, whose smallest term there is below 1e-10
// (Abramowitz & Stegun 9.1.12, 9.1.13, 9.2.7).
#include "solver/complex_bessel.hpp"

#include <cmath>

#include "core/constants.hpp"

namespace lobe {
namespace {

constexpr Real series_radius = 12.0;
constexpr Real euler_gamma = 0.57721566490153286061;

/// J0 and the series part of Y0 together: J0 = Σ (−z²/4)^k/(k!)², and
/// Y0 = (2/π)[(ln(z/2) + γ) J0 − Σ_{k≥1} H_k (−z²/4)^k/(k!)²] with H_k the harmonic numbers.
struct SeriesValues {
  Complex j0, y0;
};
SeriesValues series(Complex z) {
  const Complex x = -0.25 * z * z;
  Complex term = 1.0, j0 = 1.0, harmonic_sum = 0.0;
  Real harmonic = 0.0;
  for (int k = 1; k < 200; ++k) {
    term *= x / Real(k * k);
    harmonic += 1.0 / k;
    j0 += term;
    harmonic_sum += harmonic * term;
    if (std::abs(term) * harmonic < 1e-17 * std::abs(j0) && std::abs(term) < 1e-17) break;
  }
  const Complex y0 = (2.0 / pi) * ((std::log(0.5 * z) + euler_gamma) * j0 - harmonic_sum);
  return {j0, y0};
}

/// Σ (±j)^k a_k(n) / z^k with a_k(n) = Π_{i≤k} (4n² − (2i−1)²)/(k! 8^k), summed to its smallest
/// term: Hn⁽¹,²⁾(z) = √(2/(πz)) e^{±j(z − nπ/2 − π/4)} times this sum with the matching sign.
Complex asymptotic_sum(Complex z, Complex sign, int order = 0) {
  const Real mu = 4.0 * order * order;
  Complex term = 1.0, sum = 1.0;
  Real previous = 1.0;
  for (int k = 1; k < 60; ++k) {
    const Real odd = 2.0 * k - 1.0;
    const Complex next = term * ((mu - odd * odd) / (8.0 * k)) * sign / z;
    if (std::abs(next) >= previous) break;
    term = next;
    previous = std::abs(term);
    sum += term;
    if (previous < 1e-17) break;
  }
  return sum;
}

Complex hankel_asymptotic(Complex z, bool second_kind, int order = 0) {
  const Complex chi = z - 0.5 * order * pi - 0.25 * pi;
  const Complex amplitude = std::sqrt(2.0 / (pi * z));
  return second_kind ? amplitude * std::exp(-j_unit * chi) * asymptotic_sum(z, -j_unit, order)
                     : amplitude * std::exp(j_unit * chi) * asymptotic_sum(z, j_unit, order);
}

/// J_n = (z/2)^n Σ (−z²/4)^k/(k!(k+n)!).
Complex series_j(int order, Complex z) {
  const Complex x = -0.25 * z * z;
  Complex term = 1.0;
  for (int i = 1; i <= order; ++i) term *= 0.5 * z / Real(i);
  Complex sum = term;
  for (int k = 1; k < 200; ++k) {
    term *= x / Real(k * (k + order));
    sum += term;
    if (std::abs(term) < 1e-17 * std::abs(sum)) break;
  }
  return sum;
}

}  // namespace

Complex bessel_j0(Complex z) {
  if (std::abs(z) < series_radius) return series(z).j0;
  return 0.5 * (hankel_asymptotic(z, false) + hankel_asymptotic(z, true));
}

Complex bessel_j(int order, Complex z) {
  if (std::abs(z) < series_radius) return series_j(order, z);
  return 0.5 * (hankel_asymptotic(z, false, order) + hankel_asymptotic(z, true, order));
}

Complex hankel2_0(Complex z) {
  if (std::abs(z) < series_radius) {
    const SeriesValues s = series(z);
    return s.j0 - j_unit * s.y0;
  }
  return hankel_asymptotic(z, true);
}

}  // namespace lobe
