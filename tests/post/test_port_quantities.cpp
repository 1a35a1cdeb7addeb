#include <gtest/gtest.h>

#include <cmath>

#include "post/port_quantities.hpp"

namespace lobe {
namespace {

// Trade check values (common practice): VSWR 1.5 ⇔ |Γ| = 0.2 ⇔ return loss 13.98 dB ⇔
// mismatch loss 0.177 dB; VSWR 2 ⇔ |Γ| = 1/3 ⇔ return loss 9.54 dB.
TEST(PortQuantities, TradeCheckValues) {
  EXPECT_NEAR(vswr_from_reflection(0.2), 1.5, 1e-12);
  EXPECT_NEAR(return_loss_db(0.2), 13.98, 0.005);
  EXPECT_NEAR(mismatch_loss_db(0.2), 0.177, 0.0005);
  EXPECT_NEAR(vswr_from_reflection(1.0 / 3.0), 2.0, 1e-12);
  EXPECT_NEAR(return_loss_db(1.0 / 3.0), 9.54, 0.005);
  EXPECT_NEAR(reflected_power_w(4.0, 0.2), 0.16, 1e-15);  // 4 W into VSWR 1.5 reflects 0.16 W
}

TEST(PortQuantities, ReflectionOfResistiveLoads) {
  EXPECT_NEAR(std::abs(reflection_coefficient({50, 0}, 50)), 0.0, 1e-15);
  EXPECT_NEAR(reflection_coefficient({100, 0}, 50).real(), 1.0 / 3.0, 1e-15);
  EXPECT_NEAR(reflection_coefficient({25, 0}, 50).real(), -1.0 / 3.0, 1e-15);
}

TEST(PortQuantities, CeilingsKeepOutputsFinite) {
  EXPECT_EQ(vswr_from_reflection(1.0), vswr_ceiling);
  EXPECT_EQ(return_loss_db(0.0), return_loss_ceiling_db);
  EXPECT_TRUE(std::isfinite(mismatch_loss_db(1.0)));
}

// S = (Z − Z0)(Z + Z0)⁻¹: a matched, decoupled two-port has S = 0; a single port reduces to Γ.
TEST(PortQuantities, ScatteringMatrix) {
  ComplexMatrix z(2, 2);
  z << Complex(50, 0), Complex(0, 0), Complex(0, 0), Complex(50, 0);
  EXPECT_LT(scattering_matrix(z, 50).norm(), 1e-15);
  ComplexMatrix one(1, 1);
  one << Complex(75, 20);
  EXPECT_LT(std::abs(scattering_matrix(one, 50)(0, 0) - reflection_coefficient({75, 20}, 50)), 1e-15);
}

}  // namespace
}  // namespace lobe
