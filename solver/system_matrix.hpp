#pragma once
/// The moment-method system matrix behind a small interface, so that a compressed or
/// iterative matrix can later replace the dense one without touching post-processing.
#include <cstdint>
#include <string>

#include "core/types.hpp"
#include "geometry/model.hpp"

namespace lobe {

/// How well a factor-and-solve went.
struct SolveReport {
  Real reciprocal_condition = 0.0;  ///< LAPACK's 1-norm estimate of 1/cond(Z)
  Real relative_residual = 0.0;     ///< max over columns of ‖Z x − b‖ / ‖b‖
};

/// A numerical failure (singular matrix, non-finite values). Not a user-input error.
class NumericalError : public std::runtime_error {
 public:
  using std::runtime_error::runtime_error;
};

class SystemMatrix {
 public:
  virtual ~SystemMatrix() = default;
  virtual Eigen::Index size() const = 0;
  /// Factors in place; throws NumericalError when the matrix is singular.
  virtual void factor() = 0;
  /// Solves Z X = B for all columns of B at once; requires factor() first.
  virtual ComplexMatrix solve(const ComplexMatrix& rhs, SolveReport& report) const = 0;
};

/// Bytes a dense complex matrix of n unknowns takes, including the copy kept for residuals.
std::uint64_t dense_matrix_bytes(std::uint64_t n);

/// Throws InputError (located at the model file) when the dense matrices of `unknowns`
/// would not fit in the machine's memory; `estimated` says the count is a forecast made
/// before meshing.
void require_dense_memory(const Model& model, double unknowns, bool estimated = false);

}  // namespace lobe
