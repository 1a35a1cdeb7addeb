#pragma once
/// The parallel skeleton shared by the wire and surface fills: rows of element pairs
/// computed by threads, added to the matrix in one short critical section per row.
#include <exception>
#include <vector>

#include "core/check.hpp"
#include "core/types.hpp"

namespace lobe {

/// One term of Z: added at (row, column), and at (column, row) too when `mirror`.
struct MatrixContribution {
  int row;
  int column;
  bool mirror;
  Complex value;
};

/// Calls `row_terms(element, terms)` for every element in [0, count) in parallel (OpenMP,
/// dynamic schedule), each appending the terms of its pairs with later elements, and adds
/// them to `z`. Exceptions thrown by `row_terms` are rethrown after the parallel region.
template <class RowTerms>
void fill_by_element_rows(int count, RowTerms&& row_terms, ComplexMatrix& z) {
  std::exception_ptr failure;
#pragma omp parallel
  {
    std::vector<MatrixContribution> terms;
#pragma omp for schedule(dynamic, 4)
    for (int element = 0; element < count; ++element) {
      try {
        terms.clear();
        row_terms(element, terms);
#pragma omp critical(lobe_matrix_scatter)
        for (const MatrixContribution& c : terms) {
          LOBE_ASSERT(c.row < z.rows() && c.column < z.cols());
          z(c.row, c.column) += c.value;
          if (c.mirror) z(c.column, c.row) += c.value;
        }
      } catch (...) {
#pragma omp critical(lobe_matrix_failure)
        failure = std::current_exception();
      }
    }
  }
  if (failure) std::rethrow_exception(failure);
}

}  // namespace lobe
