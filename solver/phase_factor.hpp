#pragma once
/// Batched e^{−jx} for the matrix-fill kernels, in a loop the compiler can vectorise.
#include "core/types.hpp"

namespace lobe {

/// sine = sin(x) and cosine = cos(x) for |x| < 1e5, to a few units in the last place. Range
/// reduction by a three-part π/2 (Cody & Waite, 1980), then the Taylor series on [−π/4, π/4]
/// through x¹⁵ and x¹⁶ (truncation below 5e-17). Branch-free, so that a loop around it
/// vectorises; the library's sincos cannot, and took half the fill time. Always inlined, so
/// that it takes the vector width of the loop it is in.
[[gnu::always_inline]] inline void sine_cosine_of(Real x, Real& sine, Real& cosine) {
  // π/2 split so that n·part is exact for the n that occur (Cody & Waite).
  constexpr Real two_over_pi = 0.63661977236758134308;
  constexpr Real half_pi_1 = 1.57079632673412561417e+00;
  constexpr Real half_pi_2 = 6.07710050650619224932e-11;
  constexpr Real half_pi_3 = 2.02226624879595063154e-21;
  constexpr Real round_shift = 6755399441055744.0;
  // Adding 1.5·2⁵² rounds to the nearest integer: a round that vectorises on any x86-64.
  const Real n = (x * two_over_pi + round_shift) - round_shift;
  const Real r = ((x - n * half_pi_1) - n * half_pi_2) - n * half_pi_3;
  const Real r2 = r * r;
  const Real s = r * (1.0 + r2 * (-1.0 / 6 + r2 * (1.0 / 120 + r2 * (-1.0 / 5040 + r2 * (1.0 / 362880 +
                 r2 * (-1.0 / 39916800 + r2 * (1.0 / 6227020800 + r2 * (-1.0 / 1307674368000))))))));
  const Real c = 1.0 + r2 * (-0.5 + r2 * (1.0 / 24 + r2 * (-1.0 / 720 + r2 * (1.0 / 40320 + r2 * (-1.0 / 3628800 +
                 r2 * (1.0 / 479001600 + r2 * (-1.0 / 87178291200 + r2 * (1.0 / 20922789888000))))))));
  // Quadrant q = n mod 4 gives (sin, cos) = (s, c), (c, −s), (−s, −c), (−c, s). In floating
  // point, without branches: odd = q mod 2, high = ⌊q/2⌋, all exact small integers.
  const Real quarter = ((n - 1.5) * 0.25 + round_shift) - round_shift;  // ⌊n/4⌋ for integer n
  const Real q = n - 4.0 * quarter;
  const Real high = ((q - 0.5) * 0.5 + round_shift) - round_shift;
  const Real odd = q - 2.0 * high;
  const Real sin_sign = 1.0 - 2.0 * high;
  const Real cos_sign = 1.0 - 2.0 * (odd + high - 2.0 * odd * high);
  sine = sin_sign * ((1.0 - odd) * s + odd * c);
  cosine = cos_sign * ((1.0 - odd) * c + odd * s);
}

/// sine_cosine_of for `count` values in one vectorised loop.
void sine_cosine(const Real* x, Real* sine, Real* cosine, int count);

}  // namespace lobe
