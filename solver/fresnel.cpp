#include "solver/fresnel.hpp"

#include <algorithm>
#include <cmath>

#include "core/constants.hpp"

namespace lobe {

FresnelCoefficients fresnel_coefficients(Complex eps, Real cos_theta) {
  const Real sin2 = 1.0 - cos_theta * cos_theta;
  const Complex root = std::sqrt(eps - sin2);
  return {(eps * cos_theta - root) / (eps * cos_theta + root), (cos_theta - root) / (cos_theta + root)};
}

Complex ground_permittivity(Real permittivity, Real conductivity, Real frequency_hz) {
  return {permittivity, -conductivity / (2 * pi * frequency_hz * eps0)};
}

GroundImageWeights ground_image_weights(Complex eps, const Vec3& observer, const Vec3& source) {
  const Vec3 mirrored(source.x(), source.y(), -source.z());
  const Vec3 ray = observer - mirrored;
  const Real distance = ray.norm();
  const Real cos_theta = distance > 0.0 ? std::clamp(ray.z() / distance, 0.0, 1.0) : 1.0;
  const FresnelCoefficients g = fresnel_coefficients(eps, cos_theta);
  // Across the plane of incidence: t = ẑ × ρ̂. Straight up (ρ = 0) Γv = −Γh and any t will do.
  const Real horizontal = std::hypot(ray.x(), ray.y());
  const Vec3 across = horizontal > 1e-12 * distance ? Vec3(Vec3(-ray.y(), ray.x(), 0.0) / horizontal) : Vec3(Vec3::UnitY());
  const Eigen::Matrix3d across_part = across * across.transpose();
  const Eigen::Matrix3cd in_plane = (Eigen::Matrix3d::Identity() - across_part).cast<Complex>();
  const Eigen::Matrix3d perfect_image = -Eigen::Vector3d(1.0, 1.0, -1.0).asDiagonal().toDenseMatrix();
  return {(g.vertical * in_plane - g.horizontal * across_part.cast<Complex>()) * perfect_image.cast<Complex>(), -g.vertical};
}

}  // namespace lobe
