// Plates printed on a grounded dielectric substrate, against references outside the solver:
// image theory (a board of permittivity 1 is air over the ground), Poynting's theorem (on a
// lossless board the accepted power leaves as radiation and surface waves, computed apart),
// and the transmission-line model of a rectangular patch (Balanis, Antenna Theory, ch. 14).
// Lengths in millimetres.
#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>

#include "core/constants.hpp"
#include "support/patch_formulas.hpp"
#include "support/solve_text.hpp"

namespace lobe::testing {
namespace {

/// A 40 × 2 mm strip on the top face of a 1.6 mm board, fed across its middle.
std::string strip_text(const std::string& board) {
  return "units mm\n" + board +
         "\nplate strip rectangle corner (-20, -1, 1.6) size (40, 2)\n"
         "mesh strip size 1\n"
         "port feed on strip along (0, -1, 1.6) to (0, 1, 1.6)\n"
         "frequency 2.4 GHz\n"
         "pattern theta 0 to 90 step 30 deg  phi 0 to 90 step 45 deg\n";
}

// Permittivity 1: the slab's kernels and far-field factors must give what the perfect
// ground's image gives (image theory), to 1e-4 (the tolerance).
TEST(PrintedReference, AnAirBoardIsThePerfectGround) {
  const Solved board = solve_text(strip_text("substrate air thickness 1.6 permittivity 1"));
  const Solved ground = solve_text(strip_text("ground perfect"));
  const Complex zb = board.port_impedance(), zg = ground.port_impedance();
  std::printf("air board %.6f%+.6fj ohm, perfect ground %.6f%+.6fj ohm\n", zb.real(), zb.imag(), zg.real(), zg.imag());
  EXPECT_LT(std::abs(zb - zg) / std::abs(zg), 1e-4);
  const PatternResult &a = board.result.pattern, &b = ground.result.pattern;
  const Real scale = std::max(a.e_theta.cwiseAbs().maxCoeff(), a.e_phi.cwiseAbs().maxCoeff());
  EXPECT_LT((a.e_theta - b.e_theta).cwiseAbs().maxCoeff(), 1e-4 * scale);
  EXPECT_LT((a.e_phi - b.e_phi).cwiseAbs().maxCoeff(), 1e-4 * scale);
}

// Poynting's theorem on a lossless board: accepted = radiated (far field over the upper
// hemisphere) + surface waves (from the poles' residues), within the 1e-3 every reference
// case keeps; the surface waves take a share large enough to matter.
TEST(PrintedReference, ALosslessBoardBalancesItsPower) {
  const Solved s = solve_text(strip_text("substrate fr4 thickness 1.6 permittivity 4.4"));
  const PowerBudget& p = s.result.power;
  std::printf("accepted %.6g W, radiated %.6g W, surface waves %.6g W (%.1f %%), miss %.2e\n", p.accepted, p.radiated,
              p.surface_wave, 100 * p.surface_wave / p.accepted, p.imbalance());
  EXPECT_GT(p.surface_wave, 0.02 * p.accepted);
  EXPECT_EQ(p.dielectric_loss, 0.0);
  EXPECT_LT(std::abs(p.imbalance()), power_balance_tolerance);
}

/// A W × L patch on a board, fed by a port across its middle (at the TM10 mode's current
/// maximum: a series resonance, where the reactance passes through zero).
std::string patch_text(Real length, Real width, Real height, Real permittivity, Real loss_tangent, Real mesh,
                       Real frequency_hz) {
  char text[1024];
  std::snprintf(text, sizeof text,
                "units mm\n"
                "substrate board thickness %.17g permittivity %.17g loss-tangent %.17g\n"
                "plate patch rectangle corner (%.17g, %.17g, %.17g) size (%.17g, %.17g)\n"
                "mesh patch size %.17g\n"
                "port gap on patch along (0, %.17g, %.17g) to (0, %.17g, %.17g)\n"
                "frequency %.17g Hz\n",
                height, permittivity, loss_tangent, -length / 2, -width / 2, height, length, width, mesh, -width / 2,
                height, width / 2, height, frequency_hz);
  return text;
}

/// Where the reactance at the port passes through zero: a scan, then secant steps.
Real reactance_zero_hz(const AntennaProblem& problem, Real low, Real high, int steps) {
  auto reactance = [&](Real f) { return port_results(solve_frequency(problem, f), 50.0)[0].impedance.imag(); };
  Real a = low, xa = reactance(low);
  for (int i = 1; i <= steps; ++i) {
    Real b = low + (high - low) * i / steps, xb = reactance(b);
    if ((xa < 0) != (xb < 0)) {
      for (int round = 0; round < 4 && xb != xa; ++round) {
        const Real c = b - xb * (b - a) / (xb - xa), xc = reactance(c);
        a = b, xa = xb;
        b = c, xb = xc;
      }
      return b;
    }
    a = b, xa = xb;
  }
  return NAN;
}

struct PatchCase {
  const char* name;
  Real permittivity, height_mm, design_hz, mesh_mm;
};

/// The case's design in millimetres.
struct PatchDesignMm {
  Real width_mm, length_mm, predicted_hz;
};
PatchDesignMm design(const PatchCase& c) {
  const PatchDesign d = transmission_line_design(c.permittivity, c.height_mm * 1e-3, c.design_hz);
  return {d.width * 1e3, d.length * 1e3, d.predicted_hz};
}

// The tolerance: resonance within ±4 % of the transmission-line model with
// Hammerstad's effective permittivity and fringing extension, on FR-4 (4.4, 1.6 mm) at
// 2.4 GHz and on a 0.8 mm low-loss laminate (2.2) at 5.8 GHz.
TEST(PrintedReference, PatchesResonateWhereTheTransmissionLineModelSays) {
  for (const PatchCase& c : {PatchCase{"FR-4 2.4 GHz", 4.4, 1.6, 2.4e9, 3.0}, PatchCase{"laminate 5.8 GHz", 2.2, 0.8, 5.8e9, 1.5}}) {
    const PatchDesignMm d = design(c);
    const Model model =
        parse_model(patch_text(d.length_mm, d.width_mm, c.height_mm, c.permittivity, 0.0, c.mesh_mm, c.design_hz), "patch");
    const AntennaProblem problem(model);
    const Real simulated = reactance_zero_hz(problem, 0.9 * d.predicted_hz, 1.1 * d.predicted_hz, 4);
    std::printf("%s: W %.2f mm, L %.2f mm, %zu unknowns; X = 0 at %.4f GHz, transmission-line model %.4f GHz (%+.2f %%)\n",
                c.name, d.width_mm, d.length_mm, static_cast<std::size_t>(problem.unknowns()), simulated / 1e9,
                d.predicted_hz / 1e9, 100 * (simulated / d.predicted_hz - 1));
    EXPECT_NEAR(simulated, d.predicted_hz, 0.04 * d.predicted_hz) << c.name;
  }
}

// Dielectric loss takes a growing share as the loss tangent rises: the FR-4 patch at its
// transmission-line resonance, loss tangent 0, 0.005, 0.02 (FR-4's usual figure, from
// memory) and 0.05. Lossless, radiation and surface waves take all the power.
TEST(PrintedReference, EfficiencyFallsAsTheLossTangentRises) {
  const PatchDesignMm d = design({"FR-4", 4.4, 1.6, 2.4e9, 4.0});
  Real previous = 2.0;
  for (const Real loss_tangent : {0.0, 0.005, 0.02, 0.05}) {
    const Solved s = solve_text(patch_text(d.length_mm, d.width_mm, 1.6, 4.4, loss_tangent, 4.0, d.predicted_hz));
    const PowerBudget& p = s.result.power;
    std::printf("loss tangent %.3f: radiation efficiency %.1f %%, surface waves %.1f %%, dielectric %.1f %%\n",
                loss_tangent, 100 * p.efficiency(), 100 * p.surface_wave / p.accepted, 100 * p.dielectric_loss / p.accepted);
    EXPECT_LT(p.efficiency(), previous) << loss_tangent;
    if (loss_tangent == 0.0) {
      EXPECT_LT(std::abs(p.imbalance()), power_balance_tolerance);
    } else {
      EXPECT_GT(p.dielectric_loss, 0.0);
    }
    previous = p.efficiency();
  }
}

}  // namespace
}  // namespace lobe::testing
