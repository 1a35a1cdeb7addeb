#include "solver/slab_kernel_table.hpp"

#include <algorithm>
#include <cmath>

#include "core/check.hpp"
#include "core/constants.hpp"
#include "core/vector_clones.hpp"
#include "solver/phase_factor.hpp"
#include "solver/recent_tables.hpp"
#include "solver/slab_kernels.hpp"
#include "solver/sommerfeld_integral.hpp"

namespace lobe {
namespace {

/// Grid points per length scale of the remainders (the slab thickness near ρ = 0, the
/// wavelength in the dielectric over 2π everywhere). The grids hold the remainders times
/// e^{jk0ρ}: far out they are mostly the ground's image of the direct term, which nearly
/// cancels it, and without their common phase they vary on the scale of ρ itself, so
/// interpolation errs far below the kernel's own size even on the coarse grid.
constexpr Real near_points_per_scale = 16.0;
constexpr Real far_points_per_scale = 8.0;
/// The images are trusted out to the last check radius where they agree with Sommerfeld
/// integration within this fraction of |G|.
constexpr Real images_tolerance = 1e-5;
/// Grid points this close to ρ = 0, in fine steps, come from Sommerfeld integration.
constexpr int near_points = 4;
/// The fine grid's extent in slab thicknesses (and at least a wavelength).
constexpr Real near_thicknesses = 40.0;

class Sommerfeld {
 public:
  explicit Sommerfeld(const GroundedSlab& slab)
      : m_slab(slab),
        m_quasi_static(quasi_static_coefficients(slab)),
        m_path{slab.k0 * (1.0 + std::sqrt(std::abs(slab.permittivity))) * 1.2, slab.k0} {}

  SlabRemainders operator()(Real rho) const {
    const Real k0 = m_slab.k0;
    // Both kernels in one pass: they share the spectrum's evaluation and the Bessel function.
    const Eigen::Vector2cd both = sommerfeld_integral(
        [&](Complex k_rho) -> Eigen::Vector2cd {
          const SlabSpectrum s = slab_spectrum(m_slab, k_rho);
          const Complex free = 0.5 / std::sqrt(k_rho * k_rho - k0 * k0);
          return {s.vector - m_quasi_static.vector * free, s.scalar - m_quasi_static.scalar * free};
        },
        rho, m_path, 1e-9);
    return {both[0], both[1]};
  }

