#include "solver/dense_matrix.hpp"

#include <lapacke.h>
#include <unistd.h>

#include <cstdio>

#include <algorithm>
#include <bitset>
#include <complex>

#include "core/check.hpp"
#include "solver/blas_kernels.hpp"
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
  use_fastest_blas_kernels();
  // Both buffers are written at once, so that every page is really allocated before the
  // fill and the copy in factor(): a first write later would fault with a TLB shootdown
  // across cores, measured here to double the fill time.
  zero_buffers();
}

void DenseMatrix::zero_buffers() {
  const Eigen::Index n = size();
#pragma omp parallel for schedule(static)
  for (Eigen::Index c = 0; c < n; ++c) {
    m_entries.col(c).setZero();
    m_original.col(c).setZero();
  }
}

void DenseMatrix::clear() {
  if (!m_pristine) zero_buffers();
  m_pristine = true;
  m_factored = false;
  m_mirrors_pending = false;
  m_mirrors_stale = false;
  m_factorization = Factorization::lu;
  m_pivots.clear();
  m_symmetric_pivots = {};
  m_reciprocal_condition = 0.0;
}

void DenseMatrix::add(std::span<const MatrixContribution> terms) {
  // A mirrored term's (column, row) copy goes into m_original, at (column, row) again:
  // the integrators' row is the observing element's function, so these writes run down a
  // few columns, and settle_mirrors() adds the transpose in cache-sized tiles. Written at
  // (row, column) of a column-major matrix directly, they were a cache miss each and a
  // fifth of a surface fill.
  const auto stripe_of = [](const MatrixContribution& c) {
    return static_cast<std::size_t>(c.mirror ? c.row : c.column) % column_lock_count;
  };
  // An observer's terms fall on its few functions' columns: their locks are taken once for
  // the whole list, in increasing order so that two lists never wait for each other.
  LOBE_CHECK(!m_factored, "terms added to a factored matrix");
  std::bitset<column_lock_count> stripes;
  bool mirrored = false;
  for (const MatrixContribution& c : terms) {
    stripes.set(stripe_of(c));
    mirrored = mirrored || c.mirror;
  }
  if (mirrored) clear_stale_mirrors();
  if (!terms.empty()) m_pristine.store(false, std::memory_order_relaxed);
  for (std::size_t s = 0; s < column_lock_count; ++s)
    if (stripes.test(s)) m_column_locks[s].lock();
  for (const MatrixContribution& c : terms) {
    LOBE_ASSERT(c.row < size() && c.column < size());
    if (c.mirror) {
      m_original(c.column, c.row) += c.value;
      m_mirrors_pending.store(true, std::memory_order_relaxed);
    } else {
      m_entries(c.row, c.column) += c.value;
    }
  }
  for (std::size_t s = 0; s < column_lock_count; ++s)
    if (stripes.test(s)) m_column_locks[s].unlock();
}

void DenseMatrix::add_mirrored_column(int column, int first_row, std::span<const Complex> values) {
  LOBE_ASSERT(column < size() && first_row + static_cast<Eigen::Index>(values.size()) <= size());
  LOBE_CHECK(!m_factored, "terms added to a factored matrix");
  if (values.empty()) return;
  clear_stale_mirrors();
  m_pristine.store(false, std::memory_order_relaxed);
  const std::lock_guard<std::mutex> lock(column_lock(column));
  // Where add() keeps a mirrored term of the observing function `column`: down its column.
  m_original.col(column).segment(first_row, static_cast<Eigen::Index>(values.size())) +=
      Eigen::Map<const ComplexVector>(values.data(), static_cast<Eigen::Index>(values.size()));
  m_mirrors_pending.store(true, std::memory_order_relaxed);
}

void DenseMatrix::settle_mirrors() {
  if (!m_mirrors_pending) return;
  const Eigen::Index n = size();
  constexpr Eigen::Index tile = 64;
  const Eigen::Index tiles = (n + tile - 1) / tile;
  // Z += M + Mᵀ, tile pair by tile pair below the diagonal. M is left as it is: the next
  // fill's first mirrored term clears it (clear_stale_mirrors), and a factorisation
  // overwrites it with Z, so its N² zeros (a few per cent of a fill at 2,979 unknowns) are
  // written only where needed.
#pragma omp parallel for schedule(dynamic)
  for (Eigen::Index t = 0; t < tiles; ++t) {
    const Eigen::Index c0 = t * tile, columns = std::min(tile, n - c0);
    for (Eigen::Index r0 = c0; r0 < n; r0 += tile) {
      const Eigen::Index rows = std::min(tile, n - r0);
      auto lower = m_original.block(r0, c0, rows, columns);
      auto upper = m_original.block(c0, r0, columns, rows);
      if (r0 == c0) {
        m_entries.block(r0, c0, rows, columns) += lower + lower.transpose();
        continue;
      }
      m_entries.block(r0, c0, rows, columns) += lower + upper.transpose();
      m_entries.block(c0, r0, columns, rows) += upper + lower.transpose();
    }
  }
  m_mirrors_pending = false;
  m_mirrors_stale = true;
}

