// Air-dielectric patches over a finite ground plate, probe-fed: resonance against the
// transmission-line model, and the circular polarisation of a truncated-corner patch under
// mirroring. Lengths in millimetres.
#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>

#include "core/constants.hpp"
#include "support/patch_formulas.hpp"
#include "support/solve_text.hpp"

namespace lobe::testing {
namespace {

constexpr Real height_mm = 3.7;  // 0.030 λ at 2.45 GHz
constexpr Real width_mm = 60.0;
constexpr Real length_mm = 56.0;

/// A rectangular patch (resonant length along x) on a 125 mm ground plate (1.02 λ at
/// 2.45 GHz), fed by a probe a third of the way from the centre to the radiating edge.
std::string patch_text() {
  char text[1024];
  std::snprintf(text, sizeof text,
                "units mm\n"
                "plate floor rectangle corner (-62.5, -62.5, 0) size (125, 125)\n"
                "plate patch rectangle corner (%.17g, %.17g, %.17g) size (%.17g, %.17g)\n"
                "mesh patch size 5\n"
                "wire probe from (%.17g, 0, 0) to (%.17g, 0, %.17g) radius 0.4\n"
                "port feed on probe at start\n"
                "frequency 2.2 GHz to 2.7 GHz count 2\n",
                -length_mm / 2, -width_mm / 2, height_mm, length_mm, width_mm, -length_mm / 6, -length_mm / 6,
                height_mm);
  return text;
}

/// The frequency of maximum input resistance: a coarse scan, then parabolas through the
/// best point and its neighbours at shrinking steps.
Real maximum_resistance_hz(const AntennaProblem& problem, Real low, Real high, Real step) {
  auto resistance = [&](Real f) { return port_results(solve_frequency(problem, f), 50.0)[0].impedance.real(); };
  Real best = low, best_r = resistance(low);
  for (Real f = low + step; f <= high + 1e-3 * step; f += step)
    if (const Real r = resistance(f); r > best_r) best = f, best_r = r;
  for (int round = 0; round < 2; ++round) {
    const Real below = resistance(best - step), above = resistance(best + step);
    best += 0.5 * step * (below - above) / (below - 2 * best_r + above);
    best_r = resistance(best);
    step /= 4;
  }
  return best;
}

// The tolerance: resonance (maximum R) within ±5 % of the transmission-line model.
TEST(PatchReference, ProbeFedAirPatchResonatesWhereTheTransmissionLineModelSays) {
  const Model model = parse_model(patch_text(), "patch");
  const AntennaProblem problem(model);
  const Real simulated = maximum_resistance_hz(problem, 2.25e9, 2.55e9, 0.05e9);
  const Real predicted = transmission_line_resonance_hz(length_mm * 1e-3, width_mm * 1e-3, height_mm * 1e-3, 1.0);
  std::printf("maximum R at %.4f GHz; transmission-line model %.4f GHz (%+.2f %%)\n", simulated / 1e9, predicted / 1e9,
              100 * (simulated / predicted - 1));
  EXPECT_NEAR(simulated, predicted, 0.05 * predicted);
  const FrequencyResult at_resonance = evaluate_frequency(problem, solve_frequency(problem, simulated));
  EXPECT_LT(std::abs(at_resonance.power.imbalance()), power_balance_tolerance);
}

/// A square patch with two opposite corners cut (legs of 9 mm), fed on the x axis.
std::string truncated_patch_text() {
  return "units mm\n"
         "let side = 57\nlet c = 9\nlet h = 3.7\n"
         "plate floor rectangle corner (-62.5, -62.5, 0) size (125, 125)\n"
         "plate patch polygon (-side/2 + c, -side/2, h) (side/2, -side/2, h) (side/2, side/2 - c, h)"
         " (side/2 - c, side/2, h) (-side/2, side/2, h) (-side/2, -side/2 + c, h)\n"
         "mesh patch size 5\n"
         "wire probe from (-side/6, 0, 0) to (-side/6, 0, h) radius 0.4\n"
         "port feed on probe at start\n"
         "frequency 2.4 GHz\n"
         "pattern theta 0 to 30 step 15 deg  phi 0 to 90 step 45 deg\n";
}

/// The meshes of `problem` reflected in the plane x = 0, vertex for vertex.
AntennaProblem mirrored_in_x(const AntennaProblem& problem) {
  WireMesh wires = problem.mesh;
  SurfaceMeshReport surfaces = problem.surfaces;
  auto flip = [](Vec3& p) { p.x() = -p.x(); };
  for (auto& s : wires.segments) flip(s.start), flip(s.end);
  for (auto& n : wires.nodes) flip(n.position);
  for (auto& v : surfaces.mesh.vertices) flip(v);
  return AntennaProblem(problem.model, std::move(wires), std::move(surfaces));
}

// Symmetry: the mirror image of a circularly polarised antenna radiates the opposite hand
// with the same axial ratio. The mirror is taken of the mesh itself (a mesher need not
// mesh a mirrored shape as the mirror of its mesh), so the two solutions differ only by
// rounding. The tolerance: axial ratios equal to 1e-6; RHCP and LHCP swap.
TEST(PatchReference, MirroredTruncatedCornerPatchSwapsHand) {
  const Solved original = solve_text(truncated_patch_text());
  expect_power_balance(original);
  const AntennaProblem mirror_problem = mirrored_in_x(*original.problem);
  const FrequencyResult mirror = evaluate_frequency(mirror_problem, solve_frequency(mirror_problem, 2.4e9));
  const PatternResult &a = original.result.pattern, &b = mirror.pattern;
  std::printf("broadside: axial ratio %.4f dB, hand %+d; mirrored %.4f dB, hand %+d\n", a.axial_ratio_db(0, 0),
              a.hand(0, 0), b.axial_ratio_db(0, 0), b.hand(0, 0));
  EXPECT_LT(a.axial_ratio_db(0, 0), 3.0);  // circular enough for the swap to mean something
  EXPECT_EQ(a.hand(0, 0), -b.hand(0, 0));
  // Mirroring in x = 0 maps the direction (θ, φ) to (θ, 180° − φ); at θ = 0 every φ is
  // the same direction, and off axis φ = 0 ↔ 180° is outside this grid, so compare the
  // directions the mirror maps onto themselves: θ = 0, and the φ = 90° cut.
  for (Eigen::Index i = 0; i < a.axial_ratio_db.rows(); ++i) {
    const Eigen::Index j = i == 0 ? 0 : 2;  // φ index of 0° (broadside) or 90°
    EXPECT_NEAR(a.axial_ratio_db(i, j), b.axial_ratio_db(i, j), 1e-6 * a.axial_ratio_db(i, j));
    EXPECT_NEAR(a.rhcp_dbi(i, j), b.lhcp_dbi(i, j), 1e-6 * std::abs(a.rhcp_dbi(i, j)));
    EXPECT_NEAR(a.lhcp_dbi(i, j), b.rhcp_dbi(i, j), 1e-6 * std::abs(a.lhcp_dbi(i, j)));
  }
}

}  // namespace
}  // namespace lobe::testing
