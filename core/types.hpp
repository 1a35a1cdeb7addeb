#pragma once
/// Scalar and small-vector aliases used throughout lobe. SI units everywhere inside.
#include <complex>
#include <Eigen/Dense>

namespace lobe {

using Real = double;
using Complex = std::complex<double>;
using Vec3 = Eigen::Vector3d;
using Affine = Eigen::Affine3d;
using ComplexVector = Eigen::VectorXcd;
using ComplexMatrix = Eigen::MatrixXcd;
using RealVector = Eigen::VectorXd;

}  // namespace lobe
