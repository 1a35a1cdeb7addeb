// Adaptive frequency sweeps: the AAA fit against rational functions known in closed form,
// and 201-point sweeps of a single-resonance patch and a dual-resonance wire antenna
// against every frequency solved in full (the targets the speed issue sets: at most 25
// full solves, |ΔS11| ≤ 0.01 everywhere).
#include <gtest/gtest.h>

#include <cstdio>
#include <mutex>

#include "geometry/model_parser.hpp"
#include "post/port_quantities.hpp"
#include "solver/antenna_problem.hpp"
#include "study/frequency_loop.hpp"
#include "study/rational_interpolant.hpp"

namespace lobe {
namespace {

TEST(RationalInterpolant, RecoversARationalFunctionFromItsSamples) {
  // Two poles off the real axis, as a resonant port's admittance has; two components
  // sharing them. Nakatsukasa et al. 2018: AAA recovers a rational function of type
  // (m−1, m−1) from samples to rounding once m support points are in.
  const auto f = [](Real x) {
    const Complex p1(-0.3, 0.05), p2(0.6, 0.02);
    return std::pair<Complex, Complex>{1.0 / (x - p1) + 2.0 / (x - p2), Complex(0.5, 1.0) / (x - p1) - 3.0};
  };
  std::vector<Real> points;
  ComplexMatrix values(2, 40);
  for (int i = 0; i < 40; ++i) {
    points.push_back(-1.0 + 2.0 * i / 39.0);
    values(0, i) = f(points.back()).first;
    values(1, i) = f(points.back()).second;
  }
  const RationalInterpolant r(points, values, 1e-13);
  Real worst = 0.0;
  for (int i = 0; i < 1000; ++i) {
    const Real x = -1.0 + 2.0 * i / 999.0;
    const ComplexVector v = r(x);
    worst = std::max({worst, std::abs(v(0) - f(x).first) / 50.0, std::abs(v(1) - f(x).second) / 50.0});
  }
  std::printf("AAA on two poles: %zu support points, largest error %.2e of the largest value\n", r.support_size(), worst);
  EXPECT_LT(worst, 1e-9);
  EXPECT_LE(r.support_size(), 6u);
  // The combination reproduces the values and sums to one.
  const std::vector<Complex> c = r.combination(0.123);
  Complex sum = 0.0, first = 0.0;
  for (std::size_t i = 0; i < c.size(); ++i) {
    sum += c[i];
    first += c[i] * values(0, static_cast<Eigen::Index>(i));
  }
  EXPECT_NEAR(std::abs(sum - 1.0), 0.0, 1e-12);
  EXPECT_NEAR(std::abs(first - r(0.123)(0)), 0.0, 1e-12);
}

struct SweepComparison {
  std::size_t solves = 0;
  Real worst_s11 = 0.0;
  Real worst_at_hz = 0.0;
  std::vector<Real> dips_hz;  ///< local minima of |S11| solved in full (the resonances)
};

/// Runs the model's frequencies adaptively and in full and compares S11.
SweepComparison compare_sweeps(const std::string& text) {
  const Model model = parse_model(text, "adaptive");
  const AntennaProblem problem(model);
  const std::size_t count = model.frequencies_hz.size();
  std::vector<Complex> full(count), adaptive(count);
  std::vector<bool> solved(count, false);
  std::mutex guard;
  const Real z0 = model.reference_ohm;
  const auto s11 = [&](const FrequencySolution& s) {
    const Complex z = 1.0 / s.port_admittance(0, 0);
    return (z - z0) / (z + z0);
  };
  EXPECT_TRUE(solve_each_frequency(problem, {}, [&](std::size_t i, FrequencySolution&& s) {
    const std::lock_guard<std::mutex> lock(guard);
    full[i] = s11(s);
  }, FrequencySampling::every));
  EXPECT_TRUE(solve_each_frequency(problem, {}, [&](std::size_t i, FrequencySolution&& s) {
    const std::lock_guard<std::mutex> lock(guard);
    adaptive[i] = s11(s);
    solved[i] = !s.interpolated;
  }, FrequencySampling::adaptive));
  SweepComparison c;
  for (std::size_t i = 0; i < count; ++i) {
    c.solves += solved[i];
    const Real d = std::abs(full[i] - adaptive[i]);
    if (d > c.worst_s11) c.worst_s11 = d, c.worst_at_hz = model.frequencies_hz[i];
    if (i > 0 && i + 1 < count && std::abs(full[i]) < std::abs(full[i - 1]) && std::abs(full[i]) < std::abs(full[i + 1]))
      c.dips_hz.push_back(model.frequencies_hz[i]);
  }
  for (Real hz : c.dips_hz) std::printf("  |S11| dips at %.4g MHz\n", hz / 1e6);
  return c;
}

/// The targets for a 201-point sweep.
constexpr std::size_t most_solves = 25;
constexpr Real largest_s11_difference = 0.01;

/// Prints the comparison and holds it to the targets and the resonances expected.
void expect_targets(const char* name, const SweepComparison& c, std::size_t resonances) {
  std::printf("%s: %zu full solves of 201, largest |dS11| %.2e at %.4g MHz\n", name, c.solves, c.worst_s11,
              c.worst_at_hz / 1e6);
  EXPECT_EQ(c.dips_hz.size(), resonances);
  EXPECT_LE(c.solves, most_solves);
  EXPECT_LE(c.worst_s11, largest_s11_difference);
}

TEST(AdaptiveSweep, SingleResonancePatchNeedsFewSolves) {
  // A probe-fed air patch for 2.45 GHz over a perfect ground (54.5 × 60 mm, 3.7 mm up,
  // the probe a sixth of the length off centre): one resonance inside 2.2–2.7 GHz.
  const SweepComparison c = compare_sweeps(
      "units mm\nground perfect\nplate patch rectangle corner (-27.25, -30, 3.7) size (54.5, 60)\nmesh patch size 5\n"
      "wire pin from (-9.0833, 0, 0) to (-9.0833, 0, 3.7) radius 0.4\nport n_type on pin at start\n"
      "frequency 2.2 GHz to 2.7 GHz count 201\n");
  expect_targets("patch", c, 1);
}

TEST(AdaptiveSweep, DualResonanceWireAntennaNeedsFewSolves) {
  // A dipole 1 m long with a pair of shorter arms beside it, fed at one gap: resonances
  // near 144 and 417 MHz between 100 and 450 MHz.
  const SweepComparison c = compare_sweeps(
      "units m\n"
      "wire feed from (0, 0, -0.005) to (0, 0, 0.005) radius 1e-3 segments 1\n"
      "wire long_up from (0, 0, 0.005) to (0, 0, 0.5) radius 1e-3 segments 25\n"
      "wire long_down from (0, 0, -0.005) to (0, 0, -0.5) radius 1e-3 segments 25\n"
      "wire short_up from (0, 0, 0.005) to (0.06, 0, 0.16) radius 1e-3 segments 9\n"
      "wire short_down from (0, 0, -0.005) to (0.06, 0, -0.16) radius 1e-3 segments 9\n"
      "port p on feed at middle\nfrequency 100 MHz to 450 MHz count 201\n");
  expect_targets("two-resonance dipole", c, 2);
}

}  // namespace
}  // namespace lobe
