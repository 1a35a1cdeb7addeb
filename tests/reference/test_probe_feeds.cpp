// Probes through a grounded substrate, against references outside the substrate solver:
// image theory (on a board of permittivity 1 a probe is a wire on the perfect ground, whose
// uniform current the free-space fill already integrates), Poynting's theorem, and the
// transmission-line and cavity models of a rectangular patch (Balanis, Antenna Theory, ch. 14).
// Lengths in millimetres.
#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>

#include "core/constants.hpp"
#include "post/frequency_result.hpp"
#include "post/port_quantities.hpp"
#include "solver/assembly.hpp"
#include "solver/dense_matrix.hpp"
#include "support/patch_formulas.hpp"
#include "support/solve_text.hpp"

namespace lobe::testing {
namespace {

/// A 40 × 30 mm plate on a 1.6 mm board (or over the ground), fed by a probe 8 mm off its centre.
std::string probe_plate_text(const std::string& board) {
  return "units mm\n" + board +
         "\nplate patch rectangle corner (-20, -15, 1.6) size (40, 30)\n"
         "mesh patch size 4\n"
         "wire pin from (-8, 0, 0) to (-8, 0, 1.6) radius 0.5\n"
         "port feed on pin at start\n"
         "frequency 2.4 GHz\n";
}

// Permittivity 1: the probe's slab kernels must give the free-space fill of the same uniform
// current and its image. The free-space problem has two functions on the one-segment pin
// (the ground's half function and the junction's); their sum is the uniform current, so the
// board's matrix must be the free-space matrix projected onto that sum, entry by entry, to
// 1e-4 of the largest entry (the tolerance).
TEST(ProbeReference, AnAirBoardProbeIsTheWireOnThePerfectGround) {
  const Model board_model = parse_model(probe_plate_text("substrate air thickness 1.6 permittivity 1"), "board");
  const Model ground_model = parse_model(probe_plate_text("ground perfect"), "ground");
  const AntennaProblem board(board_model), ground(ground_model);
  ASSERT_EQ(board.probes.size(), 1u);
  ASSERT_EQ(ground.unknowns(), board.unknowns() + 1);
  // Projection: the board's probe function is the ground model's two pin functions together.
  const Eigen::Index n = board.unknowns();
  Eigen::MatrixXd projection = Eigen::MatrixXd::Zero(ground.unknowns(), n);
  const int pin = board.probes.front().basis;
  for (const BasisPiece& piece : ground.basis.pieces_on(0)) projection(piece.basis, pin) = piece.sign;
  for (Eigen::Index i = board.basis.size(); i < n; ++i) projection(i + 1, i) = 1.0;
  ASSERT_EQ(ground.basis.size(), 2);
  DenseMatrix zb(n), zg(ground.unknowns());
  assemble_system(board, 2.4e9, zb);
  assemble_system(ground, 2.4e9, zg);
  const ComplexMatrix projected = projection.transpose().cast<Complex>() * zg.entries() * projection.cast<Complex>();
  const Real scale = projected.cwiseAbs().maxCoeff();
  const Real probe_worst = (zb.entries().col(pin) - projected.col(pin)).cwiseAbs().maxCoeff();
  const Real worst = (zb.entries() - projected).cwiseAbs().maxCoeff();
  std::printf("probe self %.6f%+.6fj ohm on the air board, %.6f%+.6fj ohm over the ground; largest difference %.2e "
              "(probe column %.2e) of the largest entry\n",
              zb.entries()(pin, pin).real(), zb.entries()(pin, pin).imag(), projected(pin, pin).real(),
              projected(pin, pin).imag(), worst / scale, probe_worst / scale);
  EXPECT_LT(worst, 1e-4 * scale);
}

/// A probe-fed patch of Balanis's design on a lossless or lossy board, the probe `inset`
/// from the radiating edge at x = −L/2 (the dominant mode's current runs along x).
struct ProbePatch {
  const char* name;
  Real permittivity, height_mm, loss_tangent, design_hz, inset_fraction, mesh_mm, radius_mm;
  Real conductivity = 0.0;  ///< of the patch's metal, S/m (0: perfect)
  PatchDesign design() const { return transmission_line_design(permittivity, height_mm * 1e-3, design_hz); }
  Real inset_mm() const { return inset_fraction * design().length * 1e3; }
  std::string text(Real low_hz, Real high_hz, int count) const {
    const PatchDesign d = design();
    const Real length = d.length * 1e3, width = d.width * 1e3;
    char text[1024];
    std::snprintf(text, sizeof text,
                  "units mm\n"
                  "substrate board thickness %.17g permittivity %.17g loss-tangent %.17g\n"
                  "plate patch rectangle corner (%.17g, %.17g, %.17g) size (%.17g, %.17g)\n"
                  "mesh patch size %.17g\n"
                  "wire pin from (%.17g, 0, 0) to (%.17g, 0, %.17g) radius %.17g\n"
                  "port feed on pin at start\n"
                  "frequency %.17g Hz to %.17g Hz count %d\n",
                  height_mm, permittivity, loss_tangent, -length / 2, -width / 2, height_mm, length, width, mesh_mm,
                  -length / 2 + inset_mm(), -length / 2 + inset_mm(), height_mm, radius_mm, low_hz, high_hz, count);
    std::string model = text;
    if (conductivity > 0.0) model += "conductor patch conductivity " + std::to_string(conductivity) + " S/m thickness 35 um\n";
    return model;
  }
};

/// The resonance of a probe-fed patch: where its input resistance peaks (the probe's
/// inductance moves the reactance's zero, not the peak). A scan, then golden-section steps.
struct Peak {
  Real frequency_hz, resistance;
};
Peak resistance_peak(const AntennaProblem& problem, Real low, Real high, int steps) {
  auto resistance = [&](Real f) { return port_results(solve_frequency(problem, f), 50.0)[0].impedance.real(); };
  Real best = low, best_r = -1.0;
  const Real step = (high - low) / steps;
  for (int i = 0; i <= steps; ++i) {
    const Real f = low + step * i, r = resistance(f);
    if (r > best_r) best = f, best_r = r;
  }
  Real a = best - step, b = best + step;
  constexpr Real golden = 0.6180339887498949;
  Real c = b - golden * (b - a), d = a + golden * (b - a), rc = resistance(c), rd = resistance(d);
  for (int i = 0; i < 12; ++i) {
    if (rc > rd) {
      b = d, d = c, rd = rc, c = b - golden * (b - a), rc = resistance(c);
    } else {
      a = c, c = d, rc = rd, d = a + golden * (b - a), rd = resistance(d);
    }
  }
  return rc > rd ? Peak{c, rc} : Peak{d, rd};
}

// Probe-fed patches, fed a third of the way in, on FR-4 (4.4, 1.6 mm) for 2.4 GHz and on a
// 0.8 mm low-loss laminate (2.2) for 5.8 GHz, lossless: the resonance against the
// transmission-line model (±4 %, the tolerance), the resonant input resistance
// against the cavity model with the slots' self and mutual conductances (Balanis, Antenna
// Theory, eqs. 14-12, 14-17, 14-18a, 14-20a; ±25 %, the tolerance; the cavity model
// counts neither surface waves nor the probe), and Poynting's theorem at the resonance with
// the probe's own radiation and surface waves. Then the FR-4 patch with the loss tangent
// 0.02 (FR-4's usual figure, from memory): its radiation efficiency against the cavity
// model's (eqs. 14-88a to c), within the same ±25 %; and with a copper patch (5.8e7 S/m,
// 35 um, from memory) on the lossless board: the share of the power its metal takes against
// the cavity model's Q_rad and the patch's half of Q_c (eq. 14-88b), within ±25 %, with the
// power still balanced.
TEST(ProbeReference, ProbeFedPatchesMatchTheTransmissionLineAndCavityModels) {
  for (const ProbePatch& patch : {ProbePatch{"FR-4 2.4 GHz", 4.4, 1.6, 0.0, 2.4e9, 0.3, 3.0, 0.6},
                                  ProbePatch{"laminate 5.8 GHz", 2.2, 0.8, 0.0, 5.8e9, 0.3, 1.5, 0.3}}) {
    const PatchDesign d = patch.design();
    const Model model = parse_model(patch.text(d.predicted_hz, d.predicted_hz, 1), "patch");
    const AntennaProblem problem(model);
    const Peak peak = resistance_peak(problem, 0.94 * d.predicted_hz, 1.06 * d.predicted_hz, 6);
    const Real cavity = cavity_input_resistance(d.width, d.length, peak.frequency_hz, patch.inset_mm() * 1e-3);
    std::printf("%s: W %.2f mm, L %.2f mm, probe %.2f mm in, %d unknowns: R peaks at %.4f GHz (transmission-line "
                "model %.4f GHz, %+.2f %%) with %.1f ohm (cavity model %.1f ohm, %+.1f %%)\n",
                patch.name, d.width * 1e3, d.length * 1e3, patch.inset_mm(), problem.unknowns(), peak.frequency_hz / 1e9,
                d.predicted_hz / 1e9, 100 * (peak.frequency_hz / d.predicted_hz - 1), peak.resistance, cavity,
                100 * (peak.resistance / cavity - 1));
    EXPECT_NEAR(peak.frequency_hz, d.predicted_hz, 0.04 * d.predicted_hz) << patch.name;
    EXPECT_NEAR(peak.resistance, cavity, 0.25 * cavity) << patch.name;

    const PowerBudget power = evaluate_frequency(problem, solve_frequency(problem, peak.frequency_hz)).power;
    std::printf("  accepted %.6g W, radiated %.6g W, surface waves %.6g W, miss %.2e\n", power.accepted, power.radiated,
                power.surface_wave, power.imbalance());
    EXPECT_LT(std::abs(power.imbalance()), power_balance_tolerance) << patch.name;

    if (patch.permittivity != 4.4) continue;
    ProbePatch lossy = patch;
    lossy.loss_tangent = 0.02;
    const Model lossy_model = parse_model(lossy.text(peak.frequency_hz, peak.frequency_hz, 1), "lossy patch");
    const AntennaProblem lossy_problem(lossy_model);
    const PowerBudget lossy_power = evaluate_frequency(lossy_problem, solve_frequency(lossy_problem, peak.frequency_hz)).power;
    const Real handbook = cavity_radiation_efficiency(d.width, d.length, patch.height_mm * 1e-3, patch.permittivity,
                                                      lossy.loss_tangent, peak.frequency_hz);
    std::printf("  loss tangent 0.02: radiation efficiency %.1f %% (cavity model %.1f %%), surface waves %.1f %%, "
                "dielectric %.1f %%\n",
                100 * lossy_power.efficiency(), 100 * handbook, 100 * lossy_power.surface_wave / lossy_power.accepted,
                100 * lossy_power.dielectric_loss / lossy_power.accepted);
    EXPECT_NEAR(lossy_power.efficiency(), handbook, 0.25 * handbook);

    ProbePatch copper = patch;
    copper.conductivity = 5.8e7;
    const Model copper_model = parse_model(copper.text(peak.frequency_hz, peak.frequency_hz, 1), "copper patch");
    const AntennaProblem copper_problem(copper_model);
    const PowerBudget copper_power =
        evaluate_frequency(copper_problem, solve_frequency(copper_problem, peak.frequency_hz)).power;
    const Real q_radiation = cavity_radiation_q(d.width, d.length, patch.height_mm * 1e-3, patch.permittivity, peak.frequency_hz);
    const Real q_conductor = cavity_patch_conductor_q(patch.height_mm * 1e-3, copper.conductivity, peak.frequency_hz);
    const Real cavity_share = (1 / q_conductor) / (1 / q_radiation + 1 / q_conductor);
    const Real share = copper_power.conductor_loss / copper_power.accepted;
    std::printf("  copper patch: its metal takes %.2f %% of the power (cavity model %.2f %%: Q_rad %.1f, Q_c %.0f), miss %.2e\n",
                100 * share, 100 * cavity_share, q_radiation, q_conductor, copper_power.imbalance());
    EXPECT_NEAR(share, cavity_share, 0.25 * cavity_share);
    EXPECT_LT(std::abs(copper_power.imbalance()), power_balance_tolerance);
  }
}

}  // namespace
}  // namespace lobe::testing