void DenseMatrix::clear_stale_mirrors() {
  if (!m_mirrors_stale.load(std::memory_order_acquire)) return;
  const std::lock_guard<std::mutex> lock(m_clearing);
  if (!m_mirrors_stale.load(std::memory_order_relaxed)) return;
  m_original.setZero();
  m_mirrors_stale.store(false, std::memory_order_release);
}

ComplexMatrix& DenseMatrix::entries() {
  settle_mirrors();
  return m_entries;
}

std::unique_ptr<SystemMatrix> make_system_matrix(const Model& model, Eigen::Index n) {
  require_system_memory(model, static_cast<double>(n));
  return std::make_unique<DenseMatrix>(n);
}

namespace {

/// Normwise backward error above which the symmetric factors are not trusted: Bunch–Kaufman
/// pivoting bounds the growth only loosely, and backward errors of stable factorisations
/// of these matrices are near 1e-16 (measured: 1e-16 to 4e-16 on the plate and wire models).
constexpr Real largest_symmetric_backward_error = 1e-12;

/// Entries further apart than this share of the largest make the matrix unsymmetric (a
/// Galerkin fill mirrors every term and gives exactly equal entries).
constexpr Real symmetry_tolerance = 1e-13;

/// The matrix's 1-norm, and whether it is symmetric to `symmetry_tolerance` of its largest
/// entry: one pass over the lower triangle's tiles and their mirrors, shared among the
/// threads (a pass over N² entries is a tenth of a second at N = 5,000).
struct NormAndSymmetry {
  Real norm1 = 0.0;
  bool symmetric = true;
};

NormAndSymmetry norm_and_symmetry(const ComplexMatrix& z) {
  const Eigen::Index n = z.rows();
  Eigen::VectorXd column_sums(n);
  Real largest_squared = 0.0;
#pragma omp parallel for schedule(static) reduction(max : largest_squared)
  for (Eigen::Index c = 0; c < n; ++c) {
    // |z| as √(re² + im²): std::abs calls hypot, which guards against an overflow these
    // entries cannot reach; with it this 1-norm alone took 0.44 s at N = 5,078, now the
    // whole pass takes 0.2 s.
    column_sums(c) = z.col(c).cwiseAbs2().cwiseSqrt().sum();
    largest_squared = std::max(largest_squared, z.col(c).cwiseAbs2().maxCoeff());
  }
  const Real limit = symmetry_tolerance * symmetry_tolerance * largest_squared;
  // In tiles, so that the transposed reads stay in cache.
  constexpr Eigen::Index tile = 64;
  const Eigen::Index tiles = (n + tile - 1) / tile;
  bool symmetric = true;
#pragma omp parallel for schedule(dynamic) reduction(&& : symmetric)
  for (Eigen::Index t = 0; t < tiles; ++t) {
    const Eigen::Index c0 = t * tile, columns = std::min(tile, n - c0);
    for (Eigen::Index r0 = c0; r0 < n; r0 += tile) {
      const Eigen::Index rows = std::min(tile, n - r0);
      if ((z.block(r0, c0, rows, columns) - z.block(c0, r0, columns, rows).transpose()).cwiseAbs2().maxCoeff() > limit)
        symmetric = false;
    }
  }
  return {n > 0 ? column_sums.maxCoeff() : 0.0, symmetric};
}

/// A right-hand side with entries of unit size and scattered phases, the same every time.
ComplexMatrix check_vector(Eigen::Index n) {
  ComplexMatrix v(n, 1);
  for (Eigen::Index i = 0; i < n; ++i) v(i, 0) = std::polar(1.0, 2.399963229728653 * static_cast<double>(i));
  return v;
}

}  // namespace

bool DenseMatrix::factor_symmetric_checked(Real norm1) {
  if (factor_symmetric(m_entries, m_symmetric_pivots)) {
    const ComplexMatrix b = check_vector(size());
    ComplexMatrix x = b;
    solve_symmetric(m_entries, m_symmetric_pivots, x);
    const ComplexMatrix residual = m_original * x - b;
    // ‖Z‖∞ = ‖Zᵀ‖₁ = ‖Z‖₁ for a symmetric matrix.
    const Real backward_error = residual.cwiseAbs().maxCoeff() / (norm1 * x.cwiseAbs().maxCoeff() + 1.0);
    if (x.allFinite() && backward_error <= largest_symmetric_backward_error) return true;
  }
  m_entries = m_original;
  return false;
}

