#pragma once
/// Batched e^{−jx} for the matrix-fill kernels, in a loop the compiler can vectorise.
#include <bit>
#include <cstdint>

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
  // Adding 1.5·2⁵² rounds to the nearest integer n, a round that vectorises on any x86-64,
  // and leaves n mod 4 in the sum's lowest two bits.
  const Real shifted = x * two_over_pi + round_shift;
  const Real n = shifted - round_shift;
  const std::uint64_t quadrant = std::bit_cast<std::uint64_t>(shifted) & 3;
  const Real r = ((x - n * half_pi_1) - n * half_pi_2) - n * half_pi_3;
  const Real r2 = r * r;
  const Real s = r * (1.0 + r2 * (-1.0 / 6 + r2 * (1.0 / 120 + r2 * (-1.0 / 5040 + r2 * (1.0 / 362880 +
                 r2 * (-1.0 / 39916800 + r2 * (1.0 / 6227020800 + r2 * (-1.0 / 1307674368000))))))));
  const Real c = 1.0 + r2 * (-0.5 + r2 * (1.0 / 24 + r2 * (-1.0 / 720 + r2 * (1.0 / 40320 + r2 * (-1.0 / 3628800 +
                 r2 * (1.0 / 479001600 + r2 * (-1.0 / 87178291200 + r2 * (1.0 / 20922789888000))))))));
  // Quadrant q = n mod 4 gives (sin, cos) = (s, c), (c, −s), (−s, −c), (−c, s): odd
  // quadrants swap the two, and the sign bits flip for q = 2, 3 (sin) and q = 1, 2 (cos).
  const bool odd = (quadrant & 1) != 0;
  const std::uint64_t sine_sign = (quadrant & 2) << 62, cosine_sign = ((quadrant + 1) & 2) << 62;
  sine = std::bit_cast<Real>(std::bit_cast<std::uint64_t>(odd ? c : s) ^ sine_sign);
  cosine = std::bit_cast<Real>(std::bit_cast<std::uint64_t>(odd ? s : c) ^ cosine_sign);
}

/// sine_cosine_of for `count` values in one vectorised loop.
void sine_cosine(const Real* x, Real* sine, Real* cosine, int count);

}  // namespace lobe
