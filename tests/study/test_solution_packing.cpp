// Solutions pass between the processes of a sweep as runs of doubles: they must come back
// bit for bit, and a cut-short run must be refused, not read past its end.
#include <gtest/gtest.h>

#include <random>
#include <stdexcept>

#include "study/solution_packing.hpp"

namespace lobe {
namespace {

ComplexVector random_vector(std::mt19937& random, Eigen::Index n) {
  std::normal_distribution<Real> normal;
  ComplexVector v(n);
  for (Eigen::Index i = 0; i < n; ++i) v(i) = Complex(normal(random), normal(random));
  return v;
}

TEST(SolutionPacking, SolutionsComeBackBitForBit) {
  std::mt19937 random(11);
  FrequencySolution s;
  s.frequency_hz = 433.92e6;
  s.port_admittance = ComplexMatrix(2, 2);
  s.port_admittance << Complex(1e-3, -2e-3), Complex(3e-5, 4e-5), Complex(3e-5, 4e-5), Complex(5e-3, 6e-3);
  s.port_voltages = random_vector(random, 2);
  s.port_currents = random_vector(random, 2);
  s.coefficients = random_vector(random, 37);
  s.segment_currents = {{Complex(1, 2), Complex(3, 4)}, {Complex(5, 6), Complex(7, 8)}};
  s.report = {Factorization::lu_after_check, 1.25e-7, 3.5e-15};
  s.interpolated = true;
  std::vector<double> packed{42.0};  // something before, as in a process's message
  pack_solution(s, packed);
  pack_solution(FrequencySolution{}, packed);  // an empty one after it
  std::size_t at = 1;
  const FrequencySolution back = unpack_solution(packed, at);
  EXPECT_EQ(back.frequency_hz, s.frequency_hz);
  EXPECT_EQ(back.port_admittance, s.port_admittance);
  EXPECT_EQ(back.port_voltages, s.port_voltages);
  EXPECT_EQ(back.port_currents, s.port_currents);
  EXPECT_EQ(back.received_currents.size(), 0);
  EXPECT_EQ(back.coefficients, s.coefficients);
  EXPECT_EQ(back.segment_currents, s.segment_currents);
  EXPECT_EQ(back.report.factorization, s.report.factorization);
  EXPECT_EQ(back.report.reciprocal_condition, s.report.reciprocal_condition);
  EXPECT_EQ(back.report.relative_residual, s.report.relative_residual);
  EXPECT_TRUE(back.interpolated);
  const FrequencySolution empty = unpack_solution(packed, at);
  EXPECT_EQ(empty.coefficients.size(), 0);
  EXPECT_EQ(at, packed.size());
}

TEST(SolutionPacking, ACutShortRunIsRefused) {
  FrequencySolution s;
  s.coefficients = ComplexVector::Ones(10);
  std::vector<double> packed;
  pack_solution(s, packed);
  packed.resize(packed.size() - 3);
  std::size_t at = 0;
  EXPECT_THROW(unpack_solution(packed, at), std::runtime_error);
}

}  // namespace
}  // namespace lobe
