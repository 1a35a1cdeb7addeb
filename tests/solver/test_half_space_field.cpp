// The field real ground reflects, by Sommerfeld integrals: its perfect-conductor limit
// against the exact image, and its far zone against the Fresnel-weighted image.
#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>

#include "core/constants.hpp"
#include "solver/fresnel.hpp"
#include "solver/ground_kernel_table.hpp"
#include "solver/half_space_field.hpp"

namespace lobe {
namespace {

constexpr Real k = 2 * pi;  // λ = 1 m

/// (k² I + ∇∇) e^{−jkR}/(4πR) / k² at R (the free-space dyadic Green's function, e.g.
/// Balanis, Advanced Engineering Electromagnetics, ch. 14).
Eigen::Matrix3cd free_space_dyadic(const Vec3& r) {
  const Real d = r.norm();
  const Complex g = std::exp(Complex(0.0, -k * d)) / (4 * pi * d);
  const Complex a = k * k - j_unit * k / d - 1.0 / (d * d), b = -k * k + 3.0 * j_unit * k / d + 3.0 / (d * d);
  const Vec3 u = r / d;
  return (g / (k * k)) * (a * Eigen::Matrix3cd::Identity() + b * (u * u.transpose()).cast<Complex>());
}

Eigen::Matrix3cd sommerfeld_dyadic(Complex eps, const Vec3& observer, const Vec3& source) {
  const Vec3 d = observer - source;
  const Real rho = std::hypot(d.x(), d.y());
  const Real c = rho > 0.0 ? d.x() / rho : 1.0, s = rho > 0.0 ? d.y() / rho : 0.0;
  return reflected_dyadic(reflected_integrals(eps, k, rho, observer.z() + source.z()), c, s);
}

// A perfect conductor reflects as the exact image of the source, −M p at the mirror point
// (image theory): a very good conductor (εg = −j 1e10) within 1e-4 of it. The residual is
// its surface impedance: 1 + R_TE = 2kz/(kz + kz1) ≈ 2 cos θ/√εg, here 2e-5. Checks every
// component and the signs of R_TE (−1) and R_TM (+1) apart.
TEST(HalfSpaceField, GoodConductorReflectsAsTheImage) {
  const Complex eps(1.0, -1e10);
  const Eigen::Matrix3cd minus_mirror = -Eigen::Vector3cd(1.0, 1.0, -1.0).asDiagonal().toDenseMatrix();
  for (const auto& [observer, source] : {std::pair{Vec3(0.3, 0.2, 0.25), Vec3(0.0, 0.0, 0.15)},
                                         std::pair{Vec3(1.1, -0.4, 0.6), Vec3(0.1, 0.2, 0.3)},
                                         std::pair{Vec3(0.0, 0.0, 0.4), Vec3(0.0, 0.0, 0.1)}}) {
    const Vec3 image(source.x(), source.y(), -source.z());
    const Eigen::Matrix3cd expected = free_space_dyadic(observer - image) * minus_mirror;
    const Eigen::Matrix3cd computed = sommerfeld_dyadic(eps, observer, source);
    EXPECT_LT((computed - expected).norm(), 1e-4 * expected.norm()) << computed << "\n vs \n" << expected;
  }
}

// Far from the source the reflected field is the space wave: the image's far field with
// the Fresnel coefficients at the ray's angle (Balanis, Antenna Theory, §4.8), the rest
// falling off faster than 1/R. Average soil, the ray from the image at 20 λ and 30° to 60°
// of elevation: within 2 % of the field's size, in the components transverse to the ray.
// (Nearer the horizon the ground's surface wave is still as large as the space wave at
// 20 λ: at 15° they differ by 4 %, as they should.)
TEST(HalfSpaceField, FarZoneIsTheFresnelWeightedImage) {
  const Complex eps = ground_permittivity(13.0, 0.005, 299792458.0);
  const Vec3 source(0.0, 0.0, 0.7);
  for (const Real elevation_deg : {30.0, 45.0, 60.0}) {
    const Real elevation = elevation_deg * pi / 180.0, distance = 20.0;
    const Vec3 image(0.0, 0.0, -0.7);
    const Vec3 observer = image + distance * Vec3(std::cos(elevation) * 0.6, std::cos(elevation) * 0.8, std::sin(elevation));
    const GroundImageWeights w = ground_image_weights(eps, observer, source);
    // The far field of the weighted image: its transverse part only.
    const Vec3 u = (observer - image).normalized();
    const Eigen::Matrix3cd transverse = (Eigen::Matrix3d::Identity() - u * u.transpose()).cast<Complex>();
    const Complex g = std::exp(Complex(0.0, -k * distance)) / (4 * pi * distance);
    const Eigen::Matrix3cd expected = transverse * g * w.current;
    const Eigen::Matrix3cd computed = transverse * sommerfeld_dyadic(eps, observer, source);
    EXPECT_LT((computed - expected).norm(), 0.02 * expected.norm()) << elevation_deg << " deg\n" << computed << "\n vs \n" << expected;
  }
}

// Reciprocity, G(r, r') = G(r', r)ᵀ, on average soil near the ground.
TEST(HalfSpaceField, IsReciprocal) {
  const Complex eps = ground_permittivity(13.0, 0.005, 299792458.0);
  const Vec3 a(0.2, -0.1, 0.05), b(-0.3, 0.25, 0.12);
  const Eigen::Matrix3cd ab = sommerfeld_dyadic(eps, a, b), ba = sommerfeld_dyadic(eps, b, a);
  EXPECT_LT((ab - ba.transpose()).norm(), 1e-6 * ab.norm());
}

// The table reads what direct integration gives, within 1e-4 of the integrals' size, over
// a wire structure's distances near average soil (heights sums from 0.02 λ, out to 1.5 λ).
TEST(GroundKernelTable, ReadsWhatDirectIntegrationGives) {
  const Complex eps = ground_permittivity(13.0, 0.005, 299792458.0);
  const GroundKernelTable table(eps, k, 0.02, 1.5, std::asin(0.02 / 1.5));
  Real worst = 0.0;
  for (const Real h : {0.02, 0.037, 0.11, 0.3, 0.9})
    for (const Real rho : {0.0, 0.013, 0.07, 0.24, 0.61, 1.1}) {
      if (std::hypot(rho, h) > 1.5) continue;
      const ReflectedIntegrals direct = reflected_integrals(eps, k, rho, h), read = table.at(rho, h);
      const Eigen::Vector4cd a(direct.t1, direct.t2, direct.t3, direct.t4), b(read.t1, read.t2, read.t3, read.t4);
      worst = std::max(worst, (a - b).norm() / a.norm());
      EXPECT_LT((a - b).norm(), 1e-4 * a.norm()) << "rho " << rho << " h " << h;
    }
  std::printf("table: %zu points, worst relative error %.2g\n", table.size(), worst);
}

}  // namespace
}  // namespace lobe
