#include "solver/stamps.hpp"

#include <cmath>

#include "core/constants.hpp"
#include "solver/line_parameters.hpp"

namespace lobe {

Complex load_impedance(const LumpedValues& load, Real frequency_hz) {
  const ImpedanceRatio z = lumped_input(load, frequency_hz);
  return z.voltage / z.current;
}

Complex wire_internal_impedance(Real radius, Real conductivity, Real frequency_hz) {
  const Real omega = 2 * pi * frequency_hz;
  const Real surface_resistance = std::sqrt(omega * mu0 / (2 * conductivity));
  return Complex(1.0, 1.0) * surface_resistance / (2 * pi * radius);
}

std::vector<MatrixContribution> conductor_loss_stamp(const WireMesh& mesh, const WireBasis& basis, Real frequency_hz) {
  std::vector<MatrixContribution> terms;
  for (std::size_t s = 0; s < mesh.segments.size(); ++s) {
    const Segment& seg = mesh.segments[s];
    if (seg.conductivity <= 0.0) continue;
    const Complex per_metre = wire_internal_impedance(seg.radius, seg.conductivity, frequency_hz);
    const Real l = seg.length();
    for (const BasisPiece& pm : basis.pieces_on(static_cast<int>(s)))
      for (const BasisPiece& pn : basis.pieces_on(static_cast<int>(s))) {
        const Real overlap = pm.peak_end == pn.peak_end ? l / 3.0 : l / 6.0;
        terms.push_back({pm.basis, pn.basis, false, pm.sign * pn.sign * overlap * per_metre});
      }
  }
  return terms;
}

std::vector<MatrixContribution> load_stamp(const Eigen::VectorXd& p, Complex z_load) {
  std::vector<MatrixContribution> terms;
  for (Eigen::Index i = 0; i < p.size(); ++i)
    if (p[i] != 0.0)
      for (Eigen::Index j = 0; j < p.size(); ++j)
        if (p[j] != 0.0) terms.push_back({static_cast<int>(i), static_cast<int>(j), false, z_load * p[i] * p[j]});
  return terms;
}

}  // namespace lobe
