// Beam figures against closed-form patterns: beamwidths of dipoles and a uniform array,
// the back and sides of a beam, and the cross-polar discrimination of an elliptical field.
#include <gtest/gtest.h>

#include <cmath>

#include "core/constants.hpp"
#include "post/band_report.hpp"
#include "post/beam_figures.hpp"

namespace lobe {
namespace {

constexpr Real degree = pi / 180.0;

/// Intensity of a z-directed pattern f(θ), the same at every φ.
IntensityAt axial(Real (*pattern)(Real theta)) {
  return [pattern](const Vec3& r) { return pattern(direction_of(r).theta); };
}

Real short_dipole(Real theta) { return std::pow(std::sin(theta), 2); }
Real half_wave_dipole(Real theta) {
  const Real s = std::sin(theta);
  return s < 1e-12 ? 0.0 : std::pow(std::cos(0.5 * pi * std::cos(theta)) / s, 2);
}

// Balanis, Antenna Theory (3rd ed.), sec. 4.2: the infinitesimal dipole's half-power
// beamwidth is exactly 90° (sin²θ = 1/2 at 45° and 135°); omnidirectional in azimuth.
TEST(BeamFigures, ShortDipoleBeamwidthIsNinetyDegrees) {
  const Direction beam{90 * degree, 0.0};
  const BeamFigures f = beam_figures(axial(short_dipole), beam, 1.0, 1.0, false);
  EXPECT_NEAR(f.beamwidth_theta_deg, 90.0, 1e-6);
  EXPECT_EQ(f.beamwidth_phi_deg, no_half_power_deg);
}

// Balanis sec. 4.6: the half-wavelength dipole's half-power beamwidth is 78°
// ([cos(π/2 cos θ)/sin θ]² = 1/2 at θ = 50.97°, a width of 78.07°).
TEST(BeamFigures, HalfWaveDipoleBeamwidthIsSeventyEightDegrees) {
  const BeamFigures f = beam_figures(axial(half_wave_dipole), {90 * degree, 0.0}, 1.0, 1.0, false);
  EXPECT_NEAR(f.beamwidth_theta_deg, 78.0, 0.1);
}

// Balanis sec. 6.3, Table 6.1: a uniform broadside array of N isotropic elements spaced d
// has a half-power beamwidth of about 2[π/2 − arccos(1.391 λ/(π N d))] (the large-N form of
// sin(Nψ/2)/(N sin(ψ/2)) = 1/√2). N = 10, d = λ/2: 10.16°. Within 1 %.
TEST(BeamFigures, UniformBroadsideArrayBeamwidthFollowsTheArrayFactor) {
  constexpr int n = 10;
  constexpr Real spacing = 0.5;  // wavelengths
  const IntensityAt array = [](const Vec3& r) {
    const Real psi = 2 * pi * spacing * r.z();
    const Real s = std::sin(0.5 * psi);
    const Real factor = std::abs(s) < 1e-12 ? 1.0 : std::sin(0.5 * n * psi) / (n * s);
    return factor * factor;
  };
  const Real expected = 2 * (0.5 * pi - std::acos(1.391 / (pi * n * spacing))) / degree;
  const BeamFigures f = beam_figures(array, {90 * degree, 0.0}, 1.0, 1.0, false);
  EXPECT_NEAR(f.beamwidth_theta_deg, expected, 0.01 * expected);
  EXPECT_EQ(f.beamwidth_phi_deg, no_half_power_deg);
}

// A beam is searched for its lobe's maximum in each plane: a peak on a coarse grid 4° off a
// beam at θ = 90° still gives the width about the true maximum (78°, as above).
TEST(BeamFigures, BeamwidthClimbsToTheLobeMaximumFromAnOffGridPeak) {
  const BeamFigures f = beam_figures(axial(half_wave_dipole), {86 * degree, 0.0}, 1.0, 1.0, false);
  EXPECT_NEAR(f.beamwidth_theta_deg, 78.0, 0.1);
}

// Symmetry: a z dipole radiates alike toward φ and φ + 180° and toward ±φ̂, so its
// front-to-back and front-to-side ratios are 0 dB (common practice quotes 0 dB for a dipole).
TEST(BeamFigures, DipoleHasNoFrontToBackRatio) {
  const BeamFigures f = beam_figures(axial(half_wave_dipole), {90 * degree, 30 * degree}, 1.0, 1.0, false);
  ASSERT_TRUE(f.front_to_back_db && f.front_to_side_db);
  EXPECT_NEAR(*f.front_to_back_db, 0.0, 1e-9);
  EXPECT_NEAR(*f.front_to_side_db, 0.0, 1e-9);
}

// A cardioid 1 + cos γ about +x (γ from +x) has a null straight behind and half its field
// (−6 dB) at the sides: front-to-back capped, front-to-side 20 log10 2.
TEST(BeamFigures, CardioidHasANullBehindAndHalfFieldAtTheSides) {
  const IntensityAt cardioid = [](const Vec3& r) { return std::pow(1 + r.x(), 2) / 4; };
  const BeamFigures f = beam_figures(cardioid, {90 * degree, 0.0}, 1.0, 1.0, false);
  EXPECT_EQ(*f.front_to_back_db, ratio_ceiling_db);
  EXPECT_NEAR(*f.front_to_side_db, 20 * std::log10(2.0), 1e-9);
  // 1 + cos γ = √2 at γ = arccos(√2 − 1) = 65.53°: a width of 131.06° in both planes.
  const Real expected = 2 * std::acos(std::sqrt(2.0) - 1) / degree;
  EXPECT_NEAR(f.beamwidth_theta_deg, expected, 1e-6);
  EXPECT_NEAR(f.beamwidth_phi_deg, expected, 1e-6);
}

TEST(BeamFigures, OverGroundTheBackIsAtTheBeamsElevation) {
  const BeamOpposites o = beam_opposites({60 * degree, 30 * degree}, true);
  ASSERT_TRUE(o.defined);
  const Direction back = direction_of(o.back);
  EXPECT_NEAR(back.theta, 60 * degree, 1e-12);
  EXPECT_NEAR(back.phi, 210 * degree, 1e-12);
  EXPECT_NEAR(direction_of(o.sides[0]).phi, 120 * degree, 1e-12);
  EXPECT_NEAR(direction_of(o.sides[1]).phi, 300 * degree, 1e-12);
  // Near the zenith the turned directions would lie beside the beam itself.
  EXPECT_FALSE(beam_opposites({5 * degree, 0.0}, true).defined);
  const BeamFigures f = beam_figures(axial(short_dipole), {5 * degree, 0.0}, 1.0, 1.0, true);
  EXPECT_FALSE(f.front_to_back_db.has_value());
}

// No field at all (a pattern of zeros, as a receiving model's may be) gives finite
// figures: no ratio, no beamwidth, the gain floor.
TEST(BeamFigures, NoFieldGivesFiniteFigures) {
  const BeamFigures f = beam_figures([](const Vec3&) { return 0.0; }, {90 * degree, 0.0}, 1.0, 1.0, false);
  EXPECT_EQ(*f.front_to_back_db, 0.0);
  EXPECT_EQ(*f.front_to_side_db, 0.0);
  EXPECT_EQ(f.beamwidth_theta_deg, no_half_power_deg);
  EXPECT_EQ(f.gain_dbi, gain_floor_dbi);
}

// Toh, "Understanding and measuring circular polarization", IEEE Trans. Educ. 46 (2003):
// an ellipse of axial ratio AR (linear) has |E_cross|/|E_co| = (AR − 1)/(AR + 1).
TEST(BeamFigures, CrossPolarDiscriminationFollowsTheAxialRatio) {
  for (Real ar_db : {0.5, 3.0, 10.0}) {
    const Real ar = std::pow(10.0, ar_db / 20);
    // E_θ = 1, E_φ = −j/AR: an ellipse with axes along θ̂ and φ̂, right-handed.
    const CircularComponents c = circular_components(1.0, Complex(0, -1.0 / ar));
    const PolarizationFigures p = polarization_figures({0.0, 0.0}, c, 1.0);
    EXPECT_NEAR(p.axial_ratio_db, ar_db, 1e-9);
    EXPECT_NEAR(p.cross_polar_discrimination_db, 20 * std::log10((ar + 1) / (ar - 1)), 1e-9);
    EXPECT_EQ(p.hand, Hand::right);
    EXPECT_GT(p.rhcp_dbi, p.lhcp_dbi);
  }
  EXPECT_NEAR(polarization_figures({}, circular_components(1.0, 0.0), 1.0).cross_polar_discrimination_db, 0.0, 1e-12);
}

BeamCurves crafted_curves() {
  BeamCurves c;
  c.frequency_hz = {100e6, 110e6, 120e6};
  c.values["gain"] = {5.0, 7.0, 6.0};
  c.values["axial-ratio"] = {1.0, 2.0, 4.0};
  c.values["front-to-back"] = {12.0, std::nullopt, 14.0};
  c.values["beamwidth-phi"] = {80.0, no_half_power_deg, 90.0};
  return c;
}

// Band figures: linear between samples, worst over the samples inside and the edges.
TEST(BeamBandReport, CentreIsInterpolatedAndWorstIncludesTheEdges) {
  const auto r = beam_band_report(crafted_curves(), 105e6, 115e6);
  EXPECT_NEAR(r.at("gain").centre, 7.0, 1e-12);
  EXPECT_NEAR(r.at("gain").worst, 6.0, 1e-12);  // the low edge, 105 MHz
  EXPECT_NEAR(r.at("gain").worst_hz, 105e6, 1e-3);
  EXPECT_NEAR(r.at("axial-ratio").worst, 3.0, 1e-12);  // the high edge, 115 MHz
  EXPECT_NEAR(r.at("axial-ratio").best, 1.5, 1e-12);   // the low edge, 105 MHz
  EXPECT_NEAR(r.at("gain").best, 7.0, 1e-12);
  EXPECT_NEAR(r.at("gain").best_hz, 110e6, 1e-3);
  // No half-power point beside the centre: no width is interpolated toward it.
  EXPECT_EQ(r.at("beamwidth-phi").centre, no_half_power_deg);
  EXPECT_EQ(beam_band_report(crafted_curves(), 101e6, 102e6).at("beamwidth-phi").centre, no_half_power_deg);
  // Undefined at a frequency that counts: left out, not guessed.
  EXPECT_EQ(r.count("front-to-back"), 0u);
  const auto low = beam_band_report(crafted_curves(), 100e6, 100e6);
  EXPECT_NEAR(low.at("front-to-back").centre, 12.0, 1e-12);
}

TEST(BeamBandReport, NamedFiguresReachTheBeamsValues) {
  BandFigures figures;
  figures.beam = beam_band_report(crafted_curves(), 100e6, 120e6);
  EXPECT_NEAR(*band_figure(figures, "worst-axial-ratio"), 4.0, 1e-12);
  EXPECT_NEAR(*band_figure(figures, "centre-gain"), 7.0, 1e-12);
  EXPECT_NEAR(*band_figure(figures, "worst-gain"), 5.0, 1e-12);
  EXPECT_FALSE(band_figure(figures, "worst-front-to-back").has_value());
  EXPECT_TRUE(larger_is_better("worst-gain"));
  EXPECT_FALSE(larger_is_better("worst-axial-ratio"));
  EXPECT_EQ(band_figure_title("worst-axial-ratio"), "highest axial ratio (dB)");
}

}  // namespace
}  // namespace lobe
