// The dense system matrix's bookkeeping: a mirrored term lands at (row, column) and at
// (column, row), however the matrix stores it while it is being filled.
#include <gtest/gtest.h>

#include <random>
#include <stdexcept>
#include <vector>

#include "geometry/model_parser.hpp"
#include "solver/antenna_problem.hpp"
#include "solver/dense_matrix.hpp"

namespace lobe {
namespace {

TEST(DenseMatrix, MirroredTermsLandOnBothSidesAcrossRepeatedReads) {
  constexpr int n = 150;  // more than two of the 64-entry tiles the mirrors are settled in
  std::mt19937 random(3);
  std::uniform_int_distribution<int> index(0, n - 1);
  std::uniform_real_distribution<Real> value(-1.0, 1.0);
  DenseMatrix matrix(n);
  ComplexMatrix expected = ComplexMatrix::Zero(n, n);
  for (int round = 0; round < 3; ++round) {
    std::vector<MatrixContribution> terms;
    for (int t = 0; t < 2000; ++t) {
      const int row = index(random), column = t % 10 == 0 ? row : index(random);
      const bool mirror = t % 3 != 0;
      const Complex v(value(random), value(random));
      terms.push_back({row, column, mirror, v});
      expected(row, column) += v;
      if (mirror) expected(column, row) += v;
    }
    matrix.add(terms);
    // Reading the entries settles the mirrors; later terms must still add on top.
    EXPECT_LT((matrix.entries() - expected).cwiseAbs().maxCoeff(), 1e-13) << "round " << round;
  }
}

// The fill's threads add lists of terms and observers' mirrored columns at once, without a
// lock of their own: the sum must be what one thread adding them in turn gives.
TEST(DenseMatrix, TermsAndColumnsAddedFromManyThreadsAtOnceAllArrive) {
  constexpr int n = 300, pieces = 400;
  std::vector<std::vector<MatrixContribution>> lists(pieces);
  std::vector<std::vector<Complex>> columns(pieces);
  std::vector<int> column_of(pieces), first_row_of(pieces);
  ComplexMatrix expected = ComplexMatrix::Zero(n, n);
  std::mt19937 random(7);
  std::uniform_int_distribution<int> index(0, n - 1);
  std::uniform_real_distribution<Real> value(-1.0, 1.0);
  for (int piece = 0; piece < pieces; ++piece) {
    // Few columns, so that threads meet on them.
    const int observer = index(random) % 12;
    for (int t = 0; t < 50; ++t) {
      const int column = index(random);
      const bool mirror = t % 5 != 0;
      const Complex v(value(random), value(random));
      lists[piece].push_back({observer, column, mirror, v});
      expected(observer, column) += v;
      if (mirror) expected(column, observer) += v;
    }
    column_of[piece] = observer;
    first_row_of[piece] = index(random) / 2;
    for (int r = first_row_of[piece]; r < n; ++r) {
      const Complex v(value(random), value(random));
      columns[piece].push_back(v);
      expected(r, observer) += v;
      expected(observer, r) += v;
    }
  }
  DenseMatrix matrix(n);
#pragma omp parallel for schedule(dynamic, 1) num_threads(4)
  for (int piece = 0; piece < pieces; ++piece) {
    matrix.add(lists[piece]);
    matrix.add_mirrored_column(column_of[piece], first_row_of[piece], columns[piece]);
  }
  matrix.finish_fill();
  EXPECT_LT((matrix.entries() - expected).cwiseAbs().maxCoeff(), 1e-12);
}

// After factor() the second buffer holds the matrix the residuals are computed with; a term
// added then would change it behind the factors' back.
TEST(DenseMatrix, RefusesTermsOnceFactored) {
  DenseMatrix matrix(2);
  const std::vector<MatrixContribution> diagonal{{0, 0, false, 2.0}, {1, 1, false, 3.0}, {0, 1, true, 0.5}};
  matrix.add(diagonal);
  matrix.factor();
  EXPECT_THROW(matrix.add(diagonal), std::logic_error);
  const std::vector<Complex> column{1.0};
  EXPECT_THROW(matrix.add_mirrored_column(0, 1, column), std::logic_error);
}

// A frequency loop fills, factors and solves one matrix after another in the same memory:
// each solve must be the one a new matrix gives (a plate with a monopole over the ground:
// mirrored triangle columns, wire lists, images and a junction).
TEST(DenseMatrix, AClearedMatrixSolvesAsANewOne) {
  const Model model = parse_model(
      "units m\nground perfect\nplate deck rectangle corner (-0.3, -0.3, 0.1) size (0.6, 0.6)\nmesh deck size 0.1\n"
      "wire whip from (0, 0, 0.1) to (0, 0, 0.35) radius 2e-3 segments 5\nport feed on whip at start\n"
      "frequency 250 MHz to 350 MHz count 3\n",
      "reuse");
  const AntennaProblem problem(model);
  DenseMatrix reused(problem.unknowns());
  for (const Real f : model.frequencies_hz) {
    const FrequencySolution fresh = solve_frequency(problem, f);
    const FrequencySolution again = solve_frequency(problem, f, reused);
    EXPECT_LT((again.coefficients - fresh.coefficients).norm(), 1e-12 * fresh.coefficients.norm()) << f;
    EXPECT_LT(std::abs(again.port_admittance(0, 0) - fresh.port_admittance(0, 0)),
              1e-12 * std::abs(fresh.port_admittance(0, 0)))
        << f;
  }
}

}  // namespace
}  // namespace lobe
