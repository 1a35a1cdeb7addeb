#pragma once
/// Blocked LDLᵀ factorisation of a complex symmetric matrix (A = Aᵀ, not Hermitian) with
/// Bunch–Kaufman pivoting: half the work of an LU.
///
/// The algorithm is LAPACK's zsytrf/zlasyf (lower triangle; Bunch and Kaufman, Math. Comp.
/// 31 (1977) 163–179; Anderson et al., LAPACK Users' Guide, 3rd ed., SIAM 1999): a panel
/// of columns is factored with its updates delayed, and the rest of the matrix is updated
/// once per panel by a matrix product. The panel's matrix–vector work is done here, one
/// thread per call; only the trailing products go to BLAS (zgemm). OpenBLAS 0.3.21's own
/// zsytrf crashed now and then inside its threaded zgemv; its zgemm never has.
#include <vector>

#include "core/types.hpp"

namespace lobe {

/// The factors' pivots: before column k is eliminated, row and column k (for a 1×1 block)
/// or k+1 (for the second column of a 2×2 block) are interchanged with `interchange[k]`.
struct SymmetricPivots {
  std::vector<int> interchange;
  std::vector<bool> pair;  ///< column k belongs to a 2×2 block of D
};

/// Factors the lower triangle of `a` in place as L D Lᵀ (L in the lower triangle in
/// LAPACK's product form, D's blocks on the diagonal and first subdiagonal); the upper
/// triangle is used as workspace. Returns false when a column is exactly zero (singular).
/// `block` is the panel width: 32 measured fastest at N = 3,000 (64 took 1.1–1.4 times as
/// long, 96 1.7 times: the panel's products run on one thread).
bool factor_symmetric(ComplexMatrix& a, SymmetricPivots& pivots, int block = 32);

/// Overwrites `b` with A⁻¹ b, given the factors of factor_symmetric.
void solve_symmetric(const ComplexMatrix& factors, const SymmetricPivots& pivots, ComplexMatrix& b);

}  // namespace lobe
