// The far-field exposure estimate: the tabulated general-public limits and hand
// calculations of the distance at a stated EIRP.
#include <gtest/gtest.h>

#include "post/exposure_estimate.hpp"

namespace lobe {
namespace {

// ICNIRP (2020), Health Phys. 118(5):483-524, Table 5, general public, whole body,
// incident power density: 2 W/m^2 (>30-400 MHz), f_M/200 W/m^2 (>400 MHz-2 GHz),
// 10 W/m^2 (>2-300 GHz). The primary text could not be consulted while writing this test:
// the values are from memory, agreeing with a secondary listing of the same table.
TEST(ExposureEstimate, IcnirpGeneralPublicWholeBodyLevels) {
  EXPECT_FALSE(icnirp_2020_general_public_w_m2(30e6).has_value());
  EXPECT_DOUBLE_EQ(*icnirp_2020_general_public_w_m2(145e6), 2.0);
  EXPECT_DOUBLE_EQ(*icnirp_2020_general_public_w_m2(400e6), 2.0);
  EXPECT_DOUBLE_EQ(*icnirp_2020_general_public_w_m2(433.92e6), 433.92 / 200);
  EXPECT_DOUBLE_EQ(*icnirp_2020_general_public_w_m2(900e6), 4.5);
  EXPECT_DOUBLE_EQ(*icnirp_2020_general_public_w_m2(2e9), 10.0);
  EXPECT_DOUBLE_EQ(*icnirp_2020_general_public_w_m2(5.8e9), 10.0);
  EXPECT_FALSE(icnirp_2020_general_public_w_m2(301e9).has_value());
}

// 47 CFR § 1.1310, Table 1 (B), general population/uncontrolled exposure: 0.2 mW/cm^2
// (30-300 MHz), f/1500 mW/cm^2 (300-1500 MHz), 1.0 mW/cm^2 (1500-100,000 MHz); 1 mW/cm^2 is
// 10 W/m^2.
TEST(ExposureEstimate, UsGeneralPopulationLevels) {
  EXPECT_FALSE(us_general_population_w_m2(29e6).has_value());
  EXPECT_DOUBLE_EQ(*us_general_population_w_m2(145e6), 2.0);
  EXPECT_DOUBLE_EQ(*us_general_population_w_m2(300e6), 2.0);
  EXPECT_DOUBLE_EQ(*us_general_population_w_m2(900e6), 6.0);
  EXPECT_DOUBLE_EQ(*us_general_population_w_m2(1500e6), 10.0);
  EXPECT_DOUBLE_EQ(*us_general_population_w_m2(5.8e9), 10.0);
  EXPECT_FALSE(us_general_population_w_m2(101e9).has_value());
}

// By hand, for a stated EIRP of 10 W: S(1 m) = 10 / (4 pi) = 0.7958 W/m^2, and the distance
// where S falls to a limit L is r = sqrt(10 / (4 pi L)):
//   145 MHz, both rules L = 2:      r = sqrt(10 / 25.133) = 0.6308 m
//   900 MHz, ICNIRP L = 4.5:        r = sqrt(10 / 56.549) = 0.4205 m
//   900 MHz, US rules L = 6:        r = sqrt(10 / 75.398) = 0.3642 m
//   5.8 GHz, both rules L = 10:     r = sqrt(10 / 125.66) = 0.2821 m
TEST(ExposureEstimate, DistancesMatchAHandCalculationAtTenWattsEirp) {
  EXPECT_NEAR(far_field_power_density_w_m2(10.0, 1.0), 0.7958, 1e-4);
  const auto vhf = exposure_figures(10.0, 145e6);
  EXPECT_NEAR(*vhf[0].distance_m, 0.6308, 1e-4);
  EXPECT_NEAR(*vhf[1].distance_m, 0.6308, 1e-4);
  const auto uhf = exposure_figures(10.0, 900e6);
  EXPECT_EQ(uhf[0].rule, "ICNIRP 2020");
  EXPECT_NEAR(*uhf[0].distance_m, 0.4205, 1e-4);
  EXPECT_EQ(uhf[1].rule, "47 CFR 1.1310");
  EXPECT_NEAR(*uhf[1].distance_m, 0.3642, 1e-4);
  const auto fpv = exposure_figures(10.0, 5.8e9);
  EXPECT_NEAR(*fpv[0].distance_m, 0.2821, 1e-4);
  EXPECT_NEAR(*fpv[1].distance_m, 0.2821, 1e-4);
  // At that distance the density is the limit itself.
  EXPECT_NEAR(far_field_power_density_w_m2(10.0, *uhf[1].distance_m), 6.0, 1e-12);
}

// The far field of an antenna of size D starts near max(2 D^2 / lambda, lambda): a 0.45 m
// antenna at 434 MHz (lambda = 0.6908 m) gives max(0.586, 0.691) = 0.691 m; a 1 m one
// gives 2 / 0.6908 = 2.895 m.
TEST(ExposureEstimate, FarFieldStart) {
  EXPECT_NEAR(far_field_start_m(0.45, 434e6), 0.6908, 1e-4);
  EXPECT_NEAR(far_field_start_m(1.0, 434e6), 2.8953, 1e-4);
}

}  // namespace
}  // namespace lobe
