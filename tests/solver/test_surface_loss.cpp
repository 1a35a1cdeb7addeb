// The surface impedance of plate metal against its textbook limits: a thick conductor's
// (1 + j) R_s with R_s = √(π f μ0/σ) (copper at 1 GHz: 8.25 mΩ, from memory), and a sheet
// far thinner than the skin depth, whose current is uniform through it: 1/(σ t), the DC
// sheet resistance.
#include <gtest/gtest.h>

#include <cmath>

#include "core/constants.hpp"
#include "solver/surface_loss.hpp"

namespace lobe {
namespace {

TEST(SheetImpedance, ReachesTheThickAndThinLimits) {
  const Real copper = 5.8e7;
  const Complex thick = sheet_impedance(copper, 0.0, 1e9);
  EXPECT_NEAR(thick.real(), 8.25e-3, 0.005 * 8.25e-3);
  EXPECT_DOUBLE_EQ(thick.imag(), thick.real());
  // 35 um is 17 skin depths at 2.4 GHz: the thick value to rounding.
  const Complex foil = sheet_impedance(copper, 35e-6, 2.4e9), thick_foil = sheet_impedance(copper, 0.0, 2.4e9);
  EXPECT_LT(std::abs(foil - thick_foil), 1e-9 * std::abs(thick_foil));
  // 10 nm at 100 MHz (skin depth 6.6 um): 1/(σt) = 1.724 Ω, with the reactance ωμ0 t/3 beside it.
  const Complex film = sheet_impedance(copper, 10e-9, 1e8);
  EXPECT_NEAR(film.real(), 1 / (copper * 10e-9), 1e-6 / (copper * 10e-9));
  EXPECT_LT(film.imag(), 1e-3 * film.real());
}

}  // namespace
}  // namespace lobe
