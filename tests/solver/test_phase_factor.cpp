#include <gtest/gtest.h>

#include <cmath>
#include <random>
#include <vector>

#include "solver/phase_factor.hpp"

namespace lobe {
namespace {

// The batched sine and cosine against the C library's, over the range the kernels use,
// both signs, and the quadrant boundaries. A few units in the last place: 1e-15 absolute.
TEST(PhaseFactor, AgreesWithTheLibrary) {
  constexpr unsigned seed = 20261202;
  std::mt19937_64 generator(seed);
  std::uniform_real_distribution<Real> uniform(-1e4, 1e4);
  std::vector<Real> x(100000);
  for (auto& v : x) v = uniform(generator);
  for (int k = -8; k <= 8; ++k) x.push_back(k * M_PI / 4);
  x.push_back(0.0);
  std::vector<Real> s(x.size()), c(x.size());
  sine_cosine(x.data(), s.data(), c.data(), static_cast<int>(x.size()));
  for (std::size_t i = 0; i < x.size(); ++i) {
    ASSERT_NEAR(s[i], std::sin(x[i]), 1e-15) << "x = " << x[i] << ", seed " << seed;
    ASSERT_NEAR(c[i], std::cos(x[i]), 1e-15) << "x = " << x[i] << ", seed " << seed;
  }
}

}  // namespace
}  // namespace lobe
