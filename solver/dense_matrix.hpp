#pragma once
/// Dense complex matrix, factored by a symmetric LDLᵀ when it is symmetric and by LU otherwise.
#include <array>
#include <atomic>
#include <mutex>
#include <vector>

#include "solver/symmetric_factorization.hpp"
#include "solver/system_matrix.hpp"

namespace lobe {

/// A Galerkin fill gives Z_mn = Z_nm, and a symmetric matrix is factored as L D Lᵀ with
/// Bunch–Kaufman pivoting (symmetric_factorization: half an LU's work). The factors are
/// checked by solving one right-hand side: where the normwise backward error passes
/// `largest_symmetric_backward_error` (the pivoting let the factors grow), or the matrix is
/// not symmetric, the matrix is factored by LU with partial pivoting (LAPACK zgetrf) and
/// the report says which and why.
/// Memory: two N×N complex buffers (the factors and the original, kept for the residual;
/// during the fill the second holds the mirrored terms).
class DenseMatrix final : public SystemMatrix {
 public:
  explicit DenseMatrix(Eigen::Index n);
  Eigen::Index size() const override { return m_entries.rows(); }
  void clear() override;
  /// The entries, with every term added so far (full square).
  ComplexMatrix& entries();
  void add(std::span<const MatrixContribution> terms) override;
  void add_mirrored_column(int column, int first_row, std::span<const Complex> values) override;
  void finish_fill() override { settle_mirrors(); }
  void factor() override;
  ComplexMatrix solve(const ComplexMatrix& rhs, SolveReport& report) const override;

 private:
  /// Solves in place with the factors.
  void solve_in_place(ComplexMatrix& x) const;
  /// 1/cond₁(Z) from the factors (Higham's estimator, LAPACK zlacn2).
  Real estimate_reciprocal_condition(Real norm1) const;
  /// Factors m_entries (a copy of m_original, of 1-norm `norm1`) by LDLᵀ; false, with
  /// m_entries restored, when the factors fail the backward-error check.
  bool factor_symmetric_checked(Real norm1);
  /// Writes zeros to both buffers, column by column in parallel.
  void zero_buffers();
  /// Adds the mirrored terms held in m_original (see add()) to m_entries.
  void settle_mirrors();
  /// Zeros m_original when it still holds mirrors settle_mirrors() has added; safe to call
  /// from several threads at once.
  void clear_stale_mirrors();

  /// The lock that guards column c of both buffers during the fill.
  std::mutex& column_lock(Eigen::Index c) const { return m_column_locks[static_cast<std::size_t>(c) % column_lock_count]; }

  ComplexMatrix m_entries;
  ComplexMatrix m_original;
  /// Columns share locks in stripes: the fill's threads write a few columns each at a time,
  /// so two rarely meet on one stripe.
  static constexpr std::size_t column_lock_count = 256;
  mutable std::array<std::mutex, column_lock_count> m_column_locks;
  Factorization m_factorization = Factorization::lu;
  std::vector<int> m_pivots;
  SymmetricPivots m_symmetric_pivots;
  Real m_reciprocal_condition = 0.0;
  bool m_factored = false;
  std::atomic<bool> m_pristine = true;  ///< both buffers zero: nothing added or factored since
  std::atomic<bool> m_mirrors_pending = false;
  std::atomic<bool> m_mirrors_stale = false;  ///< m_original holds settled mirrors, not zeros
  std::mutex m_clearing;
};

}  // namespace lobe
