#pragma once
/// A rational function of one real variable fitted to vector-valued samples: the AAA
/// algorithm (Nakatsukasa, Sète and Trefethen, "The AAA algorithm for rational
/// approximation", SIAM J. Sci. Comput. 40 (2018) A1494–A1522) in its set-valued form, one
/// denominator for every component (Lietaert, Meerbergen, Pérez and Vandereycken, IMA J.
/// Numer. Anal. 42 (2022) 1087–1115).
#include <vector>

#include "core/types.hpp"

namespace lobe {

class RationalInterpolant {
 public:
  /// Fits the samples values.col(i) at points[i] (distinct): support points are added
  /// greedily where the fit is worst until every sample is met to `relative_tolerance` of
  /// the largest value, or half the samples (and one) are support points, so that the
  /// weights always rest on samples they do not interpolate.
  RationalInterpolant(const std::vector<Real>& points, const ComplexMatrix& values, Real relative_tolerance);

  /// r(x) = Σ c_i(x) values.col(i): the coefficients c_i (zero off the support, summing to
  /// one). Any quantity linear in the samples is interpolated by the same combination.
  std::vector<Complex> combination(Real x) const;

  /// The fitted values at x: all of them, or the first `rows`.
  ComplexVector operator()(Real x, Eigen::Index rows = -1) const;

  std::size_t support_size() const { return m_support.size(); }

 private:
  std::vector<Real> m_points;
  ComplexMatrix m_values;
  std::vector<std::size_t> m_support;
  ComplexVector m_weights;
};

}  // namespace lobe
