#pragma once
/// The moment-method system matrix behind one interface: the fill adds to it, the
/// pipeline factors and solves it, and a compressed, iterative or distributed matrix can
/// later take the dense one's place without touching the integrators or post-processing.
#include <cstdint>
#include <memory>
#include <span>
#include <stdexcept>
#include <string>

#include "core/types.hpp"
#include "geometry/model.hpp"

namespace lobe {

/// One term of Z: added at (row, column), and at (column, row) too when `mirror`.
struct MatrixContribution {
  int row;
  int column;
  bool mirror;
  Complex value;
};

/// How a system matrix was factored.
enum class Factorization {
  symmetric,      ///< L D Lᵀ with Bunch–Kaufman pivoting (half an LU's work)
  lu,             ///< LU with partial pivoting: the matrix is not symmetric
  lu_after_check  ///< LU because the symmetric factors failed their backward-error check
};

/// How well a factor-and-solve went.
struct SolveReport {
  Factorization factorization = Factorization::lu;
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
  /// Makes the matrix ready for a new fill, every entry zero and no factors, in the memory
  /// it has: a frequency loop reuses one matrix (allocating and first touching a dense
  /// matrix took half a fill's time at 2,979 unknowns).
  virtual void clear() = 0;
  /// Adds terms during the fill; may be called from several threads at once.
  virtual void add(std::span<const MatrixContribution> terms) = 0;
  /// Adds values[i] at (first_row + i, column) and at (column, first_row + i): one observing
  /// function's mirrored terms, gathered densely; may be called from several threads at once.
  virtual void add_mirrored_column(int column, int first_row, std::span<const Complex> values) = 0;
  /// Ends a fill: whatever add() deferred is put in place, so that the fill's time is the
  /// fill's and not the factorisation's. Terms may still be added afterwards.
  virtual void finish_fill() {}
  /// Factors in place; throws NumericalError when the matrix is singular.
  virtual void factor() = 0;
  /// Solves Z X = B for all columns of B at once; requires factor() first. The report
  /// carries the condition estimate and the residual.
  virtual ComplexMatrix solve(const ComplexMatrix& rhs, SolveReport& report) const = 0;
};

/// Bytes the system matrix of n unknowns takes (dense today: the factors and the original,
/// kept for the residual).
std::uint64_t system_matrix_bytes(std::uint64_t n);

/// Throws InputError (located at the model file) when the matrix of `unknowns` would not fit
/// in the memory this process can really have; `estimated` says the count is a forecast made
/// before meshing.
void require_system_memory(const Model& model, double unknowns, bool estimated = false);

/// The matrix for n unknowns, after require_system_memory. Dense LU today.
std::unique_ptr<SystemMatrix> make_system_matrix(const Model& model, Eigen::Index n);

}  // namespace lobe
