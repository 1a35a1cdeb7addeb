// Feed networks: transmission lines, stubs, transformers and lumped parts between the
// antenna and its port, checked against the transmission-line and circuit formulas.
#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>

#include "core/constants.hpp"
#include "post/port_quantities.hpp"
#include "post/power_budget.hpp"
#include "support/solve_text.hpp"

namespace lobe::testing {
namespace {

// A dipole a little off resonance (about 64 − 45j ohm at λ = 1 m), so that every
// transformation below moves it visibly.
const std::string off_resonance = dipole_text(0.45, 1e-3, 45);

/// The same dipole with its port moved to a free point "conn" and `network` between them.
std::string fed_through(const std::string& network) {
  std::string text = off_resonance;
  const std::string port_line = "port feed on d at middle\n";
  text.replace(text.find(port_line), port_line.size(), "port feed at conn\n" + network + "\n");
  return text;
}

Complex bare_impedance() { return solve_text(off_resonance).port_impedance(); }

std::string line_text(Real impedance, Real length_m, const char* extra = "") {
  char text[256];
  std::snprintf(text, sizeof text, "line l from conn to d at middle impedance %.17g ohm length %.17g m velocity 1 %s",
                impedance, length_m, extra);
  return text;
}

void expect_close(Complex actual, Complex expected, Real relative) {
  EXPECT_LE(std::abs(actual - expected), relative * std::abs(expected)) << actual << " vs " << expected;
}

// Pozar, Microwave Engineering (4th ed.), §2.5: a quarter-wave line of impedance Z0
// transforms Z_L into Z0²/Z_L; 1e-9 relative (circuit algebra on the same antenna solve).
TEST(FeedLineReference, QuarterWaveLineInvertsTheLoad) {
  const Complex load = bare_impedance();
  expect_close(solve_text(fed_through(line_text(75.0, 0.25))).port_impedance(), 75.0 * 75.0 / load, 1e-9);
}

// The antenna end of a lossy feed line shows the antenna's own impedance, as an analyser
// at the antenna would (the line changes only what the connector sees); 1e-9 relative.
TEST(FeedLineReference, AntennaEndShowsTheAntennaItself) {
  const Complex load = bare_impedance();
  char extra[128];
  std::snprintf(extra, sizeof extra, "loss 1 dB per 1 m at %.17g Hz", one_metre_wavelength_hz);
  const Solved fed = solve_text(fed_through(line_text(50.0, 1.7, extra)));
  ASSERT_EQ(fed.result.antenna_ends.size(), 1u);
  expect_close(fed.result.antenna_ends[0].impedance, load, 1e-9);
  EXPECT_GT(std::abs(fed.port_impedance() - load), 0.1 * std::abs(load));
}

// Pozar §2.3: a half-wave line repeats its load whatever its impedance; 1e-9 relative.
// Its impedance parameters are infinite here, which the chain-matrix form does not use.
TEST(FeedLineReference, HalfWaveLineRepeatsTheLoad) {
  const Complex load = bare_impedance();
  expect_close(solve_text(fed_through(line_text(300.0, 0.5))).port_impedance(), load, 1e-9);
}

// Pozar eq. 2.91: a lossy line of any length, Z_in = Z0 (Z_L + Z0 tanh γl)/(Z0 + Z_L tanh γl),
// with γ = α + jβ, β = 2π/(v λ) and α from the dB loss (÷ 20 log10 e); 1e-9 relative.
TEST(FeedLineReference, LossyLineOfAnyLength) {
  const Complex load = bare_impedance();
  const Real z0 = 50.0, length = 0.37, velocity = 0.66, db_per_metre = 2.0;
  char extra[128];
  std::snprintf(extra, sizeof extra, "loss %.17g dB per 1 m at %.17g Hz", db_per_metre, one_metre_wavelength_hz);
  std::string line = line_text(z0, length, extra);
  line.replace(line.find("velocity 1"), 10, "velocity 0.66");
  const Complex gamma(db_per_metre * std::log(10.0) / 20.0, 2 * pi / velocity);
  const Complex t = std::tanh(gamma * length);
  expect_close(solve_text(fed_through(line)).port_impedance(), z0 * (load + z0 * t) / (z0 + load * t), 1e-9);
}

// Common practice: a matched (Z0 = reference) line of loss A dB improves the return loss
// by exactly 2A dB, the reflection going through the loss twice; 1e-9 dB.
TEST(FeedLineReference, LossyMatchedLineAddsTwiceItsLossToTheReturnLoss) {
  const Real antenna_rl = solve_text(off_resonance).result.ports[0].return_loss_db;
  char extra[128];
  std::snprintf(extra, sizeof extra, "loss 3 dB per 2.3 m at %.17g Hz", one_metre_wavelength_hz);
  const Solved fed = solve_text(fed_through(line_text(50.0, 2.3, extra)));
  EXPECT_NEAR(fed.result.ports[0].return_loss_db, antenna_rl + 6.0, 1e-9);
  // The line's loss is in the power budget: accepted = radiated + line loss (1e-3).
  EXPECT_GT(fed.result.power.line_loss, 0.3 * fed.result.power.accepted);
  expect_power_balance(fed);
}

// Pozar §2.3, eqs. 2.46 and 2.49 (lossless): an open stub is −j Z0 cot βl, a shorted one
// j Z0 tan βl. Each hangs alone at a second port's free point; 1e-9 relative.
TEST(StubReference, OpenAndShortedStubs) {
  for (const char* end : {"open", "short"}) {
    char network[256];
    std::snprintf(network, sizeof network, "port s at tip\nstub t at tip impedance 60 ohm length 0.1 m velocity 1 %s", end);
    const Solved s = solve_text(off_resonance + network + "\n");
    const Real bl = 2 * pi * 0.1;
    const Complex expected = std::string(end) == "open" ? Complex(0.0, -60.0 / std::tan(bl)) : Complex(0.0, 60.0 * std::tan(bl));
    expect_close(impedance_matrix(s.solution)(1, 1), expected, 1e-9);
    SCOPED_TRACE(end);
  }
}

// A quarter-wave shorted stub across the feed is an open circuit there (Pozar §2.3): it
// leaves the antenna's impedance as it was, though its own impedance is infinite; 1e-9.
TEST(StubReference, QuarterWaveShortedStubAcrossTheFeedChangesNothing) {
  const Complex load = bare_impedance();
  const std::string text = off_resonance + "stub t on d at middle impedance 50 ohm length 0.25 m velocity 1 short\n";
  expect_close(solve_text(text).port_impedance(), load, 1e-9);
}

// Ideal transformer: the `from` end sees the `to` end's impedance divided by the ratio,
// a 4:1 balun taking a quarter; and a series part adds its impedance (circuit laws); 1e-9.
TEST(NetworkPartReference, TransformerAndSeriesPart) {
  const Complex load = bare_impedance();
  expect_close(solve_text(fed_through("transformer b from conn to d at middle ratio 4")).port_impedance(), load / 4.0, 1e-9);
  const Real omega = 2 * pi * one_metre_wavelength_hz;
  expect_close(solve_text(fed_through("load c from conn to d at middle capacitance 4.7 pF")).port_impedance(),
               load + 1.0 / (j_unit * omega * 4.7e-12), 1e-9);
}

// A load across the feed gap where a line meets it is in parallel with the antenna there:
// the line transforms Z_ant ∥ Z_load (Pozar §2.5 with the parallel law); 1e-9 relative.
TEST(NetworkPartReference, WireLoadWhereTheNetworkMeetsTheAntennaIsInParallel) {
  const Complex load = bare_impedance();
  const std::string text = fed_through(line_text(75.0, 0.25)) + "load r on d at middle resistance 200 ohm\n";
  const Complex parallel = load * 200.0 / (load + 200.0);
  expect_close(solve_text(text).port_impedance(), 75.0 * 75.0 / parallel, 1e-9);
}

// Under a plane wave, a lossless half-wave line repeats its load (Pozar §2.3): a resistor at
// the end of one takes the power it takes across the gap itself; 1e-9 relative.
TEST(FeedLineReference, ReceivingThroughAHalfWaveLine) {
  const std::string dipole =
      "units m\nwire d from (0, 0, -0.24) to (0, 0, 0.24) radius 1e-3 segments 25\n"
      "wave theta 90 deg phi 0 deg polarization theta\nfrequency 299792458 Hz\n";
  const Solved direct = solve_text(dipole + "load r on d at middle resistance 70 ohm\n");
  const Solved through = solve_text(dipole + "line l from d at middle to far impedance 120 ohm length 0.5 m velocity 1\n"
                                             "load r at far resistance 70 ohm\n");
  const Real expected = load_powers(*direct.problem, direct.solution)[0];
  const Real received = network_powers(*through.problem, through.solution)[1];
  EXPECT_GT(expected, 0.0);
  EXPECT_NEAR(received, expected, 1e-9 * expected);
}

/// Crossed dipoles in free space (the second 6 mm higher so that they clear), fed at the
/// first's centre, the second driven from it through a quarter-wave phasing line of the
/// dipoles' own resistance.
Solved phased_crossed_dipoles(const char* options) {
  char text[900];
  std::snprintf(text, sizeof text,
                "units m\n"
                "wire x from (-0.2335, 0, 0) to (0.2335, 0, 0) radius 2e-3 segments 31\n"
                "wire y from (0, -0.2335, 0.006) to (0, 0.2335, 0.006) radius 2e-3 segments 31\n"
                "port feed on x at middle\n"
                "line phasing from x at middle to y at middle impedance 68 ohm length 0.25 m velocity 1 %s\n"
                "frequency 299792458 Hz\n"
                "pattern theta 0 to 180 step 180 phi 0 to 0 step 1\n",
                options);
  Solved s = solve_text(text);
  expect_power_balance(s);
  return s;
}

// IEEE Std 145-2013: right-hand polarisation rotates clockwise seen looking along the
// direction of propagation. A matched quarter-wave line delays the second dipole's
// voltage by 90° (Pozar §2.5: V2/V1 = −j Z0/Z_L), so E = x̂ − jŷ: right-hand toward +z,
// left-hand toward −z. "Circular" as common practice reads it: axial ratio under 3 dB;
// here, with the line within a few ohms of the dipoles' impedance, under 1 dB.
TEST(PhasingLineReference, QuarterWaveLineGivesRightHandUpward) {
  const Solved s = phased_crossed_dipoles("");
  const PatternResult& p = s.result.pattern;
  EXPECT_EQ(static_cast<Hand>(p.hand(0, 0)), Hand::right);
  EXPECT_EQ(static_cast<Hand>(p.hand(1, 0)), Hand::left);
  EXPECT_LT(p.axial_ratio_db(0, 0), 1.0);
}

// Crossing the line's conductors turns the delay into an advance: the hands swap.
TEST(PhasingLineReference, CrossedLineGivesLeftHandUpward) {
  const Solved s = phased_crossed_dipoles("crossed");
  EXPECT_EQ(static_cast<Hand>(s.result.pattern.hand(0, 0)), Hand::left);
  EXPECT_EQ(static_cast<Hand>(s.result.pattern.hand(1, 0)), Hand::right);
  EXPECT_LT(s.result.pattern.axial_ratio_db(0, 0), 1.0);
}

}  // namespace
}  // namespace lobe::testing
