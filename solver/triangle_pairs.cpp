// Triangle–triangle terms of the surface (RWG) fill.
#include "solver/pair_integrators.hpp"

namespace lobe {

void add_triangle_triangle_terms(const FillContext& c, int p, std::vector<MatrixContribution>& out) {
  const RwgBasis& basis = c.problem.rwg;
  const FillGeometry& g = c.geometry;
  if (basis.pieces_on(p).empty()) return;
  const int count = static_cast<int>(g.triangles.size());
  for (int q = p; q < count; ++q) {
    if (basis.pieces_on(q).empty()) continue;
    TrianglePairIntegrals integrals = triangle_pair_integrals(g.triangles[p], g.triangles[q], c.k);
    // The image of f = c (r − v) on the mirrored triangle is c (r' − M v): the integrals
    // over the mirrored source, weighted by the image's signs. G(r, M r') is symmetric in
    // the pair, so the image terms keep Z symmetric.
    for (const ImagedElements& imaged : g.images) {
      const TrianglePairIntegrals image = triangle_pair_integrals(g.triangles[p], imaged.triangles[q], c.k);
      integrals.vector += imaged.image.current_sign * image.vector;
      integrals.scalar += imaged.image.charge_sign * image.scalar;
    }
    if (p == q) integrals.vector = (0.5 * (integrals.vector + integrals.vector.transpose())).eval();
    for (const RwgPiece& pm : basis.pieces_on(p))
      for (const RwgPiece& pn : basis.pieces_on(q)) {
        // f = c (r − v_free), ∇·f = 2c.
        const Complex value = pm.coefficient * pn.coefficient *
                              (c.vector_factor * integrals.vector(pm.free_corner, pn.free_corner) +
                               c.scalar_factor * 4.0 * integrals.scalar);
        out.push_back({pm.basis, pn.basis, p != q, value});
      }
  }
}

}  // namespace lobe
