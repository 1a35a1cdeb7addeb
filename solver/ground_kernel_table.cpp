#include "solver/ground_kernel_table.hpp"

#include <algorithm>
#include <cmath>

#include "core/constants.hpp"

namespace lobe {
namespace {

/// e^{jkR'} R'³/(1 + (kR')²): what the integrals are multiplied by in the table.
Complex flattening(Real k, Real distance) {
  return std::polar(distance * distance * distance / (1.0 + k * k * distance * distance), k * distance);
}

ReflectedIntegrals scaled(const ReflectedIntegrals& t, Complex factor) {
  return {t.t1 * factor, t.t2 * factor, t.t3 * factor, t.t4 * factor};
}

/// Four-point Lagrange weights at x ∈ [0, 3] over the nodes 0, 1, 2, 3.
std::array<Real, 4> lagrange(Real x) {
  return {-(x - 1) * (x - 2) * (x - 3) / 6, x * (x - 2) * (x - 3) / 2, -x * (x - 1) * (x - 3) / 2, x * (x - 1) * (x - 2) / 6};
}

/// The stencil's first node and the position within it for a fractional index in [0, n−1].
std::pair<int, Real> stencil(Real index, int n) {
  const int first = std::clamp(static_cast<int>(std::floor(index)) - 1, 0, std::max(0, n - 4));
  return {first, index - first};
}

}  // namespace

GroundKernelTable::GroundKernelTable(Complex eps, Real k, Real shortest, Real longest, Real lowest_elevation)
    : m_k(k), m_shortest(shortest), m_log_step(0.05), m_step(2 * pi / k / 48) {
  // Three nodes beyond each end, so that every stencil lies inside.
  m_shortest = shortest * std::exp(-m_log_step);
  m_switch = std::max(m_shortest, 1.0 / k);
  m_log_points = static_cast<int>(std::ceil(std::log(m_switch / m_shortest) / m_log_step));
  m_switch = m_shortest * std::exp(m_log_points * m_log_step);
  m_points = m_log_points + static_cast<int>(std::ceil(std::max(0.0, longest - m_switch) / m_step)) + 3;
  // In √ψ, so that the nodes crowd toward grazing, where the reflection turns fastest.
  m_lowest_elevation = std::sqrt(std::max(0.0, lowest_elevation - 0.02));
  m_elevation_step = (std::sqrt(0.5 * pi) - m_lowest_elevation) / (elevation_points - 1);
  m_values.resize(static_cast<std::size_t>(m_points) * elevation_points);
#pragma omp parallel for schedule(dynamic)
  for (int i = 0; i < m_points; ++i) {
    const Real distance = distance_of(i);
    for (int e = 0; e < elevation_points; ++e) {
      const Real root = m_lowest_elevation + e * m_elevation_step, elevation = root * root;
      const ReflectedIntegrals t = reflected_integrals(eps, k, distance * std::cos(elevation), distance * std::sin(elevation));
      m_values[static_cast<std::size_t>(i) * elevation_points + e] = scaled(t, flattening(k, distance));
    }
  }
}

Real GroundKernelTable::distance_of(int i) const {
  return i <= m_log_points ? m_shortest * std::exp(i * m_log_step) : m_switch + (i - m_log_points) * m_step;
}

Real GroundKernelTable::index_of(Real distance) const {
  if (distance <= m_switch) return std::log(distance / m_shortest) / m_log_step;
  return m_log_points + (distance - m_switch) / m_step;
}

ReflectedIntegrals GroundKernelTable::at(Real rho, Real h) const {
  const Real distance = std::hypot(rho, h), elevation = std::atan2(h, rho);
  // Near the switch the two spacings meet; the stencil's nodes are taken at their own
  // distances, so Lagrange weights are formed in the distance itself there.
  const int first = stencil(index_of(distance), m_points).first;
  const auto [first_e, y] = stencil((std::sqrt(elevation) - m_lowest_elevation) / m_elevation_step, elevation_points);
  std::array<Real, 4> wd, nodes;
  for (int a = 0; a < 4; ++a) nodes[a] = distance_of(first + a);
  for (int a = 0; a < 4; ++a) {
    Real w = 1.0;
    for (int b = 0; b < 4; ++b)
      if (b != a) w *= (distance - nodes[b]) / (nodes[a] - nodes[b]);
    wd[a] = w;
  }
  const std::array<Real, 4> we = lagrange(y);
  ReflectedIntegrals t{};
  for (int a = 0; a < 4; ++a)
    for (int b = 0; b < 4; ++b) {
      const ReflectedIntegrals& v = m_values[static_cast<std::size_t>(first + a) * elevation_points + first_e + b];
      const Real w = wd[a] * we[b];
      t.t1 += w * v.t1;
      t.t2 += w * v.t2;
      t.t3 += w * v.t3;
      t.t4 += w * v.t4;
    }
  return scaled(t, 1.0 / flattening(m_k, distance));
}

}  // namespace lobe
