#pragma once
/// The grounded slab's kernels tabulated once per frequency for the fill, which reads them
/// at millions of distances. Stored are the remainders, each kernel less its quasi-static
/// direct term q e^{−jk0ρ}/(4πρ) (the fill integrates that term as in free space): they are
/// finite at ρ = 0 and smooth, on three uniform grids read by four-point Lagrange
/// interpolation: one on the thickness's scale out to 40 thicknesses, where the remainders
/// vary on that scale, one on the dielectric wavelength's scale out to a wavelength, and a
/// coarser one beyond.
/// The complex images fill the table where they agree with Sommerfeld integration (checked
/// at radii out to the table's end while it is made); Sommerfeld integration fills the rest:
/// next to ρ = 0, where the images cannot follow the surface wave's logarithm, and beyond
/// the images' reach, where they lose accuracy.
#include <memory>
#include <vector>

#include "solver/grounded_slab.hpp"
#include "solver/uniform_grid_interpolation.hpp"

namespace lobe {

struct SlabRemainders {
  Complex vector = 0.0;
  Complex scalar = 0.0;
  SlabRemainders& operator+=(const SlabRemainders& o) {
    vector += o.vector;
    scalar += o.scalar;
    return *this;
  }
};
inline SlabRemainders operator*(Real w, const SlabRemainders& r) { return {w * r.vector, w * r.scalar}; }

class SlabKernelTable {
 public:
  /// Tabulates ρ from 0 to `largest_distance` (m), the largest distance between two points
  /// of the structure.
  SlabKernelTable(const GroundedSlab& slab, Real largest_distance);

  /// The distance the table reaches, m.
  Real reach() const { return m_reach; }
  const GroundedSlab& slab() const { return m_slab; }
  /// The quasi-static coefficients: 1 and 2/(εr + 1).
  const SlabSpectrum& quasi_static() const { return m_quasi_static; }
  /// The remainders at 0 ≤ ρ ≤ largest_distance.
  SlabRemainders remainder(Real rho) const;
  /// The same at `count` ≤ 64 distances at once, their phases in one vectorised call (the
  /// fill asks 49 at a time).
  void remainders(const Real* rho, int count, SlabRemainders* out) const;
  /// The radius up to which the complex images were used, m.
  Real images_reach() const { return m_images_reach; }
  /// How many tabulated points there are.
  int size() const {
    return static_cast<int>(m_grids[0].values.size() + m_grids[1].values.size() + m_grids[2].values.size());
  }

 private:
  using Grid = UniformGrid<SlabRemainders>;
  /// The demodulated remainders from the grid that covers ρ.
  SlabRemainders demodulated(Real rho) const {
    return rho < m_grids[0].end ? m_grids[0].at(rho) : rho < m_grids[1].end ? m_grids[1].at(rho) : m_grids[2].at(rho);
  }
  GroundedSlab m_slab;
  SlabSpectrum m_quasi_static;
  Real m_images_reach = 0.0;
  Real m_reach = 0.0;
  Grid m_grids[3];  ///< thickness scale, wavelength scale, beyond
};

/// The table for `slab` reaching at least `largest_distance`, made once and kept: the
/// cases of a sweep that share the substrate and frequencies share their tables. Safe to
/// call from several threads.
std::shared_ptr<const SlabKernelTable> shared_slab_kernel_table(const GroundedSlab& slab, Real largest_distance);

}  // namespace lobe
