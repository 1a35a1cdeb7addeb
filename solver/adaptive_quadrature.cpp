#include "solver/adaptive_quadrature.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <queue>

namespace lobe {
namespace {

// The 15-point Kronrod extension of the 7-point Gauss rule on [−1, 1] (Piessens et al.,
// QUADPACK, 1983): nodes from the outside in, the Gauss nodes at the odd indices.
constexpr std::array<Real, 8> kronrod_nodes = {
    0.991455371120812639206854697526329, 0.949107912342758524526189684047851, 0.864864423359769072789712788640926,
    0.741531185599394439863864773280788, 0.586087235467691130294144845693013, 0.405845151377397166906606412076961,
    0.207784955007898467600689403773245, 0.0};
constexpr std::array<Real, 8> kronrod_weights = {
    0.022935322010529224963732008058970, 0.063092092629978553290700663189204, 0.104790010322250183839876322541518,
    0.140653259715525918745189590510238, 0.169004726639267902826583426598550, 0.190350578064785409913256402421014,
    0.204432940075298892414161999234649, 0.209482141084727828012999174891714};
constexpr std::array<Real, 4> gauss_weights = {0.129484966168869693270611432679082, 0.279705391489276667901467771423780,
                                               0.381830050505118944950369775488975, 0.417959183673469387755102040816327};

Real magnitude(const Complex& v) { return std::abs(v); }
Real magnitude(const Eigen::Vector2cd& v) { return v.norm(); }
Real magnitude(const Eigen::Vector4cd& v) { return v.norm(); }

template <class Value>
struct Piece {
  Real a, b;
  Value value;
  Real error;
  bool operator<(const Piece& other) const { return error < other.error; }
};

template <class Value>
Piece<Value> kronrod(const std::function<Value(Real)>& f, Real a, Real b) {
  const Real centre = 0.5 * (a + b), half = 0.5 * (b - a);
  const Value middle = f(centre);
  Value k15 = kronrod_weights[7] * middle, g7 = gauss_weights[3] * middle;
  for (int i = 0; i < 7; ++i) {
    const Value sum = f(centre - half * kronrod_nodes[i]) + f(centre + half * kronrod_nodes[i]);
    k15 += kronrod_weights[i] * sum;
    if (i % 2 == 1) g7 += gauss_weights[i / 2] * sum;
  }
  return {a, b, half * k15, magnitude(Value(half * (k15 - g7)))};
}

template <class Value>
Value integrate(const std::function<Value(Real)>& f, Real a, Real b, Real relative, Real absolute) {
  std::priority_queue<Piece<Value>> pieces;
  const Piece<Value> whole = kronrod(f, a, b);
  Value total = whole.value;
  Real error = whole.error;
  pieces.push(whole);
  for (int used = 1; used < 4000 && error > std::max(absolute, relative * magnitude(total)); ++used) {
    const Piece<Value> worst = pieces.top();
    pieces.pop();
    const Real middle = 0.5 * (worst.a + worst.b);
    const Piece<Value> left = kronrod(f, worst.a, middle), right = kronrod(f, middle, worst.b);
    total += left.value + right.value - worst.value;
    error += left.error + right.error - worst.error;
    pieces.push(left);
    pieces.push(right);
  }
  return total;
}

}  // namespace

Complex integrate_adaptive(const std::function<Complex(Real)>& f, Real a, Real b, Real relative, Real absolute) {
  return integrate(f, a, b, relative, absolute);
}

Eigen::Vector2cd integrate_adaptive(const std::function<Eigen::Vector2cd(Real)>& f, Real a, Real b, Real relative,
                                    Real absolute) {
  return integrate(f, a, b, relative, absolute);
}

Eigen::Vector4cd integrate_adaptive(const std::function<Eigen::Vector4cd(Real)>& f, Real a, Real b, Real relative,
                                    Real absolute) {
  return integrate(f, a, b, relative, absolute);
}

Complex wynn_epsilon_limit(const std::vector<Complex>& partial) {
  // ε_{-1} = 0, ε_0 = S_n; ε_{k+1}^{(n)} = ε_{k−1}^{(n+1)} + 1/(ε_k^{(n+1)} − ε_k^{(n)}).
  const int n = static_cast<int>(partial.size());
  if (n < 3) return partial.back();
  std::vector<Complex> previous(n + 1, 0.0), current(partial.begin(), partial.end());
  Complex best = partial.back();
  for (int column = 1; static_cast<int>(current.size()) > 1; ++column) {
    std::vector<Complex> next(current.size() - 1);
    for (std::size_t i = 0; i + 1 < current.size(); ++i) {
      const Complex difference = current[i + 1] - current[i];
      if (std::abs(difference) == 0.0) return column % 2 == 1 ? current[i + 1] : best;
      next[i] = previous[i + 1] + 1.0 / difference;
    }
    previous = std::move(current);
    current = std::move(next);
    if (column % 2 == 0) best = current.back();
  }
  return best;
}

}  // namespace lobe
