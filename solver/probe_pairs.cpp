// The terms of the probes through a substrate. A probe's function is its uniform vertical
// current V plus the junction star S at its top; the star's terms (its charge and its
// horizontal current, with the surface kernels) are the star integrator's. What the vertical
// part adds, with the charge at its top left to the star (solver/probe_kernels.hpp):
//   against an RWG or star function f_m:  ∫ Φ_r ∇·f_m dS (a star's ∇·f holds the unit source
//                                          at its vertex: Φ_r there is added),
//   against its own star:                  twice that (V–S and S–V, reciprocal),
//   against a probe's vertical part:       W(ρ), at the radius for the probe itself.
#include <algorithm>
#include <cmath>

#include "solver/pair_integrators.hpp"

namespace lobe {
namespace {

/// Star samples per direction on each star triangle for the smooth Φ_r.
constexpr int star_order = 6;

Real horizontal_distance(const Vec3& a, const Vec3& b) { return std::hypot(a.x() - b.x(), a.y() - b.y()); }

/// ∫ Φ_r ∇·f dS over a star's function, its vertex's unit source included.
Complex star_coupling(const ProbeKernels& kernels, const JunctionStar& star, const Vec3& foot) {
  Complex sum = kernels.coupling(horizontal_distance(star.vertex, foot));
  for (const StarSample& s : star_samples(star, star_order)) sum += s.charge * kernels.coupling(horizontal_distance(s.r, foot));
  return sum;
}

}  // namespace

void add_probe_terms(const FillContext& c, int segment, std::vector<MatrixContribution>& out) {
  const std::vector<Probe>& probes = c.problem.probes;
  const auto own = std::find_if(probes.begin(), probes.end(), [&](const Probe& p) { return p.segment == segment; });
  if (own == probes.end()) return;
  const Probe& probe = *own;
  const ProbeKernels& kernels = *c.probe_kernels;

  for (auto other = own; other != probes.end(); ++other) {
    const bool self = other == own;
    const Real rho = self ? probe.radius : horizontal_distance(probe.foot, other->foot);
    out.push_back({other->basis, probe.basis, !self, kernels.self(rho)});
  }
  for (const Probe& other : probes) {
    const Complex value = star_coupling(kernels, c.problem.stars[other.star], probe.foot);
    const bool self = &other == &probe;
    out.push_back({other.basis, probe.basis, !self, self ? 2.0 * value : value});
  }
  const RwgBasis& rwg = c.problem.rwg;
  const FillGeometry& g = c.geometry;
  for (int t = 0; t < static_cast<int>(g.triangles.size()); ++t) {
    if (rwg.pieces_on(t).empty()) continue;
    const TriangleQuadrature& q = g.triangles[t];
    Complex potential = 0.0;  // ∫ Φ_r dS over the triangle
    for (int i = 0; i < TriangleQuadrature::points; ++i) potential += q.w[i] * kernels.coupling(horizontal_distance(q.x[i], probe.foot));
    for (const RwgPiece& piece : rwg.pieces_on(t))  // ∇·f = 2c
      out.push_back({piece.basis, probe.basis, true, 2.0 * piece.coefficient * potential});
  }
}

}  // namespace lobe
