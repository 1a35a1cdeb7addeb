#include "solver/pencil_of_function.hpp"

#include <Eigen/Eigenvalues>
#include <Eigen/SVD>

namespace lobe {

ExponentialFit pencil_of_function(const std::vector<Complex>& samples, Real tolerance) {
  const int n = static_cast<int>(samples.size());
  const int pencil = n / 2;  // L, between N/3 and N/2 (Hua & Sarkar's advice for noisy data)
  ComplexMatrix hankel(n - pencil, pencil + 1);
  for (int r = 0; r < n - pencil; ++r)
    for (int c = 0; c <= pencil; ++c) hankel(r, c) = samples[r + c];
  const Eigen::BDCSVD<ComplexMatrix> svd(hankel, Eigen::ComputeThinV);
  const RealVector& sigma = svd.singularValues();
  int order = 0;
  while (order < std::min<int>(pencil, sigma.size()) && sigma[order] > tolerance * sigma[0]) ++order;
  ExponentialFit fit;
  if (order == 0) return fit;
  // Each row of the Hankel matrix is a combination of the vectors (z_i^c)_c, so the
  // conjugated dominant right singular vectors W span them; shifting by one sample
  // multiplies each by z_i: W_bottom c_i = z_i W_top c_i.
  const ComplexMatrix w = svd.matrixV().leftCols(order).conjugate();
  const ComplexMatrix pencil_matrix = w.topRows(pencil).completeOrthogonalDecomposition().solve(w.bottomRows(pencil));
  const Eigen::ComplexEigenSolver<ComplexMatrix> eigen(pencil_matrix, false);
  ComplexMatrix powers(n, order);
  for (int i = 0; i < order; ++i) {
    const Complex z = eigen.eigenvalues()[i];
    Complex p = 1.0;
    for (int k = 0; k < n; ++k, p *= z) powers(k, i) = p;
    fit.ratios.push_back(z);
  }
  const ComplexVector y = Eigen::Map<const ComplexVector>(samples.data(), n);
  const ComplexVector amplitudes = powers.colPivHouseholderQr().solve(y);
  fit.amplitudes.assign(amplitudes.data(), amplitudes.data() + order);
  return fit;
}

}  // namespace lobe
