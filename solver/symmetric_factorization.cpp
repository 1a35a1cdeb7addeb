#include "solver/symmetric_factorization.hpp"

#include <cblas.h>

#include <algorithm>
#include <cmath>

#include "core/check.hpp"
#include "solver/blas_kernels.hpp"
#include "solver/threads.hpp"

namespace lobe {
namespace {

using MatrixView = Eigen::Map<ComplexMatrix, 0, Eigen::OuterStride<>>;

/// Bunch–Kaufman's threshold (1 + √17)/8: it bounds the growth of the 1×1 and 2×2 steps
/// alike.
const Real bunch_kaufman_alpha = (1.0 + std::sqrt(17.0)) / 8.0;

/// LAPACK's pivot size |Re| + |Im|: cheaper than the modulus and within √2 of it.
Real size_of(Complex z) { return std::abs(z.real()) + std::abs(z.imag()); }

/// Columns of the trailing matrix updated by one zgemm after a panel: wide enough that
/// the product runs near zgemm's rate, narrow enough that the part above the diagonal it
/// computes for nothing stays small.
constexpr int update_width = 128;

/// Column `target` of w from row `first` down, less the panel's columns done (0..done)
/// times row `row` of w. One thread: sharing these short products among threads measured
/// no faster, and the threads' waiting slowed the products between the panels.
void update_from_panel(const MatrixView& a, ComplexMatrix& w, int target, int first, int row, int done) {
  if (done == 0) return;
  w.col(target).tail(a.rows() - first).noalias() -=
      a.bottomLeftCorner(a.rows() - first, done) * w.row(row).head(done).transpose();
}

/// Factors one panel of the trailing matrix `a` (m × m, lower triangle; LAPACK's zlasyf):
/// columns are eliminated with their updates from the panel's earlier columns applied on
/// the fly through `w` (w = L D for the columns done), until `block` − 1 columns are done
/// or the matrix ends; then the rest is updated by one product per column strip. Returns
/// the number of columns done, 0 when a column is exactly zero. Pivots are local.
int factor_panel(MatrixView a, int block, ComplexMatrix& w, std::vector<int>& interchange, std::vector<bool>& pair) {
  const int m = static_cast<int>(a.rows());
  const int nb = std::min(block, m);
  w.resize(m, nb);
  int k = 0;
  while (k < m && !(k >= nb - 1 && nb < m)) {
    // Column k of the matrix with the panel's earlier steps applied.
    w.col(k).tail(m - k) = a.col(k).tail(m - k);
    update_from_panel(a, w, k, k, k, k);
    int step = 1, pivot = k;
    const Real diagonal = size_of(w(k, k));
    Real column_max = 0.0;
    int row_of_max = k;
    for (int i = k + 1; i < m; ++i)
      if (size_of(w(i, k)) > column_max) column_max = size_of(w(i, k)), row_of_max = i;
    if (std::max(diagonal, column_max) == 0.0) return 0;
    if (diagonal < bunch_kaufman_alpha * column_max) {
      // Column row_of_max, updated, into w's next column: its entries left of the
      // diagonal are row row_of_max of the lower triangle.
      const int r = row_of_max;
      for (int j = k; j < r; ++j) w(j, k + 1) = a(r, j);
      w.col(k + 1).segment(r, m - r) = a.col(r).segment(r, m - r);
      update_from_panel(a, w, k + 1, k, r, k);
      Real row_max = 0.0;
      for (int j = k; j < m; ++j)
        if (j != r) row_max = std::max(row_max, size_of(w(j, k + 1)));
      if (diagonal >= bunch_kaufman_alpha * column_max * (column_max / row_max)) {
        pivot = k;  // the diagonal is large enough after all
      } else if (size_of(w(r, k + 1)) >= bunch_kaufman_alpha * row_max) {
        pivot = r;  // a 1×1 step on row r's diagonal
        w.col(k).tail(m - k) = w.col(k + 1).tail(m - k);
      } else {
        pivot = r;  // a 2×2 step on columns k and r
        step = 2;
      }
    }
    const int kk = k + step - 1;
    if (pivot != kk) {
      // Move the not yet updated column kk to column pivot (lower triangle only), and
      // interchange the two rows in the panel's columns done and in w.
      a(pivot, pivot) = a(kk, kk);
      for (int j = kk + 1; j < pivot; ++j) a(pivot, j) = a(j, kk);
      for (int i = pivot + 1; i < m; ++i) a(i, pivot) = a(i, kk);
      for (int j = 0; j < kk; ++j) std::swap(a(kk, j), a(pivot, j));
      for (int j = 0; j <= kk; ++j) std::swap(w(kk, j), w(pivot, j));
    }
    if (step == 1) {
      a.col(k).tail(m - k) = w.col(k).tail(m - k);
      if (k + 1 < m) a.col(k).tail(m - k - 1) *= Complex(1.0) / a(k, k);
    } else {
      if (k + 2 < m) {
        // L's two columns are w's times the inverse of the 2×2 block, written so that
        // nothing overflows when the block's off-diagonal entry dominates.
        Complex d21 = w(k + 1, k);
        const Complex d11 = w(k + 1, k + 1) / d21, d22 = w(k, k) / d21;
        d21 = (Complex(1.0) / (d11 * d22 - Complex(1.0))) / d21;
        for (int j = k + 2; j < m; ++j) {
          a(j, k) = d21 * (d11 * w(j, k) - w(j, k + 1));
          a(j, k + 1) = d21 * (d22 * w(j, k + 1) - w(j, k));
        }
      }
      a(k, k) = w(k, k);
      a(k + 1, k) = w(k + 1, k);
      a(k + 1, k + 1) = w(k + 1, k + 1);
    }
    for (int s = 0; s < step; ++s) {
      interchange.push_back(pivot);
      pair.push_back(step == 2);
    }
    k += step;
  }
  // The rest of the matrix less L21 D L21ᵀ = L21 W21ᵀ, a strip of columns at a time; each
  // product also writes the part of its diagonal block above the diagonal, which is unused.
  const Complex minus_one(-1.0), one(1.0);
#pragma omp parallel for schedule(dynamic) if (m - k > update_width)
  for (int j = k; j < m; j += update_width) {
    const int width = std::min(update_width, m - j);
    cblas_zgemm(CblasColMajor, CblasNoTrans, CblasTrans, m - j, width, k, &minus_one, &a(j, 0), a.outerStride(),
                &w(j, 0), w.outerStride(), &one, &a(j, j), a.outerStride());
  }
  // Undo the panel's later interchanges in its earlier columns: L is kept in product form,
  // each column with only the interchanges made before it (LAPACK's convention).
  for (int j = k - 1; j > 0;) {
    const int jj = j;
    const int row = interchange[jj];
    if (pair[jj]) --j;
    --j;
    if (row != jj && j >= 0)
      for (int c = 0; c <= j; ++c) std::swap(a(row, c), a(jj, c));
  }
  return k;
}

}  // namespace

bool factor_symmetric(ComplexMatrix& a, SymmetricPivots& pivots, int block) {
  LOBE_CHECK(a.rows() == a.cols() && block >= 2, "factor_symmetric: square matrix and a panel of two or more");
  use_fastest_blas_kernels();
  const int n = static_cast<int>(a.rows());
  pivots.interchange.assign(n, 0);
  pivots.pair.assign(n, false);
  // The threads share the work by OpenMP, each product in BLAS on one thread: BLAS's own
  // threads would spin beside OpenMP's between the products and slow both.
  const SingleThreadedBlas one_blas_thread;
  ComplexMatrix w;
  std::vector<int> interchange;
  std::vector<bool> pair;
  for (int k0 = 0; k0 < n;) {
    const int m = n - k0;
    MatrixView trailing(&a(k0, k0), m, m, Eigen::OuterStride<>(a.outerStride()));
    interchange.clear();
    pair.clear();
    const int done = factor_panel(trailing, block, w, interchange, pair);
    if (done == 0) return false;
    for (int j = 0; j < done; ++j) {
      pivots.interchange[k0 + j] = k0 + interchange[j];
      pivots.pair[k0 + j] = pair[j];
    }
    k0 += done;
  }
  return true;
}

namespace {

/// solve_symmetric for one right-hand side, in vector operations (LAPACK's zsytrs, a
/// column at a time: the condition estimate and the factors' check solve six or so single
/// vectors per factorisation, and matrix expressions over rows had made those a third of
/// the factor step at N = 5,078).
void solve_symmetric_vector(const ComplexMatrix& factors, const SymmetricPivots& pivots,
                            Eigen::Ref<Eigen::VectorXcd> x) {
  const int n = static_cast<int>(factors.rows());
  for (int k = 0; k < n;) {
    if (!pivots.pair[k]) {
      if (pivots.interchange[k] != k) std::swap(x(k), x(pivots.interchange[k]));
      const int m = n - k - 1;
      if (m > 0) x.tail(m) -= x(k) * factors.col(k).tail(m);
      x(k) /= factors(k, k);
      k += 1;
    } else {
      if (pivots.interchange[k] != k + 1) std::swap(x(k + 1), x(pivots.interchange[k]));
      const int m = n - k - 2;
      if (m > 0) x.tail(m) -= x(k) * factors.col(k).tail(m) + x(k + 1) * factors.col(k + 1).tail(m);
      const Complex d21 = factors(k + 1, k);
      const Complex d11 = factors(k, k) / d21, d22 = factors(k + 1, k + 1) / d21;
      const Complex denominator = d11 * d22 - Complex(1.0);
      const Complex first = x(k) / d21, second = x(k + 1) / d21;
      x(k) = (d22 * first - second) / denominator;
      x(k + 1) = (d11 * second - first) / denominator;
      k += 2;
    }
  }
  // Lᵀ x = y, backwards; Lᵀ's rows are L's columns (no conjugate: Z is symmetric).
  const auto dot = [&](int column, int m) {
    return (factors.col(column).tail(m).array() * x.tail(m).array()).sum();
  };
  for (int k = n - 1; k >= 0;) {
    const int m = n - k - 1;
    if (!pivots.pair[k]) {
      if (m > 0) x(k) -= dot(k, m);
      if (pivots.interchange[k] != k) std::swap(x(k), x(pivots.interchange[k]));
      k -= 1;
    } else {
      if (m > 0) {
        x(k) -= dot(k, m);
        x(k - 1) -= dot(k - 1, m);
      }
      if (pivots.interchange[k] != k) std::swap(x(k), x(pivots.interchange[k]));
      k -= 2;
    }
  }
}

}  // namespace

void solve_symmetric(const ComplexMatrix& factors, const SymmetricPivots& pivots, ComplexMatrix& b) {
  LOBE_CHECK(b.rows() == factors.rows(), "solve_symmetric: right-hand side has the wrong size");
  for (Eigen::Index c = 0; c < b.cols(); ++c) solve_symmetric_vector(factors, pivots, b.col(c));
}

}  // namespace lobe
