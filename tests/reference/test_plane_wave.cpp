// Plane waves on the one pipeline: a lit wire's radar cross-section, receiving and
// transmitting related by reciprocity, and a plate lit over a perfect ground against the
// plate and its image lit in free space.
#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <memory>

#include "core/constants.hpp"
#include "geometry/model_parser.hpp"
#include "post/far_field.hpp"
#include "post/scattering_result.hpp"
#include "solver/assembly.hpp"
#include "solver/excitation.hpp"
#include "support/solve_text.hpp"

namespace lobe::testing {
namespace {

constexpr Real frequency = one_metre_wavelength_hz;  // λ = 1 m

Vec3 direction(Real theta, Real phi) {
  return {std::sin(theta) * std::cos(phi), std::sin(theta) * std::sin(phi), std::cos(theta)};
}

/// A model parsed from text, meshed, with a wave set on it afterwards (the model language
/// keeps waves and ports apart; the library takes both, as a receiving antenna needs).
struct Lit {
  Lit(const std::string& text, std::optional<PlaneWave> wave) : model(parse_model(text, "lit")) {
    model.wave = wave;
    problem = std::make_unique<AntennaProblem>(model);
  }
  Model model;
  std::unique_ptr<AntennaProblem> problem;
};

/// The far field of a solution with its phase referred to the origin.
FarFieldSample field_from_origin(const FarField& far, Real k, Real theta, Real phi) {
  const Complex to_origin = std::polar(1.0, k * direction(theta, phi).dot(far.phase_centre()));
  const FarFieldSample f = far.at(theta, phi);
  return {f.e_theta * to_origin, f.e_phi * to_origin};
}

std::string lit_dipole(Real length, Real radius) {
  char text[256];
  std::snprintf(text, sizeof text,
                "units m\nwire d from (0, 0, %.17g) to (0, 0, %.17g) radius %.17g segments 41\n"
                "wave theta 90 deg phi 0 polarization theta\nfrequency %.17g Hz\n",
                -length / 2, length / 2, radius, frequency);
  return text;
}

// A thin wire lit broadside with E along it scatters most near its half-wave resonance:
// σ_max ≈ 0.86 λ² (Knott, Shaeffer & Tuley, Radar Cross Section, 2nd ed., ch. 7 — from
// memory; it is G²λ²/π for a short-circuited resonant half-wave dipole, G = 1.64). Within
// 5 %, over lengths from 0.44 λ to 0.50 λ.
TEST(PlaneWave, HalfWaveWireRadarCrossSectionPeaksNearResonance) {
  Real best = 0.0, best_length = 0.0;
  for (Real length = 0.44; length <= 0.5001; length += 0.005) {
    const Solved s = solve_text(lit_dipole(length, 1e-4));
    const ScatteringResult r = evaluate_scattering(*s.problem, s.solution);
    if (r.monostatic_m2 > best) best = r.monostatic_m2, best_length = length;
  }
  std::printf("largest monostatic RCS %.4f λ² at length %.3f λ\n", best, best_length);
  EXPECT_NEAR(best, 0.86, 0.05 * 0.86);
  EXPECT_GT(best_length, 0.44);
  EXPECT_LT(best_length, 0.5);
}

// The bistatic pattern in the plane of the wire is the 8 of a half-wave dipole: nulls along
// the wire and σ(θ) = σ(90°) [cos(π/2 cos θ) / sin θ]² for the resonant current (the
// half-wave dipole's pattern, e.g. Balanis, Antenna Theory, eq. 4-84), within 0.3 dB where
// it is above −20 dB; round in the plane across it (within 0.01 dB).
TEST(PlaneWave, HalfWaveWireBistaticPatternIsAFigureEight) {
  const Solved s = solve_text(lit_dipole(0.47, 1e-4));
  const FarField far(*s.problem, s.solution);
  const auto sigma = [&](Real theta, Real phi) { return radar_cross_section(far.at(theta, phi)); };
  const Real broadside = sigma(pi / 2, 0.0);
  for (int degrees = 5; degrees <= 175; degrees += 5) {
    const Real theta = degrees * pi / 180;
    const Real shape = std::pow(std::cos(pi / 2 * std::cos(theta)) / std::sin(theta), 2);
    if (shape < 0.01) continue;
    EXPECT_NEAR(10 * std::log10(sigma(theta, pi / 4) / broadside), 10 * std::log10(shape), 0.3) << degrees;
  }
  EXPECT_LT(sigma(0.0, 0.0), 1e-6 * broadside);
  for (int degrees = 0; degrees < 360; degrees += 30)
    EXPECT_NEAR(10 * std::log10(sigma(pi / 2, degrees * pi / 180) / broadside), 0.0, 0.01) << degrees;
}

// A half-wave dipole (a = 1e-4 λ, 0.4836 λ, where its reactance nearly vanishes) loaded at
// its middle with 73 Ω and lit broadside with E along it takes P = S A_e from the wave's
// power density S = |E|²/(2η0), where A_e = λ²D/(4π) · 4 R_A R_L / |Z_A + Z_L|² for a
// lossless antenna (Balanis, Antenna Theory, sec. 2.15: the maximum effective area
// λ²D/(4π), 0.13 λ² for a half-wave dipole, times the load's match factor — from memory).
// Against the dipole's own transmit Z_A and D to 1e-3 (the far-field integral's accuracy),
// and the matched area against 0.13 λ² within 2 %.
TEST(PlaneWave, LoadedDipoleReceivesItsEffectiveArea) {
  const std::string dipole = dipole_text(0.4836, 1e-4, 41);
  const Solved sent = solve_text(dipole);
  const Complex z_antenna = sent.port_impedance();
  const FarField far(*sent.problem, sent.solution);
  const Real directivity = 4 * pi * far.intensity(pi / 2, 0.0) / far.radiated_power();
  const Real load = 73.0;
  const Real match = 4 * z_antenna.real() * load / std::norm(z_antenna + load);

  std::string loaded = dipole;
  loaded.replace(loaded.find("port feed on d at middle"), 24, "load r on d at middle resistance 73 ohm");
  const Model lit = parse_model(loaded + "wave theta 90 deg phi 0 deg polarization theta\n", "lit");
  const AntennaProblem problem(lit);
  const ScatteringResult r = evaluate_scattering(problem, solve_frequency(problem, frequency));
  const Real density = 1.0 / (2 * eta0);
  const Real area = r.load_power_w.at(0) / density;
  std::printf("effective area %.5f λ² (match %.4f, D %.4f): matched %.5f λ²\n", area, match, directivity, area / match);
  EXPECT_NEAR(area, directivity / (4 * pi) * match, 1e-3 * area);
  EXPECT_NEAR(area / match, 0.13, 0.02 * 0.13);
}

/// Lorentz reciprocity: a wave E0 p̂ e^{jk r̂·r} from r̂ drives a port with the open-circuit
/// (Thevenin) voltage V = (1/I_t) ∫ J_t · E_inc dV, and with the transmit far field
/// E_t = −jωμ0/(4π) (I − r̂r̂) ∫ J_t e^{jk r̂·r} dV (r = 1 m, phase from the origin) this is
/// V = E0 (4π/(−jωμ0)) p̂·E_t / I_t. Returns the largest relative difference over a few
/// directions and both polarisations.
Real reciprocity_error(const std::string& text) {
  Real worst = 0.0;
  const Real k = 2 * pi * frequency / speed_of_light, omega = 2 * pi * frequency;
  const Lit transmit(text, std::nullopt);
  const FrequencySolution sent = solve_frequency(*transmit.problem, frequency);
  const FarField far(*transmit.problem, sent);
  const Complex current = sent.port_admittance(0, 0);  // I_t for 1 V
  for (const auto& [theta_deg, phi_deg] : {std::pair{30.0, 20.0}, {75.0, 140.0}, {60.0, 250.0}})
    for (const bool theta_polarized : {true, false}) {
      const Real theta = theta_deg * pi / 180, phi = phi_deg * pi / 180;
      const Lit receive(text, PlaneWave{{"lit", 1, 1}, theta, phi, theta_polarized, 2.5});
      const FrequencySolution got = solve_frequency(*receive.problem, frequency);
      const Complex open_circuit = got.received_currents[0] / got.port_admittance(0, 0);
      const FarFieldSample e = field_from_origin(far, k, theta, phi);
      const Complex along = theta_polarized ? e.e_theta : e.e_phi;
      const Complex predicted = 2.5 * (4 * pi / (-j_unit * omega * mu0)) * along / current;
      worst = std::max(worst, std::abs(open_circuit - predicted) / std::abs(predicted));
    }
  return worst;
}

// Reciprocity to 1e-6 for a bent wire antenna in free space and over a perfect ground.
TEST(PlaneWave, WireAntennaReceivesWhatItsTransmitPatternPredicts) {
  const std::string bent =
      "units m\nwire a through (0, 0, 0.05) (0.1, 0.05, 0.2) (0.15, -0.1, 0.3) radius 1e-3 segments 15\n"
      "wire b from (0.1, 0.05, 0.2) to (-0.12, 0.02, 0.22) radius 1e-3 segments 7\n"
      "port p on a at 0.3\nfrequency 299.792458 MHz\n";
  const Real free = reciprocity_error(bent);
  const Real grounded = reciprocity_error("ground perfect\n" + bent);
  std::printf("reciprocity: free space %.2e, over ground %.2e\n", free, grounded);
  EXPECT_LT(free, 1e-6);
  EXPECT_LT(grounded, 1e-6);
}

// Reciprocity to 1e-6 for a probe-fed patch: plates, a wire and two wire-to-plate junctions.
TEST(PlaneWave, PatchReceivesWhatItsTransmitPatternPredicts) {
  const std::string patch =
      "units mm\nplate floor rectangle corner (-300, -300, 0) size (600, 600)\nmesh floor size 100\n"
      "plate patch rectangle corner (-230, -150, 50) size (460, 300)\nmesh patch size 80\n"
      "wire pin from (-90, 0, 0) to (-90, 0, 50) radius 3 segments 3\nport feed on pin at start\n"
      "frequency 299.792458 MHz\n";
  const Real error = reciprocity_error(patch);
  std::printf("reciprocity of the patch: %.2e\n", error);
  EXPECT_LT(error, 1e-6);
}

/// The wave a perfect ground z = 0 reflects, by image theory: from the mirrored direction,
/// with the polarisation's horizontal part reversed and its vertical part kept, so that the
/// tangential field of incident plus reflected wave vanishes on the ground.
IncidentWave reflected_by_ground(const IncidentWave& wave) {
  IncidentWave r = wave;
  r.from.z() = -r.from.z();
  r.polarization.x() = -r.polarization.x();
  r.polarization.y() = -r.polarization.y();
  return r;
}

// A tilted plate and a wire over a perfect ground, lit by a plane wave, against the same
// plate and wire with their mirror images in free space, lit by the incident and the
// reflected wave (image theory): the current at every centroid and segment end, and the far
// field above the ground, to 1e-6.
TEST(PlaneWave, LitOverGroundEqualsImagePairInFreeSpace) {
  const std::string scene =
      "units mm\nplate tile polygon (-150, -100, 120) (160, -90, 180) (140, 120, 200) (-170, 110, 140)\n"
      "mesh tile size 60\n"
      "wire rod from (-200, 0, 300) to (200, 50, 350) radius 2 segments 9\n"
      "wave theta 50 deg phi 30 deg polarization theta\nfrequency 299.792458 MHz\n";
  const Model grounded = parse_model("ground perfect\n" + scene, "grounded");
  const AntennaProblem over(grounded);
  const FrequencySolution ground_solution = solve_frequency(over, frequency);

  // The image pair: the wire mirrored by hand (z negated exactly), the plate's very mesh
  // and its mirror image.
  const std::string mirrored_wire = "wire image from (-200, 0, -300) to (200, 50, -350) radius 2 segments 9\n";
  Model free_model = parse_model(scene + mirrored_wire, "pair");
  SurfaceMeshReport pair = over.surfaces;
  const int vertices = static_cast<int>(pair.mesh.vertices.size());
  const std::size_t triangles = pair.mesh.triangles.size();
  for (int v = 0; v < vertices; ++v) {
    Vec3 image = pair.mesh.vertices[v];
    image.z() = -image.z();
    pair.mesh.vertices.push_back(image);
  }
  for (std::size_t t = 0; t < triangles; ++t) {
    const auto& c = pair.mesh.triangles[t];
    pair.mesh.triangles.push_back({c[0] + vertices, c[2] + vertices, c[1] + vertices});
    pair.region.push_back(pair.region[t]);
  }
  const AntennaProblem free_pair(free_model, mesh_wires(free_model), pair);
  ASSERT_FALSE(free_pair.medium.has_ground());
  const IncidentWave incident = incident_wave(*grounded.wave);
  const IncidentWave reflected = reflected_by_ground(incident);
  // The tangential field of the two waves cancels on the ground (checks the reflection).
  const Vec3 on_ground(0.3, -0.7, 0.0);
  const Real k = 2 * pi * frequency / speed_of_light;
  const Eigen::Vector3cd total = std::polar(1.0, k * incident.from.dot(on_ground)) * incident.polarization +
                                 std::polar(1.0, k * reflected.from.dot(on_ground)) * reflected.polarization;
  ASSERT_LT(std::abs(total.x()) + std::abs(total.y()), 1e-14);

  const auto matrix = make_system_matrix(free_model, free_pair.unknowns());
  assemble_system(free_pair, frequency, *matrix);
  matrix->factor();
  SolveReport report;
  FrequencySolution pair_solution;
  pair_solution.frequency_hz = frequency;
  pair_solution.coefficients = matrix->solve(plane_wave_vector(free_pair, incident, frequency) +
                                                 plane_wave_vector(free_pair, reflected, frequency),
                                             report);

  const auto density_over = triangle_current_density(over, ground_solution.coefficients);
  const auto density_pair = triangle_current_density(free_pair, pair_solution.coefficients);
  Real scale = 0.0, worst = 0.0;
  for (std::size_t t = 0; t < triangles; ++t) scale = std::max(scale, density_over[t].norm());
  for (std::size_t t = 0; t < triangles; ++t) worst = std::max(worst, (density_over[t] - density_pair[t]).norm() / scale);
  std::printf("plate current: largest difference %.2e of the largest density\n", worst);
  EXPECT_LT(worst, 1e-6);

  // The wire's coefficients: its functions come first in both problems, in the same order.
  const int wire_functions = over.basis.size();
  const ComplexVector a = ground_solution.coefficients.head(wire_functions);
  const ComplexVector b = pair_solution.coefficients.head(wire_functions);
  EXPECT_LT((a - b).norm(), 1e-6 * a.norm());

  const FarField far_over(over, ground_solution), far_pair(free_pair, pair_solution);
  Real field_scale = 0.0, field_worst = 0.0;
  for (int theta_deg = 0; theta_deg <= 85; theta_deg += 17)
    for (int phi_deg = 0; phi_deg < 360; phi_deg += 45) {
      const Real theta = theta_deg * pi / 180, phi = phi_deg * pi / 180;
      const FarFieldSample x = field_from_origin(far_over, k, theta, phi), y = field_from_origin(far_pair, k, theta, phi);
      field_scale = std::max(field_scale, std::hypot(std::abs(x.e_theta), std::abs(x.e_phi)));
      field_worst = std::max(field_worst, std::hypot(std::abs(x.e_theta - y.e_theta), std::abs(x.e_phi - y.e_phi)));
    }
  std::printf("far field: largest difference %.2e of the largest\n", field_worst / field_scale);
  EXPECT_LT(field_worst, 1e-6 * field_scale);
}

}  // namespace
}  // namespace lobe::testing
