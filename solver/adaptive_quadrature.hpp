#pragma once
/// Globally adaptive Gauss–Kronrod (7–15 point) quadrature of a complex function of a real
/// variable, and Wynn's ε algorithm to sum slowly converging alternating series of such
/// integrals (the oscillating tails of Sommerfeld integrals).
#include <functional>
#include <vector>

#include "core/types.hpp"

namespace lobe {

/// ∫_a^b f(t) dt, bisecting the interval of largest error estimate until the estimated
/// error is below max(absolute, relative · |integral|) or 4,000 intervals are used.
Complex integrate_adaptive(const std::function<Complex(Real)>& f, Real a, Real b, Real relative, Real absolute = 0.0);
/// The same for two integrands sharing their points (|·| the Euclidean norm of the pair).
Eigen::Vector2cd integrate_adaptive(const std::function<Eigen::Vector2cd(Real)>& f, Real a, Real b, Real relative,
                                    Real absolute = 0.0);

/// The same for four integrands.
Eigen::Vector4cd integrate_adaptive(const std::function<Eigen::Vector4cd(Real)>& f, Real a, Real b, Real relative,
                                    Real absolute = 0.0);

/// The limit of the partial sums `partial`, accelerated by Wynn's ε algorithm (the last
/// even column's newest entry).
Complex wynn_epsilon_limit(const std::vector<Complex>& partial);

}  // namespace lobe
