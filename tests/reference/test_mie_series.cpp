// The Mie-series reference for a perfectly conducting sphere, checked before surface
// scattering tests rely on it.
#include <gtest/gtest.h>

#include <cmath>

#include "support/mie_series.hpp"

namespace lobe::testing {
namespace {

// Mie series, Bohren & Huffman ch. 4: monostatic σ/πa² = 3.638 at ka = 1 and 1.008 at
// ka = 2 (values as quoted to three decimals; half a unit in the last place).
TEST(MieSeriesReference, MonostaticCrossSection) {
  EXPECT_NEAR(PecSphereMie(1.0).backscatter_efficiency(), 3.638, 0.0005);
  EXPECT_NEAR(PecSphereMie(2.0).backscatter_efficiency(), 1.008, 0.0005);
}

// Rayleigh limit for a small perfectly conducting sphere: σ = 9πa²(ka)⁴ (from memory); 1 %.
TEST(MieSeriesReference, RayleighLimit) {
  const double x = 0.02;
  EXPECT_NEAR(PecSphereMie(x).backscatter_efficiency(), 9 * std::pow(x, 4), 0.01 * 9 * std::pow(x, 4));
}

// Optical theorem: a lossless scatterer's extinction (forward amplitude) equals its total
// scattering; and both bistatic planes meet the monostatic value at θ = 180°.
TEST(MieSeriesReference, OpticalTheoremAndBackscatterConsistency) {
  for (double x : {0.5, 1.0, 2.0, 6.0}) {
    const PecSphereMie mie(x);
    EXPECT_NEAR(mie.extinction_efficiency(), mie.scattering_efficiency(), 1e-10 * mie.scattering_efficiency()) << x;
    EXPECT_NEAR(mie.bistatic_efficiency_e_plane(M_PI), mie.backscatter_efficiency(), 1e-10) << x;
    EXPECT_NEAR(mie.bistatic_efficiency_h_plane(M_PI), mie.backscatter_efficiency(), 1e-10) << x;
  }
}

}  // namespace
}  // namespace lobe::testing
