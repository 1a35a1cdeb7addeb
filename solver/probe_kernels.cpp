#include "solver/probe_kernels.hpp"

#include <algorithm>
#include <cmath>

#include "core/constants.hpp"
#include "solver/complex_bessel.hpp"
#include "solver/recent_tables.hpp"
#include "solver/sommerfeld_integral.hpp"

namespace lobe {
namespace {

/// Grid points per length scale: the thickness near the axis (out to `near_thicknesses`),
/// the dielectric wavelength over 2π beyond, where the surface wave sets the pace.
constexpr Real points_per_scale = 8.0;
constexpr Real near_thicknesses = 10.0;

SommerfeldPath path_for(const GroundedSlab& slab) {
  return {slab.k0 * (1.0 + std::sqrt(std::abs(slab.permittivity))) * 1.2, slab.k0};
}

/// P(ρ) and Q(ρ), the spatial forms of p̃ and q̃; ρ = 0 is read a little off the axis,
/// where P is flat.
Eigen::Vector2cd probe_integrals(const GroundedSlab& slab, Real rho) {
  return sommerfeld_integral(
      [&](Complex k_rho) -> Eigen::Vector2cd {
        const ProbeSpectrum s = probe_spectrum(slab, k_rho);
        return {s.coupling, s.self};
      },
      std::max(rho, 1e-6 * slab.thickness), path_for(slab), 1e-9);
}

}  // namespace

ProbeKernels::ProbeKernels(const GroundedSlab& slab, Real largest_distance)
    : m_slab(slab), m_omega_mu(slab.k0 * speed_of_light * mu0), m_reach(largest_distance) {
  const Real far_scale = 1.0 / (slab.k0 * std::sqrt(std::abs(slab.permittivity)));
  m_near.step = std::min(slab.thickness, far_scale) / points_per_scale;
  m_near.end = std::min(near_thicknesses * slab.thickness, largest_distance);
  m_far.step = far_scale / points_per_scale;
  m_far.end = largest_distance + 3.0 * m_far.step;
  // An air board couples nothing: P is multiplied by εr − 1.
  const Complex scale = j_unit * m_omega_mu * (slab.permittivity - 1.0);
  Real read_from = 0.0;
  for (Grid* grid : {&m_near, &m_far}) {
    const std::size_t first = grid->size_for_reads_above(read_from);
    read_from = std::max(read_from, grid->end);
    if (slab.permittivity == 1.0) continue;
    const auto count = static_cast<std::ptrdiff_t>(grid->values.size());
#pragma omp parallel for schedule(dynamic, 4)
    for (std::ptrdiff_t i = static_cast<std::ptrdiff_t>(first); i < count; ++i)
      grid->values[i] = scale * probe_integrals(slab, static_cast<Real>(i) * grid->step)[0];
  }
}

Complex ProbeKernels::coupling(Real rho) const { return rho < m_near.end ? m_near.at(rho) : m_far.at(rho); }

Complex ProbeKernels::self(Real rho) const {
  const Eigen::Vector2cd pq = probe_integrals(m_slab, rho);
  const Complex k1 = m_slab.k0 * std::sqrt(m_slab.permittivity);
  return 0.25 * m_omega_mu * m_slab.thickness * hankel2_0(k1 * rho) -
         j_unit * m_omega_mu * ((m_slab.permittivity - 1.0) * pq[0] + m_slab.permittivity * pq[1]);
}

std::shared_ptr<const ProbeKernels> shared_probe_kernels(const GroundedSlab& slab, Real largest_distance) {
  static RecentTables<ProbeKernels> tables(256);
  return tables.find_or_make(
      [&](const ProbeKernels& k) { return same_slab(k.slab(), slab) && k.reach() >= largest_distance; },
      [&] { return std::make_shared<const ProbeKernels>(slab, largest_distance); });
}

}  // namespace lobe
