#include "solver/impedance_fill.hpp"

#include <cmath>
#include <vector>

#include "core/check.hpp"
#include "core/constants.hpp"
#include "solver/pair_fill.hpp"
#include "solver/segment_integrals.hpp"

namespace lobe {
namespace {

/// The z = 0 mirror image of a point.
inline Vec3 mirrored(const Vec3& p) { return {p.x(), p.y(), -p.z()}; }


/// d_i: the slope of N_i along the segment, N_0 = 1−ξ falls, N_1 = ξ rises.
constexpr Real slope[2] = {-1.0, 1.0};

}  // namespace

void add_wire_impedance(const WireMesh& mesh, const WireBasis& basis, bool ground_perfect, Real frequency_hz,
                        ComplexMatrix& z) {
  LOBE_CHECK(z.rows() >= basis.size() && z.cols() == z.rows(), "impedance matrix of the wrong size");
  const Real omega = 2 * pi * frequency_hz;
  const Real k = omega / speed_of_light;
  const Complex vector_factor = j_unit * omega * mu0;
  const Complex scalar_factor = -j_unit / (omega * eps0);
  const int count = static_cast<int>(mesh.segments.size());
  std::vector<SegmentGeometry> geometry(count), images(count);
  std::vector<Real> lengths(count);
  std::vector<Vec3> directions(count);
  for (int s = 0; s < count; ++s) {
    const Segment& seg = mesh.segments[s];
    geometry[s] = {seg.start, seg.end, seg.radius};
    images[s] = {mirrored(seg.start), mirrored(seg.end), seg.radius};
    lengths[s] = seg.length();
    directions[s] = seg.direction();
  }

  // Z_mn for pieces m on s and n on t from the pair integrals; the image has the mirrored
  // direction and the opposite sign. Appends one contribution per piece pair.
  auto contributions = [&](int s, int t, const PairIntegrals& direct, const PairIntegrals& image,
                           std::vector<MatrixContribution>& out) {
    const Real direct_dot = directions[s].dot(directions[t]);
    const Real image_dot = directions[s].dot(mirrored(directions[t]));
    const Complex phi = direct[0] + direct[1] + direct[2] + direct[3];
    const Complex phi_image = image[0] + image[1] + image[2] + image[3];
    for (const BasisPiece& pm : basis.pieces_on(s)) {
      for (const BasisPiece& pn : basis.pieces_on(t)) {
        const int ij = 2 * pm.peak_end + pn.peak_end;
        const Real divergence = slope[pm.peak_end] * slope[pn.peak_end] / (lengths[s] * lengths[t]);
        Complex value = vector_factor * direct_dot * direct[ij] + scalar_factor * divergence * phi;
        if (ground_perfect) value -= vector_factor * image_dot * image[ij] + scalar_factor * divergence * phi_image;
        out.push_back({pm.basis, pn.basis, s != t, value * (pm.sign * pn.sign)});
      }
    }
  };

  fill_by_element_rows(
      count,
      [&](int s, std::vector<MatrixContribution>& row) {
        if (basis.pieces_on(s).empty()) return;
        for (int t = s; t < count; ++t) {
          if (basis.pieces_on(t).empty()) continue;
          PairIntegrals direct = segment_pair_integrals(geometry[s], geometry[t], k);
          PairIntegrals image{};
          if (ground_perfect) image = segment_pair_integrals(geometry[s], images[t], k);
          if (s == t) {
            // The self pair is symmetric in (i, j); average away the quadrature's asymmetry.
            direct[1] = direct[2] = 0.5 * (direct[1] + direct[2]);
            image[1] = image[2] = 0.5 * (image[1] + image[2]);
          }
          contributions(s, t, direct, image, row);
        }
      },
      z);
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
