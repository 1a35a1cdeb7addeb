#include "solver/surface_fill.hpp"

#include <cmath>
#include <vector>

#include "core/check.hpp"
#include "core/constants.hpp"
#include "solver/pair_fill.hpp"
#include "solver/triangle_pair_integrals.hpp"
#include "solver/triangle_rules.hpp"

namespace lobe {
void add_surface_impedance(const SurfaceMesh& mesh, const RwgBasis& basis, bool ground_perfect, Real frequency_hz,
                           ComplexMatrix& z) {
  LOBE_CHECK(z.rows() >= basis.first() + basis.size() && z.cols() == z.rows(), "impedance matrix of the wrong size");
  // The image of f = c (r − v) on a triangle mirrored in z = 0 is c (r' − v') on the
  // mirrored triangle, with the charge and the vector potential negated.
  SurfaceMesh image = mesh;
  for (Vec3& v : image.vertices) v.z() = -v.z();
  const std::vector<TriangleQuadrature> triangles = triangle_quadrature(mesh);
  const std::vector<TriangleQuadrature> images = ground_perfect ? triangle_quadrature(image) : std::vector<TriangleQuadrature>{};
  const Real omega = 2 * pi * frequency_hz;
  const Real k = omega / speed_of_light;
  const Complex vector_factor = j_unit * omega * mu0;
  const Complex scalar_factor = -j_unit / (omega * eps0);
  const int count = static_cast<int>(mesh.triangles.size());
  fill_by_element_rows(
      count,
      [&](int p, std::vector<MatrixContribution>& row) {
        if (basis.pieces_on(p).empty()) return;
        for (int q = p; q < count; ++q) {
          if (basis.pieces_on(q).empty()) continue;
          TrianglePairIntegrals integrals = triangle_pair_integrals(triangles[p], triangles[q], k);
          if (ground_perfect) {
            // G(r, M r') is symmetric in the pair, so the image term keeps Z symmetric.
            const TrianglePairIntegrals mirrored = triangle_pair_integrals(triangles[p], images[q], k);
            integrals.vector -= mirrored.vector;
            integrals.scalar -= mirrored.scalar;
          }
          if (p == q) integrals.vector = (0.5 * (integrals.vector + integrals.vector.transpose())).eval();
          for (const RwgPiece& pm : basis.pieces_on(p))
            for (const RwgPiece& pn : basis.pieces_on(q)) {
              // f = c (r − v_free), ∇·f = 2c.
              const Complex value = pm.coefficient * pn.coefficient *
                                    (vector_factor * integrals.vector(pm.free_corner, pn.free_corner) +
                                     scalar_factor * 4.0 * integrals.scalar);
              row.push_back({pm.basis, pn.basis, p != q, value});
            }
        }
      },
      z);
}

ComplexVector plane_wave_excitation(const SurfaceMesh& mesh, const RwgBasis& basis, Real frequency_hz, Real theta,
                                    Real phi, bool theta_polarized) {
  const Real k = 2 * pi * frequency_hz / speed_of_light;
  const Real st = std::sin(theta), ct = std::cos(theta), sp = std::sin(phi), cp = std::cos(phi);
  const Vec3 r_hat(st * cp, st * sp, ct);
  const Vec3 polarization = theta_polarized ? Vec3(ct * cp, ct * sp, -st) : Vec3(-sp, cp, 0.0);
  const TriangleRule& rule = triangle_rule_degree5();
  ComplexVector v = ComplexVector::Zero(basis.first() + basis.size());
  for (std::size_t t = 0; t < mesh.triangles.size(); ++t) {
    const int ti = static_cast<int>(t);
    for (std::size_t a = 0; a < rule.points.size(); ++a) {
      const auto& b = rule.points[a];
      const Vec3 r = b[0] * mesh.corner(ti, 0) + b[1] * mesh.corner(ti, 1) + b[2] * mesh.corner(ti, 2);
      // The wave travels along −r̂: its phase grows toward the direction it comes from.
      const Complex field = std::polar(1.0, k * r_hat.dot(r)) * rule.weights[a] * mesh.area(ti);
      for (const RwgPiece& piece : basis.pieces_on(ti))
        v[piece.basis] += piece.coefficient * (r - mesh.corner(ti, piece.free_corner)).dot(polarization) * field;
    }
  }
  return v;
}

}  // namespace lobe
