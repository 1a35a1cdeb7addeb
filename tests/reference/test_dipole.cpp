// Straight dipoles against closed-form antenna theory. Lengths are in wavelengths (λ = 1 m).
#include <gtest/gtest.h>

#include <cmath>

#include "core/constants.hpp"
#include "support/solve_text.hpp"

namespace lobe::testing {
namespace {

/// Segments for the thin (a = 1e-4 λ) dipoles: segment length ≈ 48 a, well inside the
/// thin-wire range, and fine enough that the delta-gap result has settled.
constexpr int thin_segments = 100;
/// Segments for a = 1e-3 λ: the segment length stays above 8 radii (≈ 9.6 a).
constexpr int thick_segments = 50;

Complex dipole_impedance(Real length, Real radius, int segments) {
  const Solved s = solve_text(dipole_text(length, radius, segments));
  expect_power_balance(s);
  return s.port_impedance();
}

/// The length at which the input reactance crosses zero, by the secant method.
Real resonant_length(Real radius, int segments) {
  Real l0 = 0.46, l1 = 0.50;
  Real x0 = dipole_impedance(l0, radius, segments).imag(), x1 = dipole_impedance(l1, radius, segments).imag();
  for (int i = 0; i < 30 && std::abs(l1 - l0) > 1e-7; ++i) {
    const Real l2 = l1 - x1 * (l1 - l0) / (x1 - x0);
    l0 = l1;
    x0 = x1;
    l1 = l2;
    x1 = dipole_impedance(l1, radius, segments).imag();
  }
  return l1;
}

// Balanis, Antenna Theory (3rd ed.), eqs. 8-60/8-61 (induced EMF): X = 0 at 0.4846 λ for
// a = 1e-4 λ and at 0.4775 λ for a = 1e-3 λ. Tolerance ±1 % (the issue's).
TEST(DipoleReference, ResonantLengthThinWire) {
  const Real length = resonant_length(1e-4, thin_segments);
  EXPECT_NEAR(length, 0.4846, 0.01 * 0.4846);
  // A thin resonant half-wave dipole has R ≈ 72 Ω (common practice); ±3 Ω.
  EXPECT_NEAR(dipole_impedance(length, 1e-4, thin_segments).real(), 72.0, 3.0);
}

TEST(DipoleReference, ResonantLengthThickerWire) {
  const Real length = resonant_length(1e-3, thick_segments);
  EXPECT_NEAR(length, 0.4775, 0.01 * 0.4775);
  EXPECT_NEAR(dipole_impedance(length, 1e-3, thick_segments).real(), 72.0, 3.0);  // common practice
}

// Balanis eqs. 8-60/8-61: Z_in = 73.1 + j42.5 Ω for l = λ/2 (induced EMF, sinusoidal current,
// zero radius). A moment-method solution with a finite radius and a delta-gap feed gives R
// about 10 % higher, so the accepted window is R in [73, 84], X in [38, 48] (the issue's).
TEST(DipoleReference, HalfWaveImpedance) {
  const Complex z = dipole_impedance(0.5, 1e-4, thin_segments);
  EXPECT_GE(z.real(), 73.0);
  EXPECT_LE(z.real(), 84.0);
  EXPECT_GE(z.imag(), 38.0);
  EXPECT_LE(z.imag(), 48.0);
}

// Balanis eq. 4-62: the half-wave dipole's directivity is 1.643 = 2.15 dBi; ±0.1 dB.
TEST(DipoleReference, HalfWaveDirectivity) {
  const Solved s = solve_text(dipole_text(0.5, 1e-4, thin_segments));
  EXPECT_NEAR(10 * std::log10(peak_directivity(s)), 2.15, 0.1);
  expect_power_balance(s);
}

// Balanis eq. 4-31: a short dipole (l ≪ λ) has directivity 1.5 = 1.76 dBi; ±1 %.
TEST(DipoleReference, ShortDipoleDirectivity) {
  const Solved s = solve_text(dipole_text(0.1, 1e-4, 20));
  EXPECT_NEAR(peak_directivity(s), 1.5, 0.015);
  expect_power_balance(s);
}

// Balanis eq. 4-37: R_r = 20π²(l/λ)² for the triangular current of a short dipole. The
// real current is not quite triangular and the gap lowers R a little: −15 % … +5 %.
TEST(DipoleReference, ShortDipoleRadiationResistance) {
  const Real reference = 20 * pi * pi * 0.1 * 0.1;
  const Real r = dipole_impedance(0.1, 1e-4, 20).real();
  EXPECT_GE(r, 0.85 * reference);
  EXPECT_LE(r, 1.05 * reference);
}

// Short-dipole reactance X = −120 (ln(l/2a) − 1) / tan(πl/λ) (from memory); ±5 %.
TEST(DipoleReference, ShortDipoleReactance) {
  const Real l = 0.1, a = 1e-4;
  const Real reference = -120.0 * (std::log(l / (2 * a)) - 1.0) / std::tan(pi * l);
  EXPECT_NEAR(dipole_impedance(l, a, 20).imag(), reference, 0.05 * std::abs(reference));
}

// Balanis sec. 4.6: the half-wavelength dipole's half-power beamwidth is 78° in any plane
// through its axis, and it radiates alike in every azimuth. Through the whole chain (the
// solved currents, the pattern grid's peak, the beam's figures): 78° ± 1°, omnidirectional
// about the axis, front-to-back and front-to-side 0 dB (symmetry; ±0.01 dB).
TEST(DipoleReference, HalfWaveDipoleBeamFigures) {
  std::string text = dipole_text(0.5, 1e-4, thin_segments);
  text += "pattern theta 0 to 180 step 5 deg  phi 0 to 355 step 5 deg\n";
  const Solved s = solve_text(text);
  const BeamFigures& beam = s.result.beam;
  EXPECT_NEAR(beam.peak.theta, pi / 2, 1e-12);
  EXPECT_NEAR(beam.beamwidth_theta_deg, 78.0, 1.0);
  EXPECT_EQ(beam.beamwidth_phi_deg, no_half_power_deg);
  ASSERT_TRUE(beam.front_to_back_db && beam.front_to_side_db);
  EXPECT_NEAR(*beam.front_to_back_db, 0.0, 0.01);
  EXPECT_NEAR(*beam.front_to_side_db, 0.0, 0.01);
  // Realized gain is the gain less the mismatch: 10 log10(1 − |Γ|²).
  const Real gamma = std::abs(s.result.ports[0].reflection);
  EXPECT_NEAR(beam.realized_gain_dbi, beam.gain_dbi + 10 * std::log10(1 - gamma * gamma), 1e-9);
}

}  // namespace
}  // namespace lobe::testing
