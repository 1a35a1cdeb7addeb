#include "post/surface_wave_power.hpp"

#include <cmath>

#include "core/constants.hpp"

namespace lobe {

Real surface_wave_power(const AntennaProblem& problem, const FrequencySolution& solution) {
  if (!problem.medium.has_slab()) return 0.0;
  const GroundedSlab slab = problem.medium.slab(solution.frequency_hz);
  const Real omega = 2 * pi * solution.frequency_hz;
  // The current moments at the sample points, once.
  std::vector<Vec3> points;
  std::vector<Eigen::Vector3cd> moments;
  Real extent = 0.0;
  for (const BasisSample& sample : problem.samples) {
    points.push_back(sample.r);
    moments.push_back(sample.moment(solution.coefficients));
    extent = std::max(extent, std::hypot(sample.r.x(), sample.r.y()));
  }
  Real power = 0.0;
  for (const SurfaceWavePole& pole : surface_wave_poles(slab)) {
    const Complex kp = pole.k_rho;
    // The azimuthal integrand is periodic and band-limited by kp times the extent: the
    // trapezoidal rule converges exponentially beyond that many points.
    const int count = 2 * static_cast<int>(std::ceil(std::abs(kp) * extent)) + 32;
    Real mean_total = 0.0, mean_along = 0.0;
    for (int a = 0; a < count; ++a) {
      const Real alpha = 2 * pi * a / count;
      const Vec3 direction(std::cos(alpha), std::sin(alpha), 0.0);
      Eigen::Vector3cd transform = Eigen::Vector3cd::Zero();
      for (std::size_t s = 0; s < points.size(); ++s)
        transform += moments[s] * std::exp(-j_unit * kp * direction.dot(points[s]));
      mean_total += transform.squaredNorm() / count;
      mean_along += std::norm(direction.cast<Complex>().dot(transform)) / count;
    }
    power += 0.5 * (omega * mu0 * kp * pole.residue.vector / 2.0 * mean_total -
                    kp * kp * kp * pole.residue.scalar / (2.0 * omega * eps0) * mean_along)
                       .real();
  }
  return power;
}

}  // namespace lobe
