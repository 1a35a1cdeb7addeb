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
  std::vector<Vec3> feet;
  std::vector<Complex> probe_currents;
  for (const Probe& probe : problem.probes) {
    feet.push_back(probe.foot);
    probe_currents.push_back(solution.coefficients[probe.basis]);
    extent = std::max(extent, std::hypot(probe.foot.x(), probe.foot.y()));
  }
  const Complex j_omega_mu = j_unit * omega * mu0, contrast = slab.permittivity - 1.0;
  Real power = 0.0;
  for (const SurfaceWavePole& pole : surface_wave_poles(slab)) {
    const Complex kp = pole.k_rho;
    // The azimuthal integrand is periodic and band-limited by kp times the extent: the
    // trapezoidal rule converges exponentially beyond that many points.
    const int count = 2 * static_cast<int>(std::ceil(std::abs(kp) * extent)) + 32;
    // The transform of ∇·J counts each star's unit source at its vertex, so the probes' own
    // kernels must count the charge at their tops again: Φ = Φ_r − g_V/(jωε0), and the
    // voltage along a probe W + g_V/(jωε0) (their poles' J0 parts are smooth at ρ = 0).
    const Complex charge_residue = pole.residue.scalar / (j_unit * omega * eps0);
    const Complex coupling_residue = j_omega_mu * contrast * pole.probe.coupling - charge_residue;
    const Complex self_residue =
        -j_omega_mu * (contrast * pole.probe.coupling + slab.permittivity * pole.probe.self) + charge_residue;
    Real mean_total = 0.0, mean_along = 0.0;
    Complex mean_cross = 0.0, mean_probes = 0.0;
    for (int a = 0; a < count; ++a) {
      const Real alpha = 2 * pi * a / count;
      const Vec3 direction(std::cos(alpha), std::sin(alpha), 0.0);
      Eigen::Vector3cd transform = Eigen::Vector3cd::Zero();
      for (std::size_t s = 0; s < points.size(); ++s)
        transform += moments[s] * std::exp(-j_unit * kp * direction.dot(points[s]));
      mean_total += transform.squaredNorm() / count;
      const Complex along = direction.cast<Complex>().dot(transform);
      mean_along += std::norm(along) / count;
      if (feet.empty()) continue;
      Complex probes = 0.0;
      for (std::size_t p = 0; p < feet.size(); ++p) probes += probe_currents[p] * std::exp(-j_unit * kp * direction.dot(feet[p]));
      const Complex divergence = j_unit * kp * along;
      mean_cross += 2.0 * (std::conj(divergence) * probes).real() / Real(count);
      mean_probes += std::norm(probes) / Real(count);
    }
    power += 0.5 * (omega * mu0 * kp * pole.residue.vector / 2.0 * mean_total -
                    kp * kp * kp * pole.residue.scalar / (2.0 * omega * eps0) * mean_along -
                    0.5 * j_unit * kp * (coupling_residue * mean_cross + self_residue * mean_probes))
                       .real();
  }
  return power;
}

}  // namespace lobe
