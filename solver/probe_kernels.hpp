#pragma once
/// The kernels of a probe on a grounded slab (solver/grounded_slab.hpp, ProbeSpectrum) in the
/// spatial domain, per frequency: the probe's coupling to currents on the top face and its
/// coupling to itself and to other probes. Both leave out the potential of the charge the
/// probe's current leaves at its top; the junction star that carries the current on into the
/// plate holds that charge, and the surface kernels account for it.
#include <memory>

#include "solver/grounded_slab.hpp"
#include "solver/uniform_grid_interpolation.hpp"

namespace lobe {

class ProbeKernels {
 public:
  /// For distances from 0 to `largest_distance` (m) at the angular frequency of slab.k0.
  ProbeKernels(const GroundedSlab& slab, Real largest_distance);

  /// Φ_r(ρ), V/A: the potential whose gradient is the probe's horizontal field on the top
  /// face at the distance ρ from its axis, less its top charge's; zero on an air board.
  /// Z(m, probe) = ∫ Φ_r ∇·f_m dS. Read from a table on the thickness's and the dielectric
  /// wavelength's scales (four-point Lagrange interpolation).
  Complex coupling(Real rho) const;
  /// W(ρ), Ω: −∫₀^h E_z dz at the distance ρ from a probe of 1 A, less its top charge's
  /// share; the self term at ρ = the probe's radius (the thin-wire reduced kernel). Direct
  /// Sommerfeld integration: a model has few probes.
  Complex self(Real rho) const;

  const GroundedSlab& slab() const { return m_slab; }
  /// The largest distance the coupling table covers, m.
  Real reach() const { return m_reach; }

 private:
  using Grid = UniformGrid<Complex>;
  GroundedSlab m_slab;
  Real m_omega_mu = 0.0;  ///< ωμ0
  Real m_reach = 0.0;
  Grid m_near, m_far;
};

/// The kernels for `slab` reaching at least `largest_distance`, made once and kept like the
/// slab's kernel table (solver/slab_kernel_table.hpp), so the cases of a sweep share them.
std::shared_ptr<const ProbeKernels> shared_probe_kernels(const GroundedSlab& slab, Real largest_distance);

}  // namespace lobe
