// Measured tables in the forms analysers and couplers give, and the comparison of a
// measured curve with a simulated one, on series RLC resonances known in closed form.
#include <gtest/gtest.h>
#include <sys/wait.h>
#include <unistd.h>

#include <cmath>
#include <fstream>

#include "core/constants.hpp"
#include "core/input_error.hpp"
#include "post/curve_comparison.hpp"
#include "post/measured_csv.hpp"
#include "post/port_quantities.hpp"
#include "support/scratch_directory.hpp"

namespace lobe {
namespace {

std::filesystem::path written(const std::string& name, const std::string& text) {
  const auto dir = testing::scratch_directory("measured");
  std::ofstream(dir / name) << text;
  return dir / name;
}

/// Series RLC with R = 50 Ω and Q = 10 resonating at f0.
Complex rlc_reflection(Real f, Real f0) {
  const Real l = 10 * 50 / (2 * pi * f0), c = 1 / ((2 * pi * f0) * (2 * pi * f0) * l), w = 2 * pi * f;
  return reflection_coefficient({50.0, w * l - 1 / (w * c)}, 50.0);
}

ReflectionCurve rlc_curve(Real f0, Real low, Real high, int intervals) {
  ReflectionCurve curve;
  for (int i = 0; i <= intervals; ++i) {
    const Real f = low + (high - low) * i / intervals;
    curve.frequency_hz.push_back(f);
    curve.reflection.push_back(rlc_reflection(f, f0));
  }
  return curve;
}

TEST(MeasuredCsv, ScalarReturnLossFromACoupler) {
  // Return loss as a detector reads it: positive dB, MHz, a comment and a spare column.
  const MeasuredCurve m = read_measured_csv(written("coupler.csv",
                                                    "# invented demo data\n"
                                                    "Frequency (MHz), Return loss (dB), note\n"
                                                    "430, 6.02, a\n433, 20, b\n436, 9.54, c\n"),
                                            50.0);
  EXPECT_FALSE(m.phase_known);
  ASSERT_EQ(m.curve.frequency_hz.size(), 3u);
  EXPECT_DOUBLE_EQ(m.curve.frequency_hz[1], 433e6);
  EXPECT_NEAR(std::abs(m.curve.reflection[1]), 0.1, 1e-12);
  EXPECT_NEAR(vswr_from_reflection(std::abs(m.curve.reflection[2])), 2.0, 1e-3);  // 9.54 dB ⇔ VSWR 2 (common practice)
}

TEST(MeasuredCsv, EveryAcceptedQuantity) {
  const Real g = 0.2;  // VSWR 1.5, return loss 13.98 dB, S11 −13.98 dB (common practice)
  for (const char* text : {"frequency_hz,s11_db\n1e9,-13.979400086720376\n2e9,-13.979400086720376\n",
                           "frequency_hz,vswr\n1e9,1.5\n2e9,1.5\n",
                           "frequency_ghz,s11_magnitude\n1,0.2\n2,0.2\n",
                           "frequency_hz,s11_re,s11_im\n1e9,0,0.2\n2e9,0.2,0\n",
                           "frequency_hz,s11_magnitude,s11_deg\n1e9,0.2,90\n2e9,0.2,0\n",
                           "frequency_hz,resistance_ohm,reactance_ohm\n1e9,75,0\n2e9,75,0\n"}) {
    const MeasuredCurve m = read_measured_csv(written("any.csv", text), 50.0);
    EXPECT_NEAR(std::abs(m.curve.reflection[0]), g, 1e-12) << text;
    EXPECT_DOUBLE_EQ(m.curve.frequency_hz[1], 2e9) << text;
  }
}

/// The one-line message reading `text` as a measured table gives, or "no error".
std::string message(const std::string& text) {
  try {
    read_measured_csv(written("bad.csv", text), 50.0);
  } catch (const InputError& e) {
    return e.formatted();
  }
  return "no error";
}

TEST(MeasuredCsv, FaultsAreLocated) {
  EXPECT_NE(message("f,vswr\n1,2\n").find(":1:1: no frequency column"), std::string::npos);
  EXPECT_NE(message("frequency_hz,phase\n1,2\n").find("no measured quantity"), std::string::npos);
  EXPECT_NE(message("frequency_hz,vswr\n1e9,0.5\n2e9,2\n").find(":2:5: a VSWR cannot be below 1"), std::string::npos);
  EXPECT_NE(message("frequency_hz,vswr\n2e9,2\n1e9,2\n").find(":3:1: frequencies must increase"), std::string::npos);
  EXPECT_NE(message("frequency_hz,vswr\n1e9,x\n2e9,2\n").find(":2:5: expected a number"), std::string::npos);
}

// ctest runs these cases in parallel processes: two of them once wrote "bad.csv" to one
// shared directory and read each other's table.
TEST(MeasuredCsv, EachProcessWritesItsOwnScratchFiles) {
  int pipe_ends[2];
  ASSERT_EQ(::pipe(pipe_ends), 0);
  const pid_t child = ::fork();
  ASSERT_GE(child, 0);
  if (child == 0) {
    const std::string path = written("bad.csv", "child").string();
    (void)!::write(pipe_ends[1], path.data(), path.size());
    ::_exit(0);
  }
  ::close(pipe_ends[1]);
  std::string child_path;
  char buffer[256];
  for (ssize_t n; (n = ::read(pipe_ends[0], buffer, sizeof buffer)) > 0;) child_path.append(buffer, n);
  ::close(pipe_ends[0]);
  ::waitpid(child, nullptr, 0);
  ASSERT_FALSE(child_path.empty());
  EXPECT_NE(written("bad.csv", "parent"), std::filesystem::path(child_path));
}

// What analysers write: RFC 4180 quoting (a quoted decimal comma is a decimal comma, not a
// separator: "820,5" was once read as 820), semicolon tables with decimal commas, an SWR
// column; and what no passive antenna gives is refused (+6 dB S11 was once read as −6 dB).
TEST(MeasuredCsv, ReadsWhatAnalysersWriteAndRefusesTheImpossible) {
  const MeasuredCurve quoted = read_measured_csv(written("quoted.csv", "\"Frequency (MHz)\",\"S11 (dB)\"\n"
                                                                       "\"820,5\",\"-12,5\"\n\"821,5\",-13\n"), 50.0);
  EXPECT_DOUBLE_EQ(quoted.curve.frequency_hz[0], 820.5e6);
  EXPECT_NEAR(std::abs(quoted.curve.reflection[0]), std::pow(10.0, -12.5 / 20), 1e-15);
  const MeasuredCurve semicolon =
      read_measured_csv(written("semicolon.csv", "Frequency (MHz);SWR\r\n433,05;1,25\r\n434,79;1,5\r\n"), 50.0);
  EXPECT_DOUBLE_EQ(semicolon.curve.frequency_hz[1], 434.79e6);
  EXPECT_NEAR(std::abs(semicolon.curve.reflection[0]), 0.25 / 2.25, 1e-15);  // (s − 1)/(s + 1)
  EXPECT_NE(message("frequency_hz,s11_db\n1e9,6\n2e9,-6\n").find(":2:5: a passive antenna cannot reflect more"),
            std::string::npos) << message("frequency_hz,s11_db\n1e9,6\n2e9,-6\n");
  EXPECT_NE(message("frequency_hz,vswr\n0,2\n1e9,2\n").find("a frequency must be above zero"), std::string::npos);
  EXPECT_NE(message("frequency_hz,vswr\n1e9,\"1,2,3\"\n2e9,2\n").find("expected a number"), std::string::npos);
}

// A build that resonates 3 % high: the dips, the scale factor and the residual after
// scaling come out as constructed.
TEST(CurveComparison, RecoversAFrequencyShift) {
  const ReflectionCurve simulated = rlc_curve(1.0e9, 0.85e9, 1.15e9, 300);
  const ReflectionCurve measured = rlc_curve(1.03e9, 0.9e9, 1.15e9, 127);  // other grid, narrower span
  const auto sim = resonances(simulated), meas = resonances(measured);
  ASSERT_EQ(sim.size(), 1u);
  ASSERT_EQ(meas.size(), 1u);
  EXPECT_NEAR(sim[0].frequency_hz, 1.0e9, 1e-3 * 1e9);
  EXPECT_NEAR(meas[0].frequency_hz, 1.03e9, 2e-3 * 1e9);
  const Real scale = best_frequency_scale(simulated, measured, 0.9e9, 1.15e9);
  EXPECT_NEAR(scale, 1.03, 1e-3);
  EXPECT_GT(rms_return_loss_difference_db(simulated, measured, 0.9e9, 1.15e9), 3.0);
  EXPECT_LT(rms_return_loss_difference_db(simulated, measured, 0.9e9, 1.15e9, scale), 0.5);
  // The dips pair, and the estimate (what compare prints) agrees with the fit.
  const DipPairing pairing = pair_dips(sim, meas);
  ASSERT_EQ(pairing.pairs.size(), 1u);
  const ScaleEstimate estimate = frequency_scale_estimate(simulated, measured, 0.9e9, 1.15e9, sim, meas, pairing);
  ASSERT_TRUE(estimate.scale.has_value()) << estimate.reason;
  EXPECT_NEAR(*estimate.scale, 1.03, 1e-3);
}

// A build with 8 Ω of extra series reactance (a longer lead): with phase, the impedance
// difference is that reactance at every frequency (Z = Z0 (1 + Γ)/(1 − Γ) both ways), and
// the Smith-chart distance is |Γ(Z + 8j) − Γ(Z)|.
TEST(CurveComparison, ComplexDifferenceFindsASeriesReactance) {
  const ReflectionCurve simulated = rlc_curve(1.0e9, 0.9e9, 1.1e9, 200);
  ReflectionCurve measured;
  Real largest = 0.0;
  for (int i = 0; i <= 50; ++i) {
    const Real f = 0.95e9 + 2e6 * i;
    const Complex g = rlc_reflection(f, 1.0e9);
    const Complex z = 50.0 * (1.0 + g) / (1.0 - g) + Complex(0, 8);
    measured.frequency_hz.push_back(f);
    measured.reflection.push_back((z - 50.0) / (z + 50.0));
    largest = std::max(largest, std::abs(measured.reflection.back() - g));
  }
  const auto d = complex_difference(simulated, measured, 0.9e9, 1.1e9, 50.0);
  ASSERT_TRUE(d.has_value());
  EXPECT_EQ(d->count, 51u);
  // The simulated curve is sampled every 1 MHz, so the measured 2 MHz points fall on it.
  EXPECT_NEAR(d->mean_impedance.real(), 0.0, 1e-6);
  EXPECT_NEAR(d->mean_impedance.imag(), 8.0, 1e-6);
  EXPECT_NEAR(d->largest_impedance, 8.0, 1e-6);
  EXPECT_NEAR(d->largest_reflection, largest, 1e-9);
  EXPECT_FALSE(complex_difference(simulated, measured, 2e9, 3e9, 50.0).has_value());
}

/// A broadband response without a resonance: |Γ| drifting gently across the span.
ReflectionCurve broadband_curve(Real start_magnitude, Real end_magnitude) {
  ReflectionCurve curve;
  for (int i = 0; i <= 100; ++i) {
    curve.frequency_hz.push_back(1e9 + 1e7 * i);
    curve.reflection.push_back(start_magnitude + (end_magnitude - start_magnitude) * i / 100.0);
  }
  return curve;
}

// Two broadband curves have no resonance to compare: stretching one over the other still
// lowers their difference (that once printed a confident factor of 1.12 at a search
// bound), but there is no reliable shift, and the estimate says so and why.
TEST(CurveComparison, AFlatResponseHasNoReliableShift) {
  const ReflectionCurve simulated = broadband_curve(0.10, 0.30), measured = broadband_curve(0.15, 0.25);
  const auto sim = resonances(simulated), meas = resonances(measured);
  EXPECT_TRUE(sim.empty() && meas.empty());
  const Real fit = best_frequency_scale(simulated, measured, 1e9, 2e9);
  EXPECT_NE(fit, 1.0) << "the trap: a fit of shapes alone moves the scale";
  const ScaleEstimate estimate =
      frequency_scale_estimate(simulated, measured, 1e9, 2e9, sim, meas, pair_dips(sim, meas));
  EXPECT_FALSE(estimate.scale.has_value());
  EXPECT_NE(estimate.reason.find("no resonance"), std::string::npos) << estimate.reason;
}

// Dips are paired one to one with their nearest; an extra measured dip (a second
// resonance of the build) is listed unpaired with the reason, and two pairs shifted by
// factors 5 % apart give no single scale.
TEST(CurveComparison, DipsArePairedOneToOneAndDisagreeingShiftsGiveNoScale) {
  const std::vector<Resonance> simulated{{1.00e9, 20}, {1.50e9, 15}};
  const std::vector<Resonance> measured{{1.02e9, 18}, {1.05e9, 12}, {1.47e9, 14}};
  const DipPairing pairing = pair_dips(simulated, measured);
  ASSERT_EQ(pairing.pairs.size(), 2u);
  EXPECT_EQ(pairing.pairs[0].simulated, 0u);
  EXPECT_EQ(pairing.pairs[0].measured, 0u);
  EXPECT_EQ(pairing.pairs[1].simulated, 1u);
  EXPECT_EQ(pairing.pairs[1].measured, 2u);
  EXPECT_NE(pairing.measured_unpaired[1].find("nearer another measured dip"), std::string::npos);
  EXPECT_TRUE(pairing.simulated_unpaired[0].empty() && pairing.simulated_unpaired[1].empty());
  // 1.02 and 0.98: no single factor; the curves are not consulted.
  const ReflectionCurve any = rlc_curve(1.0e9, 0.85e9, 1.15e9, 30);
  const ScaleEstimate estimate = frequency_scale_estimate(any, any, 0.9e9, 1.1e9, simulated, measured, pairing);
  EXPECT_FALSE(estimate.scale.has_value());
  EXPECT_NE(estimate.reason.find("no single scale"), std::string::npos) << estimate.reason;
  // A dip with nothing within 0.8 to 1.25 of it stays unpaired.
  EXPECT_NE(pair_dips({{1.0e9, 20}}, {{2.0e9, 20}}).measured_unpaired[0].find("no simulated dip"), std::string::npos);
}

}  // namespace
}  // namespace lobe
