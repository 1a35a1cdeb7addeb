#include "study/rational_interpolant.hpp"

#include <Eigen/SVD>

#include <algorithm>

#include "core/check.hpp"

namespace lobe {

RationalInterpolant::RationalInterpolant(const std::vector<Real>& points, const ComplexMatrix& values,
                                         Real relative_tolerance)
    : m_points(points), m_values(values) {
  const std::size_t m = points.size();
  LOBE_CHECK(m >= 1 && static_cast<std::size_t>(values.cols()) == m, "rational fit: one column of values per point");
  const Eigen::Index components = values.rows();
  const Real scale = values.cwiseAbs().maxCoeff();
  const std::size_t most_support = m / 2 + 1;
  // The fit so far at every sample; before the first support point, the mean.
  ComplexMatrix fit = values.rowwise().mean().replicate(1, static_cast<Eigen::Index>(m));
  std::vector<bool> is_support(m, false);
  for (;;) {
    // The sample fitted worst joins the support.
    Real worst = -1.0;
    std::size_t next = 0;
    for (std::size_t i = 0; i < m; ++i) {
      if (is_support[i]) continue;
      const Real error = (values.col(static_cast<Eigen::Index>(i)) - fit.col(static_cast<Eigen::Index>(i))).cwiseAbs().maxCoeff();
      if (error > worst) worst = error, next = i;
    }
    if (worst < 0.0 || (!m_support.empty() && worst <= relative_tolerance * scale) || m_support.size() >= most_support)
      break;
    m_support.push_back(next);
    is_support[next] = true;
    std::vector<std::size_t> tests;
    for (std::size_t i = 0; i < m; ++i)
      if (!is_support[i]) tests.push_back(i);
    const auto s = static_cast<Eigen::Index>(m_support.size());
    if (tests.empty()) {
      m_weights = ComplexVector::Ones(s);
      break;
    }
    // Loewner matrix: for each component and test point x_t, the row
    // (F_t − F_j)/(x_t − x_j) over the support j; its smallest right singular vector is
    // the weights (least squares over the samples not interpolated).
    const auto t_count = static_cast<Eigen::Index>(tests.size());
    ComplexMatrix cauchy(t_count, s);
    for (Eigen::Index t = 0; t < t_count; ++t)
      for (Eigen::Index j = 0; j < s; ++j) cauchy(t, j) = 1.0 / (points[tests[t]] - points[m_support[j]]);
    ComplexMatrix loewner(components * t_count, s);
    for (Eigen::Index c = 0; c < components; ++c)
      for (Eigen::Index t = 0; t < t_count; ++t)
        for (Eigen::Index j = 0; j < s; ++j)
          loewner(c * t_count + t, j) =
              cauchy(t, j) * (values(c, static_cast<Eigen::Index>(tests[t])) - values(c, static_cast<Eigen::Index>(m_support[j])));
    Eigen::BDCSVD<ComplexMatrix> svd(loewner, Eigen::ComputeFullV);
    m_weights = svd.matrixV().col(s - 1);
    for (std::size_t i = 0; i < m; ++i) fit.col(static_cast<Eigen::Index>(i)) = (*this)(points[i]);
  }
}

std::vector<Complex> RationalInterpolant::combination(Real x) const {
  std::vector<Complex> c(m_points.size(), 0.0);
  for (std::size_t j = 0; j < m_support.size(); ++j)
    if (x == m_points[m_support[j]]) {
      c[m_support[j]] = 1.0;
      return c;
    }
  Complex denominator = 0.0;
  for (std::size_t j = 0; j < m_support.size(); ++j) {
    const Complex term = m_weights(static_cast<Eigen::Index>(j)) / (x - m_points[m_support[j]]);
    c[m_support[j]] = term;
    denominator += term;
  }
  for (std::size_t j = 0; j < m_support.size(); ++j) c[m_support[j]] /= denominator;
  return c;
}

ComplexVector RationalInterpolant::operator()(Real x, Eigen::Index rows) const {
  if (rows < 0) rows = m_values.rows();
  const std::vector<Complex> c = combination(x);
  ComplexVector r = ComplexVector::Zero(rows);
  for (std::size_t i = 0; i < c.size(); ++i)
    if (c[i] != 0.0) r += c[i] * m_values.col(static_cast<Eigen::Index>(i)).head(rows);
  return r;
}

}  // namespace lobe
