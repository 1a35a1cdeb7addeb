#include "support/mie_series.hpp"

#include <cmath>

namespace lobe::testing {
namespace {

/// Spherical Bessel j_n(x), n = 0 … N, by Miller's downward recurrence normalised to
/// j_0 = sin x / x (stable for n > x, where upward recurrence is not).
std::vector<double> spherical_j(int n_max, double x) {
  const int start = n_max + 20 + static_cast<int>(x);
  std::vector<double> j(start + 2, 0.0);
  j[start + 1] = 0.0;
  j[start] = 1e-300;
  for (int n = start; n >= 1; --n) j[n - 1] = (2 * n + 1) / x * j[n] - j[n + 1];
  const double scale = (std::sin(x) / x) / j[0];
  j.resize(n_max + 1);
  for (double& v : j) v *= scale;
  return j;
}

/// Spherical Bessel y_n(x) by upward recurrence (stable for y_n).
std::vector<double> spherical_y(int n_max, double x) {
  std::vector<double> y(n_max + 1);
  y[0] = -std::cos(x) / x;
  if (n_max >= 1) y[1] = -std::cos(x) / (x * x) - std::sin(x) / x;
  for (int n = 1; n < n_max; ++n) y[n + 1] = (2 * n + 1) / x * y[n] - y[n - 1];
  return y;
}

}  // namespace

PecSphereMie::PecSphereMie(double x) : m_x(x) {
  const int n_max = static_cast<int>(std::ceil(x + 4 * std::cbrt(x) + 2));
  const auto j = spherical_j(n_max, x), y = spherical_y(n_max, x);
  for (int n = 1; n <= n_max; ++n) {
    const std::complex<double> h(j[n], y[n]), h_previous(j[n - 1], y[n - 1]);
    // [x z_n(x)]' = x z_{n−1}(x) − n z_n(x) for any spherical Bessel function z_n.
    const double xj_prime = x * j[n - 1] - n * j[n];
    const std::complex<double> xh_prime = x * h_previous - static_cast<double>(n) * h;
    m_a.push_back(xj_prime / xh_prime);
    m_b.push_back(j[n] / h);
  }
}

double PecSphereMie::backscatter_efficiency() const {
  std::complex<double> sum = 0.0;
  for (std::size_t i = 0; i < m_a.size(); ++i) {
    const int n = static_cast<int>(i) + 1;
    sum += (n % 2 ? -1.0 : 1.0) * (2.0 * n + 1) * (m_a[i] - m_b[i]);
  }
  return std::norm(sum) / (m_x * m_x);
}

PecSphereMie::Amplitudes PecSphereMie::amplitudes(double theta) const {
  // Angular functions π_n, τ_n by their upward recurrences (Bohren & Huffman 4.47).
  const double mu = std::cos(theta);
  double pi_previous = 0.0, pi_n = 1.0;
  Amplitudes s;
  for (std::size_t i = 0; i < m_a.size(); ++i) {
    const int n = static_cast<int>(i) + 1;
    const double tau_n = n * mu * pi_n - (n + 1) * pi_previous;
    const double weight = (2.0 * n + 1) / (n * (n + 1.0));
    s.s1 += weight * (m_a[i] * pi_n + m_b[i] * tau_n);
    s.s2 += weight * (m_a[i] * tau_n + m_b[i] * pi_n);
    const double pi_next = ((2.0 * n + 1) * mu * pi_n - (n + 1.0) * pi_previous) / n;
    pi_previous = pi_n;
    pi_n = pi_next;
  }
  return s;
}

// σ(θ) = (4π/k²) |S|² = 4 a² |S|² / x², so σ/(πa²) = 4 |S|² / x².
double PecSphereMie::bistatic_efficiency_e_plane(double theta) const {
  return 4.0 * std::norm(amplitudes(theta).s2) / (m_x * m_x);
}

double PecSphereMie::bistatic_efficiency_h_plane(double theta) const {
  return 4.0 * std::norm(amplitudes(theta).s1) / (m_x * m_x);
}

double PecSphereMie::scattering_efficiency() const {
  double sum = 0.0;
  for (std::size_t i = 0; i < m_a.size(); ++i) {
    const int n = static_cast<int>(i) + 1;
    sum += (2.0 * n + 1) * (std::norm(m_a[i]) + std::norm(m_b[i]));
  }
  return 2.0 * sum / (m_x * m_x);
}

double PecSphereMie::extinction_efficiency() const {
  double sum = 0.0;
  for (std::size_t i = 0; i < m_a.size(); ++i) {
    const int n = static_cast<int>(i) + 1;
    sum += (2.0 * n + 1) * (m_a[i] + m_b[i]).real();
  }
  return 2.0 * sum / (m_x * m_x);
}

}  // namespace lobe::testing
