// Real (lossy) ground: its far field against the two-ray formula, and its perfect-conductor
// limit against the exact image.
#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>

#include "core/constants.hpp"
#include "support/solve_text.hpp"

namespace lobe::testing {
namespace {

/// A horizontal half-wave dipole along x at height h (λ = 1 m) over `ground`, with the
/// pattern in the E-plane (φ = 0) and the H-plane (φ = 90°) from zenith to 5° elevation.
Solved dipole_over(const char* ground, Real h) {
  char text[600];
  std::snprintf(text, sizeof text,
                "units m\n"
                "wire d from (-0.2375, 0, %.17g) to (0.2375, 0, %.17g) radius 1e-3 segments 31\n"
                "port feed on d at middle\n"
                "ground %s\n"
                "frequency %.17g Hz\n"
                "pattern theta 0 to 85 step 5 phi 0 to 90 step 90\n",
                h, h, ground, one_metre_wavelength_hz);
  return solve_text(text);
}

// "Average soil", common practice: εr = 13, σ = 0.005 S/m.
constexpr const char* average_soil = "real permittivity 13 conductivity 0.005 S/m";

/// Fresnel's coefficients written out here, apart from the library (Balanis, Antenna
/// Theory, 3rd ed., eqs. 4-123 and 4-124, with ψ the elevation):
///   Γv = (εg sin ψ − √(εg − cos²ψ)) / (εg sin ψ + √(εg − cos²ψ)),
///   Γh = (sin ψ − √(εg − cos²ψ)) / (sin ψ + √(εg − cos²ψ)).
struct TwoRay {
  Complex eg;
  Real kh;
  /// |e^{jkh sin ψ} + s Γ e^{−jkh sin ψ}|: s = +1 with Γh across the plane of incidence
  /// (H-plane), s = −1 with Γv in it (E-plane; the horizontal image reverses).
  Real factor(Real elevation, bool e_plane) const {
    const Real s = std::sin(elevation), c = std::cos(elevation);
    const Complex root = std::sqrt(eg - c * c);
    const Complex gamma = e_plane ? (eg * s - root) / (eg * s + root) : (s - root) / (s + root);
    return std::abs(std::polar(1.0, kh * s) + (e_plane ? -1.0 : 1.0) * gamma * std::polar(1.0, -kh * s));
  }
};

// Balanis, Antenna Theory (3rd ed.), §4.8 (horizontal dipole above lossy ground, the
// two-ray field with the Fresnel coefficients): the pattern of a horizontal half-wave
// dipole 0.5 λ over average soil, relative to zenith, within 0.3 dB from 5° to 90° of
// elevation in both principal planes. The E-plane carries the half-wave dipole's own
// factor cos((π/2) sin θ)/cos θ (its sinusoidal current, Balanis eq. 4-84).
TEST(RealGroundReference, HorizontalDipoleFarFieldIsTheTwoRayPattern) {
  const Solved s = dipole_over(average_soil, 0.5);
  const PatternResult& p = s.result.pattern;
  const TwoRay two_ray{Complex(13.0, -0.005 / (2 * pi * one_metre_wavelength_hz * eps0)), 2 * pi * 0.5};
  for (int plane = 0; plane < 2; ++plane) {
    const bool e_plane = plane == 0;
    const auto formula = [&](Real theta) {
      const Real element = e_plane ? std::cos(0.5 * pi * std::sin(theta)) / std::cos(theta) : 1.0;
      return element * two_ray.factor(0.5 * pi - theta, e_plane);
    };
    for (std::size_t i = 0; i < p.thetas.size(); ++i) {
      const Real theta = p.thetas[i];
      const Real computed = p.gain_dbi(i, plane) - p.gain_dbi(0, plane);
      const Real expected = 20 * std::log10(formula(theta) / formula(0.0));
      EXPECT_NEAR(computed, expected, 0.3) << (e_plane ? "E-plane" : "H-plane") << " elevation "
                                           << 90 - theta * 180 / pi << " deg";
    }
  }
}

// A perfectly conducting ground is the limit of a very good conductor. What remains is the
// metal's surface impedance, Zs/η0 = 1/√εg (Balanis, Advanced Engineering
// Electromagnetics, §5.3.3), 4e-4 at σ = 1e8 S/m: the impedance within 1e-4 of the exact
// image's, the pattern within 0.01 dB, and the gap shrinking as 1/√σ (ten times larger at
// σ = 1e6 S/m, ±30 %).
TEST(RealGroundReference, VeryHighConductivityApproachesThePerfectGround) {
  const Solved perfect = dipole_over("perfect", 0.3);
  const Solved metal = dipole_over("real permittivity 1 conductivity 1e8 S/m", 0.3);
  const Solved poorer = dipole_over("real permittivity 1 conductivity 1e6 S/m", 0.3);
  const Complex z = perfect.port_impedance();
  const Real gap = std::abs(metal.port_impedance() - z), poorer_gap = std::abs(poorer.port_impedance() - z);
  EXPECT_LT(gap, 1e-4 * std::abs(z));
  EXPECT_NEAR(poorer_gap / gap, 10.0, 3.0);
  EXPECT_LT((metal.result.pattern.gain_dbi - perfect.result.pattern.gain_dbi).abs().maxCoeff(), 0.01);
  EXPECT_LT(metal.result.power.ground_loss, 1e-2 * metal.result.power.accepted);
}

// Over lossy soil some of the power is absorbed: the efficiency falls below one, by
// balance, and the impedance moves from the perfect ground's toward free space's.
TEST(RealGroundReference, LossySoilAbsorbsPower) {
  const Solved soil = dipole_over(average_soil, 0.5);
  EXPECT_GT(soil.result.power.ground_loss, 0.05 * soil.result.power.accepted);
  EXPECT_LT(soil.result.power.efficiency(), 0.95);
}

/// A quarter-wave vertical standing on the ground (λ = 1 m), fed at its base.
Solved vertical_on(const char* ground) {
  char text[500];
  std::snprintf(text, sizeof text,
                "units m\nwire whip from (0, 0, 0) to (0, 0, 0.25) radius 2e-3 segments 20\nport feed on whip at start\n"
                "ground %s\nfrequency %.17g Hz\npattern theta 0 to 85 step 5 phi 0 to 0 step 1\n",
                ground, one_metre_wavelength_hz);
  return solve_text(text);
}

// A vertical on a stated ground system: its near field as over a perfect ground (the
// system's screen), the system's loss resistance in series at its base (circuit law, 1e-9),
// and its far field over the soil: each current element with its image weighted by Γv
// (Balanis, Antenna Theory, §4.8, the vertical dipole above lossy ground), here summed over
// the monopole's sinusoidal current I(z) = sin k(L − z) (Balanis §4.2) and divided by the
// same sum over a perfect ground, Γv = 1. Its pattern, relative to 40° and to the perfect
// ground's, within 0.05 dB from 5° to 80° of elevation (the solved current is not quite
// sinusoidal: 0.015 dB at worst here).
TEST(RealGroundReference, VerticalOnAGroundSystem) {
  const Solved perfect = vertical_on("perfect");
  const Solved system = vertical_on("real permittivity 13 conductivity 0.005 S/m system 10 ohm");
  const Complex expected = perfect.port_impedance() + 10.0;
  EXPECT_LT(std::abs(system.port_impedance() - expected), 1e-9 * std::abs(expected));
  const Complex eg(13.0, -0.005 / (2 * pi * one_metre_wavelength_hz * eps0));
  const Real k = 2 * pi, length = 0.25;
  const auto field_ratio = [&](Real theta) {
    const Real s = std::cos(theta), c = std::sin(theta);  // the elevation's sine and cosine
    const Complex root = std::sqrt(eg - c * c);
    const Complex gamma_v = (eg * s - root) / (eg * s + root);
    Complex over_soil = 0.0, over_metal = 0.0;
    const int n = 400;  // midpoint rule, far finer than the pattern needs
    for (int i = 0; i < n; ++i) {
      const Real z = (i + 0.5) * length / n, current = std::sin(k * (length - z));
      const Complex up = std::polar(1.0, k * z * s), down = std::polar(1.0, -k * z * s);
      over_soil += current * (up + gamma_v * down);
      over_metal += current * (up + down);
    }
    return std::abs(over_soil / over_metal);
  };
  const PatternResult &p = system.result.pattern, &q = perfect.result.pattern;
  const std::size_t reference = 8;  // θ = 40°
  for (std::size_t i = 2; i < p.thetas.size(); ++i) {
    const Real computed = (p.gain_dbi(i, 0) - q.gain_dbi(i, 0)) - (p.gain_dbi(reference, 0) - q.gain_dbi(reference, 0));
    const Real expected_db = 20 * std::log10(field_ratio(p.thetas[i]) / field_ratio(p.thetas[reference]));
    EXPECT_NEAR(computed, expected_db, 0.05) << "theta " << p.thetas[i] * 180 / pi;
  }
  EXPECT_GT(system.result.power.ground_loss, 0.1 * system.result.power.accepted);
}

/// The feed impedance of the horizontal dipole at height h over `ground`, its near
/// interaction with the ground by the Sommerfeld integrals or by the weighted image.
Complex impedance_by(bool sommerfeld, const char* ground, Real h) {
  char text[600];
  std::snprintf(text, sizeof text,
                "units m\nwire d from (-0.2375, 0, %.17g) to (0.2375, 0, %.17g) radius 1e-3 segments 31\n"
                "port feed on d at middle\nground %s\nfrequency %.17g Hz\n",
                h, h, ground, one_metre_wavelength_hz);
  const Model model = parse_model(text, "test");
  AntennaProblem problem(model);
  problem.medium.use_sommerfeld_near_ground(sommerfeld);
  return 1.0 / solve_frequency(problem, one_metre_wavelength_hz).port_admittance(0, 0);
}

// The exact reflected field (Sommerfeld integrals) and the reflection-coefficient image
// agree for a dipole well above the soil and part below a quarter wavelength, as published
// comparisons of the two show (e.g. Miller, Poggio, Burke and Selden, "Analysis of wire
// antennas in the presence of a conducting half-space", Can. J. Phys. 50, 1972): within
// 3 % in impedance from 0.3 λ up, more than 5 % apart at 0.05 λ.
TEST(RealGroundReference, SommerfeldAndImageAgreeHighAndPartLow) {
  for (const Real h : {0.3, 0.5, 0.8}) {
    const Complex exact = impedance_by(true, average_soil, h), image = impedance_by(false, average_soil, h);
    EXPECT_LT(std::abs(exact - image), 0.03 * std::abs(exact)) << "h " << h << ": " << exact << " vs " << image;
  }
  const Complex exact = impedance_by(true, average_soil, 0.05), image = impedance_by(false, average_soil, 0.05);
  EXPECT_GT(std::abs(exact - image), 0.05 * std::abs(exact)) << exact << " vs " << image;
}

// The Sommerfeld path's perfect-conductor limit: 0.1 λ over σ = 1e8 S/m gives the exact
// image's impedance within its surface impedance (1e-4, as above).
TEST(RealGroundReference, SommerfeldPathApproachesThePerfectGround) {
  const Solved perfect = dipole_over("perfect", 0.1);
  const Complex metal = impedance_by(true, "real permittivity 1 conductivity 1e8 S/m", 0.1);
  EXPECT_LT(std::abs(metal - perfect.port_impedance()), 1e-4 * std::abs(perfect.port_impedance()))
      << metal << " vs " << perfect.port_impedance();
}

}  // namespace
}  // namespace lobe::testing
