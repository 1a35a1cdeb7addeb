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
  /// The same at `count` ≤ remainder_batch_limit distances at once.
  void remainders(const Real* rho, int count, SlabRemainders* out) const;
  /// The same as real and imaginary parts in separate arrays, read in one vectorised loop
  /// (the pair integrals sum them in another): a pair asks for 36 or 49 at a time, tens of
  /// millions in one fill of a printed patch.
  static constexpr int remainder_batch_limit = 64;
  struct Parts {
    alignas(64) Real vector_re[remainder_batch_limit], vector_im[remainder_batch_limit];
    alignas(64) Real scalar_re[remainder_batch_limit], scalar_im[remainder_batch_limit];
  };
  void remainders(const Real* rho, int count, Parts& out) const;
  /// The radius up to which the complex images were used, m.
  Real images_reach() const { return m_images_reach; }
  /// How many tabulated points there are.
  int size() const { return static_cast<int>(m_vector_re.size()); }

 private:
  using Grid = UniformGrid<SlabRemainders>;
  /// Moves the grids' values into m_vector_re … m_scalar_im, as remainders() reads them.
  void split_grids();
  GroundedSlab m_slab;
  SlabSpectrum m_quasi_static;
  Real m_images_reach = 0.0;
  Real m_reach = 0.0;
  Grid m_grids[3];  ///< thickness scale, wavelength scale, beyond (their values moved out)
  /// The grids' demodulated values by part, grid after grid: node i of grid g at
  /// m_first_node[g] + i, of m_nodes[g].
  std::vector<Real> m_vector_re, m_vector_im, m_scalar_re, m_scalar_im;
  int m_first_node[3] = {}, m_nodes[3] = {};
};

/// The table for `slab` reaching at least `largest_distance`, made once and kept: the
/// cases of a sweep that share the substrate and frequencies share their tables. Safe to
/// call from several threads.
std::shared_ptr<const SlabKernelTable> shared_slab_kernel_table(const GroundedSlab& slab, Real largest_distance);

}  // namespace lobe
