#include "post/surface_far_field.hpp"

#include <cmath>

#include "core/constants.hpp"
#include "solver/triangle_rules.hpp"

namespace lobe {

FarFieldSample surface_far_field(const SurfaceMesh& mesh, const RwgBasis& basis, const ComplexVector& coefficients,
                                 Real frequency_hz, Real theta, Real phi) {
  const Real omega = 2 * pi * frequency_hz, k = omega / speed_of_light;
  const Real st = std::sin(theta), ct = std::cos(theta), sp = std::sin(phi), cp = std::cos(phi);
  const Vec3 r_hat(st * cp, st * sp, ct), theta_hat(ct * cp, ct * sp, -st), phi_hat(-sp, cp, 0.0);
  const TriangleRule& rule = triangle_rule_degree5();
  Eigen::Vector3cd n = Eigen::Vector3cd::Zero();
  for (std::size_t t = 0; t < mesh.triangles.size(); ++t) {
    const int ti = static_cast<int>(t);
    for (std::size_t a = 0; a < rule.points.size(); ++a) {
      const auto& b = rule.points[a];
      const Vec3 r = b[0] * mesh.corner(ti, 0) + b[1] * mesh.corner(ti, 1) + b[2] * mesh.corner(ti, 2);
      n += current_density(mesh, basis, coefficients, ti, r) * std::polar(rule.weights[a] * mesh.area(ti), k * r_hat.dot(r));
    }
  }
  const Complex factor = -j_unit * omega * mu0 / (4 * pi);
  return {factor * theta_hat.cast<Complex>().dot(n), factor * phi_hat.cast<Complex>().dot(n)};
}

Real radar_cross_section(const FarFieldSample& scattered) {
  return 4 * pi * (std::norm(scattered.e_theta) + std::norm(scattered.e_phi));
}

}  // namespace lobe
