#include "solver/sommerfeld_integral.hpp"

#include <algorithm>
#include <cmath>
#include <vector>

#include "core/constants.hpp"
#include "solver/adaptive_quadrature.hpp"
#include "solver/complex_bessel.hpp"

namespace lobe {

namespace {

Real magnitude(const Complex& v) { return std::abs(v); }
Real magnitude(const Eigen::Vector2cd& v) { return v.norm(); }
Real magnitude(const Eigen::Vector4cd& v) { return v.norm(); }

/// Wynn's ε limit of each component's partial sums.
Complex accelerated(const std::vector<Complex>& partial) { return wynn_epsilon_limit(partial); }
template <int N>
Eigen::Matrix<Complex, N, 1> accelerated(const std::vector<Eigen::Matrix<Complex, N, 1>>& partial) {
  Eigen::Matrix<Complex, N, 1> limit;
  for (int c = 0; c < N; ++c) {
    std::vector<Complex> component;
    for (const auto& p : partial) component.push_back(p[c]);
    limit[c] = wynn_epsilon_limit(component);
  }
  return limit;
}

/// ∫₀^∞ integrand(kρ) dkρ: the detour, then the real axis. The integrand holds its Bessel
/// functions of kρ ρ; with ρ = 0 it must decay along the real axis by itself, and the
/// doubling intervals run until they add nothing.
template <class Value>
Value path_integral(const std::function<Value(Complex)>& integrand, Real rho, const SommerfeldPath& path, Real relative) {
  const Real a = path.detour_end;
  // |J0| grows like e^{height·ρ} off the axis: keeping height·ρ ≤ 1 costs at most e in
  // cancellation, and the height k0 at small ρ keeps the path well clear of the poles.
  const Real height = rho > 0.0 ? std::min(path.k0, 1.0 / rho) : path.k0;
  const std::function<Value(Real)> on_detour = [&](Real t) -> Value {
    const Real angle = pi * t / a;
    const Complex k_rho(t, height * std::sin(angle));
    const Complex slope(1.0, height * pi / a * std::cos(angle));
    return integrand(k_rho) * slope;
  };
  const std::function<Value(Real)> on_axis = [&](Real t) -> Value { return integrand(Complex(t)); };
  const Value detour = integrate_adaptive(on_detour, 0.0, a, 0.1 * relative);

  // Where a half-period π/ρ is much longer than a, the spectrum may decay within a small
  // part of the first one, and a rule spread over all of it would miss it: the tail starts
  // with intervals of a, 2a, 4a, … until they reach a half-period.
  const Real period = rho > 0.0 ? pi / rho : INFINITY;
  Real start = a;
  Value head = 0.0 * detour;
  int quiet = 0;
  for (Real length = a; length < period; length *= 2.0) {
    const Value piece =
        integrate_adaptive(on_axis, start, start + length, 0.1 * relative, 0.01 * relative * magnitude(Value(detour + head)));
    head += piece;
    start += length;
    // Without oscillation to sum (ρ = 0, or a half-period beyond reach) the head is the
    // whole tail once two doublings in a row add nothing.
    quiet = magnitude(piece) <= 0.01 * relative * magnitude(Value(detour + head)) ? quiet + 1 : 0;
    if (quiet >= 2 && (rho == 0.0 || start > 1e3 * a)) return Value((detour + head));
    if (length > 1e12 * a) return Value(detour + head);
  }
  // Then half-period by half-period: the partial sums alternate, and ε accelerates them.
  std::vector<Value> partial;
  Value sum = head, previous_limit = 0.0 * detour;
  int settled = 0;
  for (int i = 0; i < 400; ++i) {
    sum += integrate_adaptive(on_axis, start + i * period, start + (i + 1) * period, 0.1 * relative,
                              0.01 * relative * magnitude(Value(detour + sum)));
    partial.push_back(sum);
    const Value limit = accelerated(partial);
    const bool close = magnitude(Value(limit - previous_limit)) <= relative * magnitude(Value(detour + limit));
    settled = close ? settled + 1 : 0;
    previous_limit = limit;
    if (settled >= 3 && i >= 4) break;
  }
  return Value(detour + previous_limit);
}

/// (1/2π) ∫ spectrum J0(kρ ρ) kρ dkρ.
template <class Value>
Value integral(const std::function<Value(Complex)>& spectrum, Real rho, const SommerfeldPath& path, Real relative) {
  const std::function<Value(Complex)> integrand = [&](Complex k_rho) -> Value {
    return spectrum(k_rho) * (bessel_j0(k_rho * rho) * k_rho);
  };
  return Value(path_integral(integrand, rho, path, relative) / (2.0 * pi));
}

}  // namespace

Complex sommerfeld_integral(const std::function<Complex(Complex)>& spectrum, Real rho, const SommerfeldPath& path,
                            Real relative) {
  return integral(spectrum, rho, path, relative);
}

Eigen::Vector2cd sommerfeld_integral(const std::function<Eigen::Vector2cd(Complex)>& spectra, Real rho,
                                     const SommerfeldPath& path, Real relative) {
  return integral(spectra, rho, path, relative);
}

Eigen::Vector4cd sommerfeld_path_integral(const std::function<Eigen::Vector4cd(Complex)>& integrand, Real rho,
                                          const SommerfeldPath& path, Real relative) {
  return path_integral(integrand, rho, path, relative);
}

}  // namespace lobe
