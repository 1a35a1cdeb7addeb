#include "support/fine_pair_quadrature.hpp"

#include <cmath>

#include "solver/green_function.hpp"
#include "solver/triangle_rules.hpp"

namespace lobe {

TrianglePairIntegrals fine_pair_integrals(const TriangleQuadrature& p, const TriangleQuadrature& q,
                                          const std::function<PairKernels(Real distance)>& kernels) {
  static const TriangleRule rule = subdivided_triangle_rule(3);
  const auto at = [](const std::array<Real, 3>& b, const TriangleQuadrature& t) {
    return Vec3(b[0] * t.corners[0] + b[1] * t.corners[1] + b[2] * t.corners[2]);
  };
  TrianglePairIntegrals sum;
  for (std::size_t a = 0; a < rule.points.size(); ++a) {
    const Vec3 x = at(rule.points[a], p);
    for (std::size_t b = 0; b < rule.points.size(); ++b) {
      const Vec3 y = at(rule.points[b], q);
      const PairKernels k = kernels((x - y).norm());
      const Real w = rule.weights[a] * p.area * rule.weights[b] * q.area;
      sum.scalar += w * k.scalar;
      for (int i = 0; i < 3; ++i)
        for (int j = 0; j < 3; ++j) sum.vector(i, j) += w * k.vector * (x - p.corners[i]).dot(y - q.corners[j]);
    }
  }
  return sum;
}

TrianglePairIntegrals fine_pair_integrals(const TriangleQuadrature& p, const TriangleQuadrature& q, Real k) {
  return fine_pair_integrals(p, q, [k](Real distance) {
    const Complex g = green_scale * std::exp(Complex(0.0, -k * distance)) / distance;
    return PairKernels{g, g};
  });
}

Real relative_error(const TrianglePairIntegrals& x, const TrianglePairIntegrals& reference) {
  return std::max((x.vector - reference.vector).cwiseAbs().maxCoeff() / reference.vector.cwiseAbs().maxCoeff(),
                  std::abs(x.scalar - reference.scalar) / std::abs(reference.scalar));
}

}  // namespace lobe
