#pragma once
/// Dense complex matrix factored by LU with partial pivoting (LAPACK zgetrf, OpenBLAS).
#include <vector>

#include "solver/system_matrix.hpp"

namespace lobe {

/// A Galerkin fill gives Z_mn = Z_nm, and a symmetric LDLᵀ (zsytrf) would do half an LU's
/// work; but OpenBLAS 0.3.21's optimised kernels (Haswell, SkylakeX: what real hardware
/// gets) crash inside zsytrf's threaded zgemv now and then (measured: 2 of 36 random
/// factorisations of order 1,500 to 2,600), while OpenBLAS's own parallel LU never did in
/// 204. A crash loses a night's sweep; an LU costs 1.4× the time with those kernels.
/// Memory: two N×N complex buffers (the factors and the original, kept for the residual).
class DenseMatrix final : public SystemMatrix {
 public:
  explicit DenseMatrix(Eigen::Index n);
  Eigen::Index size() const override { return m_entries.rows(); }
  /// The entries to fill (full square; both triangles must hold the same values).
  ComplexMatrix& entries() { return m_entries; }
  const ComplexMatrix& entries() const { return m_entries; }
  void add(std::span<const MatrixContribution> terms) override;
  void factor() override;
  ComplexMatrix solve(const ComplexMatrix& rhs, SolveReport& report) const override;

 private:
  ComplexMatrix m_entries;
  ComplexMatrix m_original;
  std::vector<int> m_pivots;
  Real m_reciprocal_condition = 0.0;
  bool m_factored = false;
};

}  // namespace lobe
