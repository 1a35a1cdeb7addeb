#pragma once
/// Dense complex-symmetric matrix factored by LAPACK's Bunch–Kaufman LDLᵀ (zsytrf).
#include <vector>

#include "solver/system_matrix.hpp"

namespace lobe {

/// A Galerkin fill gives Z_mn = Z_nm; zsytrf then does half the work of an LU.
/// Memory: two N×N complex buffers (the factors and the original, kept for the residual).
class DenseSymmetricMatrix final : public SystemMatrix {
 public:
  explicit DenseSymmetricMatrix(Eigen::Index n);
  Eigen::Index size() const override { return m_entries.rows(); }
  /// The entries to fill (full square; both triangles must hold the same values).
  ComplexMatrix& entries() { return m_entries; }
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
