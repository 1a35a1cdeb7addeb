#pragma once
/// An observing triangle's mirrored terms, gathered row by row before they reach the matrix.
#include <algorithm>
#include <span>
#include <vector>

#include "core/types.hpp"
#include "solver/rwg_basis.hpp"
#include "solver/system_matrix.hpp"

namespace lobe {

/// One dense row per corner of the observing triangle (the row of the RWG function free at
/// that corner), indexed by the matrix's columns. A triangle's pairs write up to nine terms
/// each; added here, where they run along a few rows in cache, and handed to the matrix as
/// three contiguous columns per observer. As a list of terms added one by one under a
/// critical section they had taken a fifth of a plate's fill (2,979 unknowns, 2 threads);
/// the columns' hand-over takes a twentieth.
class ObserverRows {
 public:
  explicit ObserverRows(Eigen::Index columns)
      : m_columns(columns), m_values(3 * static_cast<std::size_t>(columns), Complex(0.0)) {}

  /// The row of the function free at `corner`.
  Complex* row(int corner) { return m_values.data() + static_cast<std::size_t>(corner) * m_columns; }
  /// Widens the span of columns written since the last flush to take in `column`.
  void touch(int column) {
    m_first = std::min(m_first, column);
    m_last = std::max(m_last, column);
  }

  /// Adds the row of each of the observer's `pieces` to the matrix as its function's
  /// mirrored column, and clears the rows.
  void flush(std::span<const RwgPiece> pieces, SystemMatrix& matrix) {
    if (m_first > m_last) return;
    const auto count = static_cast<std::size_t>(m_last - m_first + 1);
    for (const RwgPiece& piece : pieces) {
      Complex* written = row(piece.free_corner) + m_first;
      matrix.add_mirrored_column(piece.basis, m_first, std::span(written, count));
      std::fill_n(written, count, Complex(0.0));
    }
    m_first = static_cast<int>(m_columns);
    m_last = -1;
  }

 private:
  std::size_t m_columns;
  std::vector<Complex> m_values;
  int m_first = static_cast<int>(m_columns), m_last = -1;
};

}  // namespace lobe
