#include "post/far_field.hpp"

#include <cmath>

#include "core/constants.hpp"
#include "solver/fresnel.hpp"
#include "solver/gauss_legendre.hpp"
#include "solver/green_function.hpp"
#include "solver/phase_factor.hpp"

namespace lobe {

FarField::FarField(const AntennaProblem& problem, const FrequencySolution& solution)
    : m_k(problem.medium.wavenumber(solution.frequency_hz)), m_omega(2 * pi * solution.frequency_hz),
      m_images(problem.medium.images()), m_ground(problem.medium.has_ground()),
      m_slab(problem.medium.has_slab() ? std::optional<GroundedSlab>(problem.medium.slab(solution.frequency_hz))
                                       : std::nullopt),
      m_ground_permittivity(problem.medium.has_real_ground()
                                ? std::optional<Complex>(problem.medium.ground_permittivity(solution.frequency_hz))
                                : std::nullopt) {
  const WireMesh& mesh = problem.mesh;
  const SurfaceMesh& surface = problem.surfaces.mesh;
  for (const auto& s : mesh.segments) m_centre += s.midpoint();
  for (std::size_t t = 0; t < surface.triangles.size(); ++t) m_centre += surface.centroid(static_cast<int>(t));
  const std::size_t elements = mesh.segments.size() + surface.triangles.size();
  if (elements > 0) m_centre /= static_cast<Real>(elements);
  // Images make the source symmetric about each mirror plane (all through the origin); on
  // a substrate, as over the bare ground, the phase is referred to the ground plane.
  for (const ImageSource& image : m_images) m_centre = 0.5 * (m_centre + image.point(m_centre));
  if (m_slab) m_centre.z() = 0.0;

  for (const BasisSample& sample : problem.samples) add_source(sample.r, sample.moment(solution.coefficients));
  for (const Probe& probe : problem.probes) {
    const Vec3 foot = probe.foot - m_centre;
    m_probes.push_back({foot.x(), foot.y(), solution.coefficients[probe.basis]});
    m_extent = std::max(m_extent, foot.norm());
  }
}

void FarField::add_point(PointSources& set, const Vec3& x, const Eigen::Vector3cd& moment) {
  set.x.push_back(x.x());
  set.y.push_back(x.y());
  set.z.push_back(x.z());
  for (int c = 0; c < 3; ++c) {
    set.moment_re[c].push_back(moment[c].real());
    set.moment_im[c].push_back(moment[c].imag());
  }
  m_extent = std::max(m_extent, x.norm());
}

void FarField::add_source(const Vec3& r, const Eigen::Vector3cd& moment) {
  add_point(m_points, r - m_centre, moment);
  // The medium's images of the current element (m_centre lies on each mirror plane).
  for (const ImageSource& image : m_images)
    add_point(m_ground_permittivity ? m_reflected : m_points, image.point(r) - m_centre, image.current(moment));
}

Eigen::Vector3cd FarField::PointSources::sum(Real rx, Real ry, Real rz) const {
  // Phases of all points first, then their factors in one vectorised call; per-thread
  // buffers because directions are evaluated in parallel.
  thread_local std::vector<Real> phase, sine, cosine;
  const int count = static_cast<int>(x.size());
  phase.resize(count);
  sine.resize(count);
  cosine.resize(count);
  for (int p = 0; p < count; ++p) phase[p] = rx * x[p] + ry * y[p] + rz * z[p];
  sine_cosine(phase.data(), sine.data(), cosine.data(), count);
  Eigen::Vector3cd n;
  for (int c = 0; c < 3; ++c) {
    const Real* re = moment_re[c].data();
    const Real* im = moment_im[c].data();
    Real sum_re = 0.0, sum_im = 0.0;
#pragma omp simd reduction(+ : sum_re, sum_im)
    for (int p = 0; p < count; ++p) {
      sum_re += re[p] * cosine[p] - im[p] * sine[p];
      sum_im += re[p] * sine[p] + im[p] * cosine[p];
    }
    n[c] = Complex(sum_re, sum_im);
  }
  return n;
}

FarFieldSample FarField::at(Real theta, Real phi) const {
  if (m_ground && theta > 0.5 * pi + 1e-12) return {0.0, 0.0};
  const Real st = std::sin(theta), ct = std::cos(theta), sp = std::sin(phi), cp = std::cos(phi);
  const Real rx = m_k * st * cp, ry = m_k * st * sp, rz = m_k * ct;
  const Eigen::Vector3cd n = m_points.sum(rx, ry, rz);
  const Vec3 theta_hat(ct * cp, ct * sp, -st), phi_hat(-sp, cp, 0.0);
  const Complex factor = far_zone_factor(m_omega);
  FarFieldSample e{factor * theta_hat.cast<Complex>().dot(n), factor * phi_hat.cast<Complex>().dot(n)};
  if (m_ground_permittivity) {
    // The perfect ground's image field, its vertical (θ̂) part times Γv and its horizontal
    // (φ̂) part times −Γh at incidence θ (both 1 over a perfect conductor).
    const Eigen::Vector3cd image = m_reflected.sum(rx, ry, rz);
    const FresnelCoefficients g = fresnel_coefficients(*m_ground_permittivity, std::max(ct, 0.0));
    e.e_theta += g.vertical * factor * theta_hat.cast<Complex>().dot(image);
    e.e_phi -= g.horizontal * factor * phi_hat.cast<Complex>().dot(image);
  }
  if (m_slab) {
    const SlabFarFieldFactors t = slab_far_field_factors(*m_slab, theta);
    e.e_theta *= t.tm;
    e.e_phi *= t.te;
    // A probe's vertical current radiates through the slab by its own spectrum; its far-zone
    // A_z is μ0/(4π) times the length below (the phase is referred to its foot on the ground).
    if (!m_probes.empty()) {
      Complex sum = 0.0;
      for (const ProbeCurrent& p : m_probes) sum += p.current * std::polar(1.0, rx * p.x + ry * p.y);
      e.e_theta += factor * (-st) * probe_far_field_length(*m_slab, theta) * sum;
    }
  }
  return e;
}

Real FarField::intensity(Real theta, Real phi) const {
  const FarFieldSample e = at(theta, phi);
  return (std::norm(e.e_theta) + std::norm(e.e_phi)) / (2 * eta0);
}

Real FarField::radiated_power() const {
  const int harmonics = static_cast<int>(std::ceil(m_k * m_extent));
  const int n_theta = std::min(max_gauss_legendre_order, harmonics + 16);
  const int n_phi = 2 * harmonics + 16;
  const QuadratureRule& rule = gauss_legendre(n_theta);
  // cos θ over [−1, 1], or [0, 1] over a ground plane.
  const Real mu_low = m_ground ? 0.0 : -1.0;
  Real total = 0.0;
#pragma omp parallel for reduction(+ : total) collapse(2)
  for (int i = 0; i < n_theta; ++i)
    for (int j = 0; j < n_phi; ++j) {
      const Real mu = mu_low + (1.0 - mu_low) * rule.nodes[i];
      const Real weight = (1.0 - mu_low) * rule.weights[i] * 2 * pi / n_phi;
      total += weight * intensity(std::acos(mu), 2 * pi * j / n_phi);
    }
  return total;
}

}  // namespace lobe