 private:
  GroundedSlab m_slab;
  SlabSpectrum m_quasi_static;
  SommerfeldPath m_path;
};

}  // namespace

SlabKernelTable::SlabKernelTable(const GroundedSlab& slab, Real largest_distance)
    : m_slab(slab), m_quasi_static(quasi_static_coefficients(slab)), m_reach(largest_distance) {
  const Real k0 = slab.k0, wavelength = 2.0 * pi / k0;
  const Real far_scale = 1.0 / (k0 * std::sqrt(std::abs(slab.permittivity)));
  Grid &near = m_grids[0], &middle = m_grids[1], &far = m_grids[2];
  near.step = std::min(slab.thickness, far_scale) / near_points_per_scale;
  middle.step = far_scale / near_points_per_scale;
  far.step = far_scale / far_points_per_scale;
  near.end = std::min(std::max(near_thicknesses * slab.thickness, 3.0 * middle.step), largest_distance);
  middle.end = std::min(std::max(wavelength, near.end), largest_distance);
  const Real end = largest_distance + 3.0 * far.step;
  far.end = end;
  const SlabKernels kernels = slab_kernels(slab);
  const Sommerfeld sommerfeld(slab);
  const auto images = [&](Real rho) -> SlabRemainders {
    return {kernels.vector.remainder(k0, rho), kernels.scalar.remainder(k0, rho)};
  };

  // The images' reach: check radii from half a wavelength, a quarter further each time.
  m_images_reach = near_points * near.step;
  for (Real rho = std::min(0.5 * wavelength, end); m_images_reach < end; rho = std::min(1.25 * rho, end)) {
    const SlabRemainders a = images(rho), b = sommerfeld(rho);
    const Complex direct = std::polar(1.0 / (4.0 * pi * rho), -k0 * rho);
    const Real vector_error = std::abs(a.vector - b.vector) / std::abs(b.vector + m_quasi_static.vector * direct);
    const Real scalar_error = std::abs(a.scalar - b.scalar) / std::abs(b.scalar + m_quasi_static.scalar * direct);
    if (std::max(vector_error, scalar_error) > images_tolerance) break;
    m_images_reach = rho;
  }

  Real read_from = 0.0;
  for (Grid& grid : m_grids) {
    // Each grid is read from the previous one's end; the points nearer ρ = 0 stay zero.
    const std::size_t first = grid.size_for_reads_above(read_from);
    read_from = std::max(read_from, grid.end);
    for (std::size_t i = first; i < grid.values.size(); ++i) {
      const Real rho = static_cast<Real>(i) * grid.step;
      // ρ = 0 itself is read a thousandth of a step out: the remainder is flat there.
      const SlabRemainders value = rho < near_points * near.step ? sommerfeld(std::max(rho, 1e-3 * near.step))
                                   : rho <= m_images_reach          ? images(rho)
                                                                    : sommerfeld(rho);
      const Complex demodulation = std::polar(1.0, k0 * rho);
      grid.values[i] = {value.vector * demodulation, value.scalar * demodulation};
    }
  }
  split_grids();
}

void SlabKernelTable::split_grids() {
  for (int g = 0; g < 3; ++g) {
    m_first_node[g] = static_cast<int>(m_vector_re.size());
    m_nodes[g] = static_cast<int>(m_grids[g].values.size());
    for (const SlabRemainders& v : m_grids[g].values) {
      m_vector_re.push_back(v.vector.real()), m_vector_im.push_back(v.vector.imag());
      m_scalar_re.push_back(v.scalar.real()), m_scalar_im.push_back(v.scalar.imag());
    }
    m_grids[g].values = {};
  }
}

namespace {

/// The grids as read_remainders() reads them.
struct GridParts {
  const Real *vector_re, *vector_im, *scalar_re, *scalar_im;
  Real end[2];         ///< where the first and the second grid end
  Real step[3];
  int first_node[3];   ///< each grid's first node in the arrays
  int nodes[3];        ///< and its node count
};

/// The remainders at `count` distances: each from the grid that covers it by the cubic of
/// UniformGrid::at, times e^{−jk0ρ}; a distance to each vector lane.
LOBE_VECTOR_CLONES void read_remainders(const GridParts& t, const Real* rho, int count, Real k0,
                                        SlabKernelTable::Parts& out) {
  // The grids' constants in locals, chosen by selects: conditional loads of them inside the
  // loop kept it scalar.
  const Real end0 = t.end[0], end1 = t.end[1];
  const Real step0 = t.step[0], step1 = t.step[1], step2 = t.step[2];
  const int node0 = t.first_node[0], node1 = t.first_node[1], node2 = t.first_node[2];
  const int nodes0 = t.nodes[0], nodes1 = t.nodes[1], nodes2 = t.nodes[2];
  const Real *vr = t.vector_re, *vi = t.vector_im, *sr = t.scalar_re, *si = t.scalar_im;
#pragma omp simd
  for (int i = 0; i < count; ++i) {
    const Real r = rho[i];
    const bool first_grid = r < end0, second_grid = r < end1;
    const Real step = first_grid ? step0 : second_grid ? step1 : step2;
    const int first_node = first_grid ? node0 : second_grid ? node1 : node2;
    const int nodes = first_grid ? nodes0 : second_grid ? nodes1 : nodes2;
    const CubicStencil s = cubic_stencil(r / step, nodes);
    const Real w0 = s.weight[0], w1 = s.weight[1], w2 = s.weight[2], w3 = s.weight[3];
    const int a = first_node + s.first;
    const Real vector_re = w0 * vr[a] + w1 * vr[a + 1] + w2 * vr[a + 2] + w3 * vr[a + 3];
    const Real vector_im = w0 * vi[a] + w1 * vi[a + 1] + w2 * vi[a + 2] + w3 * vi[a + 3];
    const Real scalar_re = w0 * sr[a] + w1 * sr[a + 1] + w2 * sr[a + 2] + w3 * sr[a + 3];
    const Real scalar_im = w0 * si[a] + w1 * si[a + 1] + w2 * si[a + 2] + w3 * si[a + 3];
    Real sine, cosine;
    sine_cosine_of(k0 * r, sine, cosine);
    // (re + j im)(cos − j sin)
    out.vector_re[i] = vector_re * cosine + vector_im * sine, out.vector_im[i] = vector_im * cosine - vector_re * sine;
    out.scalar_re[i] = scalar_re * cosine + scalar_im * sine, out.scalar_im[i] = scalar_im * cosine - scalar_re * sine;
  }
}

}  // namespace

void SlabKernelTable::remainders(const Real* rho, int count, Parts& out) const {
  LOBE_CHECK(count >= 0 && count <= remainder_batch_limit, "more slab remainders asked at once than the buffers hold");
  GridParts t{m_vector_re.data(), m_vector_im.data(), m_scalar_re.data(), m_scalar_im.data(),
              {m_grids[0].end, m_grids[1].end}, {}, {}, {}};
  for (int g = 0; g < 3; ++g) {
    t.step[g] = m_grids[g].step;
    t.first_node[g] = m_first_node[g];
    t.nodes[g] = m_nodes[g];
  }
  read_remainders(t, rho, count, m_slab.k0, out);
}

void SlabKernelTable::remainders(const Real* rho, int count, SlabRemainders* out) const {
  Parts parts;
  remainders(rho, count, parts);
  for (int i = 0; i < count; ++i)
    out[i] = {Complex(parts.vector_re[i], parts.vector_im[i]), Complex(parts.scalar_re[i], parts.scalar_im[i])};
}

SlabRemainders SlabKernelTable::remainder(Real rho) const {
  SlabRemainders value;
  remainders(&rho, 1, &value);
  return value;
}

std::shared_ptr<const SlabKernelTable> shared_slab_kernel_table(const GroundedSlab& slab, Real largest_distance) {
  // A sweep over one band needs as many tables as it has frequencies; a table is tens of KiB
  // for a patch, a few MiB for a board many wavelengths across.
  static RecentTables<SlabKernelTable> tables(256);
  return tables.find_or_make(
      [&](const SlabKernelTable& t) { return same_slab(t.slab(), slab) && t.reach() >= largest_distance; },
      [&] { return std::make_shared<const SlabKernelTable>(slab, largest_distance); });
}

}  // namespace lobe
