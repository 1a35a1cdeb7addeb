// The dense system matrix's bookkeeping: a mirrored term lands at (row, column) and at
// (column, row), however the matrix stores it while it is being filled.
#include <gtest/gtest.h>

#include <random>
#include <vector>

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

}  // namespace
}  // namespace lobe
