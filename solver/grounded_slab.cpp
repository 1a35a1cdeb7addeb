#include "solver/grounded_slab.hpp"

#include <cmath>

#include "core/constants.hpp"
#include "solver/complex_bessel.hpp"

namespace lobe {
namespace {

/// √(x) with Re ≥ 0, and Im ≥ 0 where Re = 0: u = √(kρ² − εr k0²) on the proper sheet for
/// kρ on the real axis or above it (the integration paths stay above the surface-wave poles
/// and the branch point, which a little loss moves below the axis).
Complex proper_root(Complex x) {
  Complex u = std::sqrt(x);
  if (u.real() < 0.0 || (u.real() == 0.0 && u.imag() < 0.0)) u = -u;
  return u;
}

/// The slab's transverse-resonance denominators and the numerator of g̃_V at u0, in forms
/// even in u1 (so either root serves) and finite where tanh(u1 h) has a pole.
struct Denominators {
  Complex te, tm, numerator;  // D_TE, D_TM, N
  Complex u1;
};
Denominators denominators(const GroundedSlab& slab, Complex u0) {
  const Complex u1 = proper_root(u0 * u0 - (slab.permittivity - 1.0) * slab.k0 * slab.k0);
  const Complex t = std::tanh(u1 * slab.thickness);
  return {u0 + u1 / t, slab.permittivity * u0 + u1 * t, u0 + u1 * t, u1};
}

/// d/du0 of D_TE and D_TM (du1/du0 = u0/u1; d(u1 tanh u1h)/du1 = tanh + u1 h sech²).
struct Slopes {
  Complex te, tm;
};
Slopes slopes(const GroundedSlab& slab, Complex u0) {
  const Complex u1 = proper_root(u0 * u0 - (slab.permittivity - 1.0) * slab.k0 * slab.k0);
  const Complex x = u1 * slab.thickness, t = std::tanh(x);
  const Complex sech2 = 1.0 - t * t;
  const Complex d_tanh_term = (t + x * sech2) * u0 / u1;
  const Complex d_coth_term = (1.0 / t - x * sech2 / (t * t)) * u0 / u1;
  return {1.0 + d_coth_term, slab.permittivity + d_tanh_term};
}

/// Real roots α = u0 in (0, √(ε′−1) k0) of the lossless dispersion function, the lossless
/// forms of D_TM (εr α cos qh − q sin qh) or D_TE (α sin qh + q cos qh), q = √((ε′−1)k0² − α²),
/// which have no poles. The grid is graded towards α = 0, where a thin slab's TM0 root lies.
std::vector<Real> lossless_roots(Real permittivity, Real k0, Real h, bool tm) {
  const Real alpha_max = std::sqrt(permittivity - 1.0) * k0;
  const auto f = [&](Real alpha) {
    const Real q = std::sqrt(std::max(0.0, alpha_max * alpha_max - alpha * alpha));
    return tm ? permittivity * alpha * std::cos(q * h) - q * std::sin(q * h)
              : alpha * std::sin(q * h) + q * std::cos(q * h);
  };
  const int n = 4000;
  std::vector<Real> roots;
  Real a = 0.0, fa = f(a);
  for (int i = 1; i <= n; ++i) {
    const Real s = Real(i) / n, b = alpha_max * s * s * s, fb = f(b);
    if (fa != 0.0 && (fa < 0.0) != (fb < 0.0)) {
      Real lo = a, hi = b, flo = fa;
      for (int it = 0; it < 200 && hi - lo > 1e-15 * hi; ++it) {
        const Real mid = 0.5 * (lo + hi), fm = f(mid);
        if ((fm < 0.0) == (flo < 0.0)) {
          lo = mid;
          flo = fm;
        } else {
          hi = mid;
        }
      }
      roots.push_back(0.5 * (lo + hi));
    }
    a = b;
    fa = fb;
  }
  return roots;
}

}  // namespace

namespace {

/// The forms both spectra are written in. With e = e^{−2u1h} (|e| ≤ 1): tanh = (1 − e)/(1 + e).
/// σ = (1 − e)/u1 stays finite as u1 → 0, c = 1 + e, te = u0 σ + c = σ D_TE and
/// tm = εr u0 c + u1² σ = c D_TM: no division by a vanishing tanh.
struct SlabForms {
  Complex u0, u1_squared, sigma, c, te, tm;
};
SlabForms slab_forms(const GroundedSlab& slab, Complex k_rho) {
  const Complex u0 = proper_root(k_rho * k_rho - slab.k0 * slab.k0);
  const Complex u1 = proper_root(k_rho * k_rho - slab.permittivity * slab.k0 * slab.k0);
  const Complex x = u1 * slab.thickness, e = std::exp(-2.0 * x);
  const Complex sigma = std::abs(x) < 1e-4 ? slab.thickness * (2.0 - 2.0 * x + (4.0 / 3.0) * x * x) : (1.0 - e) / u1;
  const Complex c = 1.0 + e, u1_squared = u1 * u1;
  return {u0, u1_squared, sigma, c, u0 * sigma + c, slab.permittivity * u0 * c + u1_squared * sigma};
}

}  // namespace

SlabSpectrum slab_spectrum(const GroundedSlab& slab, Complex k_rho) {
  // g̃_A = σ/te and g̃_V = σ(u0 c + u1² σ)/(te tm).
  const SlabForms f = slab_forms(slab, k_rho);
  return {f.sigma / f.te, f.sigma * (f.u0 * f.c + f.u1_squared * f.sigma) / (f.te * f.tm)};
}

ProbeSpectrum probe_spectrum(const GroundedSlab& slab, Complex k_rho) {
  const SlabForms f = slab_forms(slab, k_rho);
  return {f.sigma / f.tm, f.sigma * f.sigma / (f.te * f.tm), f.u0 * f.sigma / (f.u1_squared * f.tm)};
}

namespace {

/// The vertical wavenumbers of the plane wave leaving at θ from the zenith, in air and in the
/// slab, and τ = tan(k_z1 h)/k_z1 (→ h as k_z1 → 0, at grazing on an air board), the form
/// in which the far-field factors never divide by zero.
struct FarZoneWavenumbers {
  Complex kz0, kz1, tau;
};
FarZoneWavenumbers far_zone_wavenumbers(const GroundedSlab& slab, Real theta) {
  const Real st = std::sin(theta);
  const Complex kz0 = slab.k0 * std::cos(theta);
  const Complex kz1 = slab.k0 * std::sqrt(slab.permittivity - st * st);
  const Complex x = kz1 * slab.thickness;
  return {kz0, kz1, std::abs(x) < 1e-4 ? slab.thickness * (1.0 + x * x / 3.0) : std::tan(x) / kz1};
}

}  // namespace

Complex probe_far_field_length(const GroundedSlab& slab, Real theta) {
  const auto [kz0, kz1, tau] = far_zone_wavenumbers(slab, theta);
  return 2.0 * j_unit * kz0 * tau * std::exp(j_unit * kz0 * slab.thickness) /
         (j_unit * slab.permittivity * kz0 - kz1 * kz1 * tau);
}

SlabSpectrum quasi_static_coefficients(const GroundedSlab& slab) { return {1.0, 2.0 / (slab.permittivity + 1.0)}; }

std::vector<SurfaceWavePole> surface_wave_poles(const GroundedSlab& slab) {
  std::vector<SurfaceWavePole> poles;
  const Real lossless = slab.permittivity.real();
  if (lossless <= 1.0) return poles;
  for (const bool tm : {true, false}) {
    for (const Real alpha : lossless_roots(lossless, slab.k0, slab.thickness, tm)) {
      // Newton from the lossless root on the lossy denominator: loss moves the pole off the axis.
      Complex u0 = alpha;
      for (int it = 0; it < 50; ++it) {
        const Denominators d = denominators(slab, u0);
        const Slopes s = slopes(slab, u0);
        const Complex step = tm ? d.tm / s.tm : d.te / s.te;
        u0 -= step;
        if (std::abs(step) < 1e-15 * std::abs(u0)) break;
      }
      const Complex k_rho = proper_root(slab.k0 * slab.k0 + u0 * u0);
      const Denominators d = denominators(slab, u0);
      const Slopes s = slopes(slab, u0);
      const Complex to_k_rho = k_rho / u0;  // du0/dkρ = kρ/u0
      SurfaceWavePole pole;
      pole.k_rho = k_rho;
      pole.transverse_magnetic = tm;
      // p̃ = (tanh(u1 h)/u1)/(D_TE D_TM) and q̃ = u0 tanh(u1 h)/(u1³ D_TM).
      const Complex tanh_over_u1 = (d.tm - slab.permittivity * u0) / (d.u1 * d.u1);
      if (tm) {
        const Complex slope = s.tm * to_k_rho;
        pole.residue.scalar = d.numerator / (d.te * slope);
        pole.probe.coupling = tanh_over_u1 / (d.te * slope);
        pole.probe.self = u0 * tanh_over_u1 / (d.u1 * d.u1 * slope);
      } else {
        const Complex slope = s.te * to_k_rho;
        pole.residue.vector = 1.0 / slope;
        pole.residue.scalar = d.numerator / (d.tm * slope);
        pole.probe.coupling = tanh_over_u1 / (d.tm * slope);
      }
      poles.push_back(pole);
    }
  }
  return poles;
}

SlabFarFieldFactors slab_far_field_factors(const GroundedSlab& slab, Real theta) {
  // te = 2j k_z0 τ/(1 + j k_z0 τ), tm = 2j k_z1² τ/(εr k_z0 + j k_z1² τ).
  const auto [kz0, kz1, tau] = far_zone_wavenumbers(slab, theta);
  const Complex kz1_squared = kz1 * kz1;
  return {2.0 * j_unit * kz0 * tau / (1.0 + j_unit * kz0 * tau),
          2.0 * j_unit * kz1_squared * tau / (slab.permittivity * kz0 + j_unit * kz1_squared * tau)};
}

std::vector<SlabStaticImage> slab_static_images(Real thickness, Complex permittivity, Real deepest) {
  std::vector<SlabStaticImage> images;
  const Complex contrast = (permittivity - 1.0) / (permittivity + 1.0);
  Complex weight = -2.0 / (permittivity + 1.0) * (1.0 + contrast);  // n = 1
  for (int n = 1; 2 * n * thickness <= deepest && n <= 200; ++n, weight *= -contrast) {
    const Complex vector_weight = n == 1 ? Complex(-1.0) : Complex(0.0);
    if (std::abs(weight) < 1e-9 && vector_weight == 0.0) break;
    images.push_back({2.0 * n * thickness, vector_weight, weight});
  }
  return images;
}

Complex surface_wave_term(Complex k_pole, Complex residue, Real rho) {
  return -0.5 * j_unit * k_pole * residue * hankel2_0(k_pole * rho);
}

}  // namespace lobe
