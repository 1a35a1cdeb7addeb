#include "solver/dense_matrix.hpp"

#include <lapacke.h>
#include <unistd.h>

#include <cstdio>

#include "core/check.hpp"
#include "solver/memory_limit.hpp"

namespace lobe {

std::uint64_t system_matrix_bytes(std::uint64_t n) { return 2 * n * n * sizeof(Complex); }

namespace {
/// Share of the memory this process can have that the dense matrices may take; the rest is
/// for the meshes, far fields and results.
constexpr double usable_memory_share = 0.9;
}  // namespace

void require_system_memory(const Model& model, double unknowns, bool estimated) {
  // What the process can really have: free memory, its control group's limit and its
  // address-space limit, not the machine's total (80 % of which once let a run start that
  // the out-of-memory killer then ended).
  const MemoryBudget budget = usable_memory();
  // The same count as system_matrix_bytes, in floating point: an estimate may overflow integers.
  const double needed = static_cast<double>(system_matrix_bytes(1)) * unknowns * unknowns;
  if (needed > usable_memory_share * budget.bytes) {
    char message[400];
    std::snprintf(message, sizeof message,
                  "the model has %s%.0f unknowns%s; its matrices need %.3g GiB but this process can have %.2g GiB "
                  "(%s); use fewer segments or a coarser mesh",
                  estimated ? "about " : "", unknowns, estimated ? " (estimated before meshing)" : "",
                  needed / (1 << 30), budget.bytes / (1 << 30), budget.source.c_str());
    throw InputError({model.file, 1, 1}, message);
  }
}

DenseMatrix::DenseMatrix(Eigen::Index n) : m_entries(n, n), m_original(n, n) {
  // Both buffers are written column by column, in parallel, so that every page is really
  // allocated before the fill and the copy in factor(): a first write later would fault
  // with a TLB shootdown across cores, measured here to double the fill time.
#pragma omp parallel for schedule(static)
  for (Eigen::Index c = 0; c < n; ++c) {
    m_entries.col(c).setZero();
    m_original.col(c).setZero();
  }
}

void DenseMatrix::add(std::span<const MatrixContribution> terms) {
  for (const MatrixContribution& c : terms) {
    LOBE_ASSERT(c.row < size() && c.column < size());
    m_entries(c.row, c.column) += c.value;
    if (c.mirror) m_entries(c.column, c.row) += c.value;
  }
}

std::unique_ptr<SystemMatrix> make_system_matrix(const Model& model, Eigen::Index n) {
  require_system_memory(model, static_cast<double>(n));
  return std::make_unique<DenseMatrix>(n);
}

void DenseMatrix::factor() {
  LOBE_CHECK(!m_factored, "matrix factored twice");
  const auto n = static_cast<lapack_int>(size());
  if (!m_entries.allFinite()) throw NumericalError("the system matrix has non-finite entries");
  m_original = m_entries;
  const Real norm1 = m_entries.cwiseAbs().colwise().sum().maxCoeff();
  m_pivots.assign(n, 0);
  auto* a = reinterpret_cast<lapack_complex_double*>(m_entries.data());
  const lapack_int info = LAPACKE_zgetrf(LAPACK_COL_MAJOR, n, n, a, n, m_pivots.data());
  if (info > 0) throw NumericalError("the system matrix is singular (zgetrf pivot " + std::to_string(info) + ")");
  LOBE_CHECK(info == 0, "zgetrf argument error");
  double rcond = 0.0;
  const lapack_int con = LAPACKE_zgecon(LAPACK_COL_MAJOR, '1', n, a, n, norm1, &rcond);
  LOBE_CHECK(con == 0, "zgecon failed");
  m_reciprocal_condition = rcond;
  m_factored = true;
}

ComplexMatrix DenseMatrix::solve(const ComplexMatrix& rhs, SolveReport& report) const {
  LOBE_CHECK(m_factored, "solve before factor");
  LOBE_CHECK(rhs.rows() == size(), "right-hand side has the wrong size");
  ComplexMatrix x = rhs;
  const auto n = static_cast<lapack_int>(size());
  const lapack_int info = LAPACKE_zgetrs(LAPACK_COL_MAJOR, 'N', n, static_cast<lapack_int>(x.cols()),
                                         reinterpret_cast<const lapack_complex_double*>(m_entries.data()), n,
                                         m_pivots.data(), reinterpret_cast<lapack_complex_double*>(x.data()), n);
  LOBE_CHECK(info == 0, "zgetrs failed");
  if (!x.allFinite()) throw NumericalError("the solution has non-finite values");
  report.reciprocal_condition = m_reciprocal_condition;
  report.relative_residual = 0.0;
  for (Eigen::Index c = 0; c < rhs.cols(); ++c) {
    const Real b = rhs.col(c).norm();
    if (b > 0) report.relative_residual = std::max(report.relative_residual, (m_original * x.col(c) - rhs.col(c)).norm() / b);
  }
  return x;
}

}  // namespace lobe
