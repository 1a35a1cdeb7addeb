#include "solver/impedance_fill.hpp"

#include <cmath>
#include <exception>
#include <vector>

#include "core/constants.hpp"
#include "solver/segment_integrals.hpp"

namespace lobe {
namespace {

/// The z = 0 mirror image of a point.
inline Vec3 mirrored(const Vec3& p) { return {p.x(), p.y(), -p.z()}; }

struct PairBlock {
  int source = 0;
  PairIntegrals direct{};
  PairIntegrals image{};
};

/// d_i: the slope of N_i along the segment, N_0 = 1−ξ falls, N_1 = ξ rises.
constexpr Real slope[2] = {-1.0, 1.0};

}  // namespace

void add_wire_impedance(const WireMesh& mesh, const WireBasis& basis, bool ground_perfect, Real frequency_hz,
                        ComplexMatrix& z) {
  const Real omega = 2 * pi * frequency_hz;
  const Real k = omega / speed_of_light;
  const Complex vector_factor = j_unit * omega * mu0;
  const Complex scalar_factor = -j_unit / (omega * eps0);
  const int count = static_cast<int>(mesh.segments.size());
  std::vector<SegmentGeometry> geometry(count), images(count);
  for (int s = 0; s < count; ++s) {
    const Segment& seg = mesh.segments[s];
    geometry[s] = {seg.start, seg.end, seg.radius};
    images[s] = {mirrored(seg.start), mirrored(seg.end), seg.radius};
  }
  std::exception_ptr failure;

  // Adds the contribution of pair (s, t) to Z_mn for pieces m on s and n on t, and its
  // transpose when s ≠ t. The image contribution has the mirrored direction and sign −1.
  auto scatter = [&](int s, const PairBlock& block) {
    const int t = block.source;
    const Segment &a = mesh.segments[s], &b = mesh.segments[t];
    const Vec3 ua = a.direction(), ub = b.direction();
    const Real la = a.length(), lb = b.length();
    const Real direct_dot = ua.dot(ub);
    const Real image_dot = ua.dot(mirrored(ub));
    const Complex phi = block.direct[0] + block.direct[1] + block.direct[2] + block.direct[3];
    const Complex phi_image = block.image[0] + block.image[1] + block.image[2] + block.image[3];
    for (const BasisPiece& pm : basis.pieces_on(s)) {
      for (const BasisPiece& pn : basis.pieces_on(t)) {
        const int ij = 2 * pm.peak_end + pn.peak_end;
        const Real divergence = slope[pm.peak_end] * slope[pn.peak_end] / (la * lb);
        Complex value = vector_factor * direct_dot * block.direct[ij] + scalar_factor * divergence * phi;
        if (ground_perfect)
          value -= vector_factor * image_dot * block.image[ij] + scalar_factor * divergence * phi_image;
        value *= pm.sign * pn.sign;
        z(pm.basis, pn.basis) += value;
        if (s != t) z(pn.basis, pm.basis) += value;
      }
    }
  };

#pragma omp parallel
  {
    std::vector<PairBlock> row;
#pragma omp for schedule(dynamic, 4)
    for (int s = 0; s < count; ++s) {
      try {
        row.clear();
        if (basis.pieces_on(s).empty()) continue;
        for (int t = s; t < count; ++t) {
          if (basis.pieces_on(t).empty()) continue;
          PairBlock block;
          block.source = t;
          block.direct = segment_pair_integrals(geometry[s], geometry[t], k);
          if (ground_perfect) block.image = segment_pair_integrals(geometry[s], images[t], k);
          if (s == t) {
            // The self pair is symmetric in (i, j); average away the quadrature's asymmetry.
            block.direct[1] = block.direct[2] = 0.5 * (block.direct[1] + block.direct[2]);
            block.image[1] = block.image[2] = 0.5 * (block.image[1] + block.image[2]);
          }
          row.push_back(block);
        }
#pragma omp critical(lobe_wire_scatter)
        for (const PairBlock& block : row) scatter(s, block);
      } catch (...) {
#pragma omp critical(lobe_wire_failure)
        failure = std::current_exception();
      }
    }
  }
  if (failure) std::rethrow_exception(failure);
}

Complex wire_internal_impedance(Real radius, Real conductivity, Real frequency_hz) {
  const Real omega = 2 * pi * frequency_hz;
  const Real surface_resistance = std::sqrt(omega * mu0 / (2 * conductivity));
  return Complex(1.0, 1.0) * surface_resistance / (2 * pi * radius);
}

void add_conductor_impedance(const WireMesh& mesh, const WireBasis& basis, Real frequency_hz, ComplexMatrix& z) {
  for (std::size_t s = 0; s < mesh.segments.size(); ++s) {
    const Segment& seg = mesh.segments[s];
    if (seg.conductivity <= 0.0) continue;
    const Complex per_metre = wire_internal_impedance(seg.radius, seg.conductivity, frequency_hz);
    const Real l = seg.length();
    for (const BasisPiece& pm : basis.pieces_on(static_cast<int>(s)))
      for (const BasisPiece& pn : basis.pieces_on(static_cast<int>(s))) {
        const Real overlap = pm.peak_end == pn.peak_end ? l / 3.0 : l / 6.0;
        z(pm.basis, pn.basis) += pm.sign * pn.sign * overlap * per_metre;
      }
  }
}

}  // namespace lobe
