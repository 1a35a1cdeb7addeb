#pragma once
/// The current of every basis function sampled at quadrature points: what radiates (the far
/// field sums it with the far-zone phase) and what an incident field is tested with (the
/// excitation sums it against E). One set of points for both keeps the two exactly
/// reciprocal: the open-circuit voltage a wave induces at a port is what that port's
/// transmit far field predicts.
#include <vector>

#include "geometry/surface_mesh.hpp"
#include "geometry/wire_mesh.hpp"
#include "solver/junction_star.hpp"
#include "solver/rwg_basis.hpp"
#include "solver/wire_basis.hpp"

namespace lobe {

/// f_b dl (or dS) of basis function b at a point, A·m per ampere of b.
struct BasisWeight {
  int basis;
  Vec3 moment;
};

struct BasisSample {
  Vec3 r;
  std::vector<BasisWeight> weights;
  /// The current moment here, A·m, for the basis coefficients of a solution.
  Eigen::Vector3cd moment(const ComplexVector& coefficients) const {
    Eigen::Vector3cd sum = Eigen::Vector3cd::Zero();
    for (const BasisWeight& w : weights) sum += coefficients[w.basis] * w.moment.cast<Complex>();
    return sum;
  }
};

/// Six Gauss points per segment (exact to rounding for the linear current times the phase
/// over segments up to about a quarter wavelength), Dunavant's 7 points per triangle, and
/// 6 × 6 Duffy points per junction-star triangle (smooth in those coordinates). Made once per
/// problem (AntennaProblem::samples).
std::vector<BasisSample> basis_samples(const WireMesh& wires, const WireBasis& basis, const SurfaceMesh& surface,
                                       const RwgBasis& rwg, const std::vector<JunctionStar>& stars);

}  // namespace lobe
