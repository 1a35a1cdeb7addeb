// The symmetric LDLᵀ factorisation against LAPACK's LU (zgetrf/zgetrs, the reference
// library), on random complex symmetric matrices made to need every kind of pivot and on
// moment-method matrices of the project's own models.
#include <gtest/gtest.h>
#include <lapacke.h>

#include <cstdio>
#include <random>

#include "geometry/model_parser.hpp"
#include "solver/antenna_problem.hpp"
#include "solver/assembly.hpp"
#include "solver/dense_matrix.hpp"
#include "solver/symmetric_factorization.hpp"

namespace lobe {
namespace {

/// The bound the issue sets on ‖Zx − b‖/‖b‖ for every factorisation of the stress runs.
constexpr Real largest_relative_residual = 1e-10;

/// LU's solution of z x = b (LAPACK).
ComplexMatrix lu_solution(ComplexMatrix z, const ComplexMatrix& b) {
  const auto n = static_cast<lapack_int>(z.rows());
  std::vector<lapack_int> pivots(n);
  ComplexMatrix x = b;
  auto* a = reinterpret_cast<lapack_complex_double*>(z.data());
  EXPECT_EQ(LAPACKE_zgetrf(LAPACK_COL_MAJOR, n, n, a, n, pivots.data()), 0);
  EXPECT_EQ(LAPACKE_zgetrs(LAPACK_COL_MAJOR, 'N', n, static_cast<lapack_int>(b.cols()), a, n, pivots.data(),
                           reinterpret_cast<lapack_complex_double*>(x.data()), n),
            0);
  return x;
}

/// Random complex symmetric matrices of several kinds: plain, with a zero diagonal (every
/// step a 2×2 block or an interchange), with a tiny diagonal, and with rows and columns
/// scaled over six decades.
ComplexMatrix random_symmetric(std::mt19937& random, int n, int kind) {
  std::normal_distribution<Real> normal;
  ComplexMatrix z(n, n);
  for (int c = 0; c < n; ++c)
    for (int r = c; r < n; ++r) z(r, c) = z(c, r) = Complex(normal(random), normal(random));
  if (kind == 1) z.diagonal().setZero();
  if (kind == 2) z.diagonal() *= 1e-8;
  if (kind == 3) {
    std::uniform_real_distribution<Real> decades(-3.0, 3.0);
    for (int i = 0; i < n; ++i) {
      const Real s = std::pow(10.0, decades(random));
      z.row(i) *= s;
      z.col(i) *= s;
    }
  }
  return z;
}

struct StressOutcome {
  Real worst_residual = 0.0;
  Real worst_difference = 0.0;  ///< from LU's solution, relative
  int pairs = 0, interchanges = 0;
};

/// Factors `z` by LDLᵀ with panel width `block`, solves two right-hand sides, and folds
/// the residual and the difference from LU's solution into `outcome`.
void check_against_lu(const ComplexMatrix& z, int block, std::mt19937& random, StressOutcome& outcome) {
  std::normal_distribution<Real> normal;
  const Eigen::Index n = z.rows();
  ComplexMatrix b(n, 2);
  for (Eigen::Index i = 0; i < b.size(); ++i) b.data()[i] = Complex(normal(random), normal(random));
  ComplexMatrix factors = z;
  SymmetricPivots pivots;
  ASSERT_TRUE(factor_symmetric(factors, pivots, block));
  ComplexMatrix x = b;
  solve_symmetric(factors, pivots, x);
  const ComplexMatrix reference = lu_solution(z, b);
  for (Eigen::Index c = 0; c < b.cols(); ++c) {
    outcome.worst_residual = std::max(outcome.worst_residual, (z * x.col(c) - b.col(c)).norm() / b.col(c).norm());
    outcome.worst_difference =
        std::max(outcome.worst_difference, (x.col(c) - reference.col(c)).norm() / reference.col(c).norm());
  }
  for (Eigen::Index i = 0; i < n; ++i) {
    outcome.pairs += pivots.pair[i];
    outcome.interchanges += pivots.interchange[i] != i;
  }
}

TEST(SymmetricFactorization, ThousandRandomMatricesSolveAsLuDoes) {
  // Sizes from 2 to 200 with panels of 4 to 64 columns: many panels, 2×2 blocks at panel
  // edges, and the unblocked end of every matrix.
  std::mt19937 random(20261203);
  std::uniform_int_distribution<int> size(2, 200), kind(0, 2);
  const int blocks[] = {4, 8, 32, 64};
  StressOutcome outcome;
  for (int trial = 0; trial < 1000; ++trial) {
    const ComplexMatrix z = random_symmetric(random, size(random), kind(random));
    check_against_lu(z, blocks[trial % 4], random, outcome);
  }
  std::printf("1000 random: worst residual %.2e, worst difference from LU %.2e; %d columns in 2x2 blocks, %d interchanges\n",
              outcome.worst_residual, outcome.worst_difference, outcome.pairs, outcome.interchanges);
  EXPECT_LT(outcome.worst_residual, largest_relative_residual);
  // The random matrices' condition numbers reach about 1e6; both solutions carry errors
  // near cond × 1e-16.
  EXPECT_LT(outcome.worst_difference, 1e-8);
  EXPECT_GT(outcome.pairs, 1000);  // the 2×2 path was taken
}

TEST(SymmetricFactorization, BadlyScaledMatricesAreAsAccurateAsLu) {
  // Rows and columns scaled over six decades: ‖Zx − b‖/‖b‖ may then reach cond(Z) × 1e-16
  // for any backward-stable method, so the measure is LU's own residual on the same systems.
  std::mt19937 random(17);
  std::uniform_int_distribution<int> size(2, 200);
  std::normal_distribution<Real> normal;
  Real worst_ratio = 0.0;
  for (int trial = 0; trial < 100; ++trial) {
    const ComplexMatrix z = random_symmetric(random, size(random), 3);
    ComplexMatrix b(z.rows(), 1);
    for (Eigen::Index i = 0; i < b.size(); ++i) b(i) = Complex(normal(random), normal(random));
    ComplexMatrix factors = z, x = b;
    SymmetricPivots pivots;
    ASSERT_TRUE(factor_symmetric(factors, pivots, 8));
    solve_symmetric(factors, pivots, x);
    const Real ours = (z * x - b).norm(), lu = (z * lu_solution(z, b) - b).norm();
    worst_ratio = std::max(worst_ratio, ours / std::max(lu, 1e-300));
  }
  std::printf("badly scaled: LDLt residual at most %.2f times LU's\n", worst_ratio);
  EXPECT_LT(worst_ratio, 100.0);
}

TEST(SymmetricFactorization, LargeRandomMatricesUseThreadsAndTheProductsAlike) {
  // Big enough for the panel's shared products and many strips of the trailing update.
  std::mt19937 random(7);
  StressOutcome outcome;
  for (int n : {700, 1100})
    for (int kind : {0, 1}) check_against_lu(random_symmetric(random, n, kind), 32, random, outcome);
  std::printf("large random: worst residual %.2e, worst difference from LU %.2e\n", outcome.worst_residual,
              outcome.worst_difference);
  EXPECT_LT(outcome.worst_residual, largest_relative_residual);
  EXPECT_LT(outcome.worst_difference, 1e-8);
}

/// Fifty moment-method matrices: wires over ground, a loop, a plate with a monopole, a
/// printed strip, at ten frequencies each.
TEST(SymmetricFactorization, FiftyMomentMethodMatricesSolveAsLuDoes) {
  const char* models[] = {
      "units mm\nground perfect\nwire mast from (0,0,0) to (0,0,300) radius 2 segments 12\n"
      "wire arm from (0,0,300) to (200,0,350) radius 1 segments 9\nport p on mast at start\n",
      "units mm\narc loop center (0,0,0) normal (0,0,1) from (60,0,0) angle 360 deg radius 1 segments 40\n"
      "port p on loop at start\n",
      "units mm\nplate floor rectangle corner (-150,-150,0) size (300,300)\nmesh floor size 30\n"
      "wire whip from (0,0,0) to (0,0,170) radius 2 segments 6\nport p on whip at start\n",
      "units mm\nsubstrate fr4 thickness 1.6 permittivity 4.4\n"
      "plate strip rectangle corner (-30,-2,1.6) size (60,4)\nmesh strip size 2\n"
      "port p on strip along (0,-2,1.6) to (0,2,1.6)\n",
      "units mm\nplate sheet rectangle corner (-100,-100,50) size (200,200)\nmesh sheet size 25\n"
      "wire dipole from (0,0,-120) to (0,0,120) radius 1 segments 15\nport p on dipole at middle\n"};
  const double lowest_mhz[] = {200, 600, 400, 1500, 500};
  std::mt19937 random(11);
  StressOutcome outcome;
  int matrices = 0;
  for (int m = 0; m < 5; ++m)
    for (int f = 0; f < 10; ++f) {
      const std::string text = std::string(models[m]) + "frequency " + std::to_string(lowest_mhz[m] * (1 + 0.1 * f)) + " MHz\n";
      const Model model = parse_model(text, "stress");
      const AntennaProblem problem(model);
      DenseMatrix matrix(problem.unknowns());
      assemble_system(problem, model.frequencies_hz[0], matrix);
      check_against_lu(matrix.entries(), 32, random, outcome);
      ++matrices;
    }
  std::printf("%d moment-method matrices: worst residual %.2e, worst difference from LU %.2e\n", matrices,
              outcome.worst_residual, outcome.worst_difference);
  EXPECT_EQ(matrices, 50);
  EXPECT_LT(outcome.worst_residual, largest_relative_residual);
  EXPECT_LT(outcome.worst_difference, 1e-9);
}

/// DenseMatrix's factor-and-solve of z x = 1, against LAPACK's LU solution.
struct DenseSolve {
  SolveReport report;
  Real difference_from_lu = 0.0;
};
DenseSolve solve_dense(const ComplexMatrix& z) {
  DenseMatrix matrix(z.rows());
  matrix.entries() = z;
  matrix.factor();
  DenseSolve result;
  const ComplexMatrix b = ComplexMatrix::Ones(z.rows(), 1);
  const ComplexMatrix x = matrix.solve(b, result.report);
  result.difference_from_lu = (x - lu_solution(z, b)).norm() / x.norm();
  return result;
}

TEST(SymmetricFactorization, DenseMatrixReportsTheFactorizationAndTheConditionNumber) {
  // The condition estimate from the LDLᵀ factors against the exact ‖Z‖₁‖Z⁻¹‖₁ (explicit
  // inverse); Higham's estimator is a lower bound, in practice within a factor of 3.
  std::mt19937 random(3);
  const ComplexMatrix z = random_symmetric(random, 120, 0);
  const DenseSolve solved = solve_dense(z);
  EXPECT_EQ(solved.report.factorization, Factorization::symmetric);
  EXPECT_LT(solved.report.relative_residual, largest_relative_residual);
  const Real exact = 1.0 / (z.cwiseAbs().colwise().sum().maxCoeff() *
                            z.inverse().cwiseAbs().colwise().sum().maxCoeff());
  EXPECT_GE(solved.report.reciprocal_condition, exact * (1 - 1e-9));
  EXPECT_LT(solved.report.reciprocal_condition, 3 * exact);
  EXPECT_LT(solved.difference_from_lu, 1e-10);
}

TEST(SymmetricFactorization, UnsymmetricMatrixIsFactoredByLu) {
  std::mt19937 random(5);
  ComplexMatrix z = random_symmetric(random, 80, 0);
  z(3, 70) += Complex(0.5, 0.0);  // one entry off its mirror
  const DenseSolve solved = solve_dense(z);
  EXPECT_EQ(solved.report.factorization, Factorization::lu);
  EXPECT_LT(solved.report.relative_residual, largest_relative_residual);
  EXPECT_LT(solved.difference_from_lu, 1e-12);
}

TEST(SymmetricFactorization, ZeroColumnIsSingular) {
  std::mt19937 random(9);
  ComplexMatrix z = random_symmetric(random, 50, 0);
  z.row(17).setZero();
  z.col(17).setZero();
  ComplexMatrix factors = z;
  SymmetricPivots pivots;
  EXPECT_FALSE(factor_symmetric(factors, pivots, 8));
  DenseMatrix matrix(50);
  matrix.entries() = z;
  EXPECT_THROW(matrix.factor(), NumericalError);
}

}  // namespace
}  // namespace lobe
