#pragma once
/// The free-space Green's function, written once for every integrator and the far field.
#include <cmath>

#include "core/constants.hpp"
#include "core/types.hpp"
#include "solver/phase_factor.hpp"

namespace lobe {

/// G(R) = e^{−jkR}/(4πR) for exp(+jωt). The integrators sum the kernel e^{−jkR}/R and apply
/// green_scale = 1/(4π) once per integral; the kernel's quasi-static (singular) part is
/// 1/R, which they integrate in closed form over nearby elements, leaving the smooth rest.
constexpr Real green_scale = 1.0 / (4.0 * pi);

/// e^{−jkR}/R.
inline Complex green_kernel(Real k, Real r) { return std::polar(1.0 / r, -k * r); }

/// (e^{−jkR} − 1)/R: the kernel less its static part 1/R, without cancellation for small kR;
/// its limit −jk at R = 0 (where a self-term's observation and source points coincide).
inline Complex green_kernel_smooth(Real k, Real r) {
  if (k * r < 1e-8) return Complex(-0.5 * k * k * r, -k);
  const Real s = std::sin(0.5 * k * r);
  return Complex(-2.0 * s * s, -std::sin(k * r)) / r;
}

/// Most distances green_kernel_batch takes at once (an 8 × 8 product rule).
constexpr int green_batch_limit = 64;

/// re[i] + j im[i] = weight[i] · e^{−jk r[i]}/r[i] for `count` ≤ green_batch_limit distances
/// at once, in loops that vectorise (the library's sincos does not, and once took half the
/// fill time). Inline: the fill calls it for every pair, often with nine distances.
inline void green_kernel_batch(Real k, const Real* r, const Real* weight, Real* re, Real* im, int count) {
  Real phase[green_batch_limit], sine[green_batch_limit], cosine[green_batch_limit];
  for (int i = 0; i < count; ++i) phase[i] = k * r[i];
  sine_cosine(phase, sine, cosine, count);
  for (int i = 0; i < count; ++i) {
    const Real w = weight[i] / r[i];
    re[i] = w * cosine[i];
    im[i] = -w * sine[i];
  }
}

/// re[i] + j im[i] = weight[i] · (e^{−jk r[i]} − 1)/r[i] for `count` ≤ green_batch_limit
/// distances, r = 0 included, as green_kernel_smooth gives it: from sin and cos of kr/2 in
/// one vectorised call (the library's sin, called twice per point, had been a fifth of a
/// small model's fill).
inline void green_kernel_smooth_batch(Real k, const Real* r, const Real* weight, Real* re, Real* im, int count) {
  Real phase[green_batch_limit], sine[green_batch_limit], cosine[green_batch_limit];
  for (int i = 0; i < count; ++i) phase[i] = 0.5 * k * r[i];
  sine_cosine(phase, sine, cosine, count);
  for (int i = 0; i < count; ++i) {
    const bool tiny = k * r[i] < 1e-8;
    const Real inverse = tiny ? 0.0 : 1.0 / r[i];
    re[i] = weight[i] * (tiny ? -0.5 * k * k * r[i] : -2.0 * sine[i] * sine[i] * inverse);
    im[i] = weight[i] * (tiny ? -k : -2.0 * sine[i] * cosine[i] * inverse);
  }
}

/// The far-zone form of G: E = far_zone_factor(ω) (I − r̂ r̂·) ∫ J e^{jk r̂·r'} dV' at
/// r = 1 m with e^{−jkr} removed, −jωμ0/(4π).
inline Complex far_zone_factor(Real omega) { return -j_unit * omega * mu0 * green_scale; }

}  // namespace lobe