void DenseMatrix::factor() {
  LOBE_CHECK(!m_factored, "matrix factored twice");
  m_pristine = false;
  const auto n = static_cast<lapack_int>(size());
  settle_mirrors();
  if (!m_entries.allFinite()) throw NumericalError("the system matrix has non-finite entries");
  m_original = m_entries;
  const auto [norm1, symmetric] = norm_and_symmetry(m_entries);
  if (symmetric) {
    m_factorization = factor_symmetric_checked(norm1) ? Factorization::symmetric : Factorization::lu_after_check;
  } else {
    m_factorization = Factorization::lu;
  }
  if (m_factorization != Factorization::symmetric) {
    m_pivots.assign(n, 0);
    auto* a = reinterpret_cast<lapack_complex_double*>(m_entries.data());
    const lapack_int info = LAPACKE_zgetrf(LAPACK_COL_MAJOR, n, n, a, n, m_pivots.data());
    if (info > 0) throw NumericalError("the system matrix is singular (zgetrf pivot " + std::to_string(info) + ")");
    LOBE_CHECK(info == 0, "zgetrf argument error");
  }
  m_factored = true;
  m_reciprocal_condition = estimate_reciprocal_condition(norm1);
}

void DenseMatrix::solve_in_place(ComplexMatrix& x) const {
  if (m_factorization == Factorization::symmetric) {
    solve_symmetric(m_entries, m_symmetric_pivots, x);
    return;
  }
  const auto n = static_cast<lapack_int>(size());
  const lapack_int info = LAPACKE_zgetrs(LAPACK_COL_MAJOR, 'N', n, static_cast<lapack_int>(x.cols()),
                                         reinterpret_cast<const lapack_complex_double*>(m_entries.data()), n,
                                         m_pivots.data(), reinterpret_cast<lapack_complex_double*>(x.data()), n);
  LOBE_CHECK(info == 0, "zgetrs failed");
}

Real DenseMatrix::estimate_reciprocal_condition(Real norm1) const {
  if (norm1 == 0.0) return 0.0;
  // LAPACK's norm estimator (Higham, ACM TOMS 14 (1988) 381–396), by reverse
  // communication: zlacn2 asks for Z⁻¹ x (kase 1) or Z⁻ᴴ x (kase 2) until its
  // estimate of ‖Z⁻¹‖₁ settles. Z⁻ᴴ x is Z⁻¹ applied to conj(x), conjugated, when Z = Zᵀ;
  // LU solves it directly.
  lapack_int n = static_cast<lapack_int>(size()), kase = 0, isave[3] = {0, 0, 0};
  double inverse_norm = 0.0;
  ComplexMatrix x(size(), 1);
  std::vector<Complex> v(size());
  for (;;) {
    LAPACK_zlacn2(&n, reinterpret_cast<lapack_complex_double*>(v.data()), reinterpret_cast<lapack_complex_double*>(x.data()),
            &inverse_norm, &kase, isave);
    if (kase == 0) break;
    if (kase == 1) {
      solve_in_place(x);
    } else if (m_factorization == Factorization::symmetric) {
      x = x.conjugate().eval();
      solve_in_place(x);
      x = x.conjugate().eval();
    } else {
      const lapack_int info = LAPACKE_zgetrs(LAPACK_COL_MAJOR, 'C', n, 1,
                                             reinterpret_cast<const lapack_complex_double*>(m_entries.data()), n,
                                             m_pivots.data(), reinterpret_cast<lapack_complex_double*>(x.data()), n);
      LOBE_CHECK(info == 0, "zgetrs failed");
    }
  }
  return inverse_norm > 0.0 ? 1.0 / (inverse_norm * norm1) : 0.0;
}

ComplexMatrix DenseMatrix::solve(const ComplexMatrix& rhs, SolveReport& report) const {
  LOBE_CHECK(m_factored, "solve before factor");
  LOBE_CHECK(rhs.rows() == size(), "right-hand side has the wrong size");
  ComplexMatrix x = rhs;
  solve_in_place(x);
  if (!x.allFinite()) throw NumericalError("the solution has non-finite values");
  report.factorization = m_factorization;
  report.reciprocal_condition = m_reciprocal_condition;
  report.relative_residual = 0.0;
  for (Eigen::Index c = 0; c < rhs.cols(); ++c) {
    const Real b = rhs.col(c).norm();
    if (b > 0) report.relative_residual = std::max(report.relative_residual, (m_original * x.col(c) - rhs.col(c)).norm() / b);
  }
  return x;
}

}  // namespace lobe
