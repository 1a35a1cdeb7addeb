#include "post/exposure_estimate.hpp"

#include <algorithm>
#include <cmath>

#include "core/constants.hpp"

namespace lobe {

std::optional<Real> icnirp_2020_general_public_w_m2(Real frequency_hz) {
  const Real mhz = frequency_hz / 1e6;
  if (mhz <= 30 || mhz > 300e3) return std::nullopt;
  if (mhz <= 400) return 2.0;
  if (mhz <= 2000) return mhz / 200;
  return 10.0;
}

std::optional<Real> us_general_population_w_m2(Real frequency_hz) {
  constexpr Real w_m2_per_mw_cm2 = 10.0;
  const Real mhz = frequency_hz / 1e6;
  if (mhz < 30 || mhz > 100e3) return std::nullopt;
  if (mhz <= 300) return 0.2 * w_m2_per_mw_cm2;
  if (mhz <= 1500) return mhz / 1500 * w_m2_per_mw_cm2;
  return 1.0 * w_m2_per_mw_cm2;
}

Real far_field_power_density_w_m2(Real eirp_w, Real distance_m) {
  return eirp_w / (4 * pi * distance_m * distance_m);
}

Real distance_under_limit_m(Real eirp_w, Real limit_w_m2) { return std::sqrt(eirp_w / (4 * pi * limit_w_m2)); }

Real far_field_start_m(Real largest_size_m, Real frequency_hz) {
  const Real wavelength = speed_of_light / frequency_hz;
  return std::max(2 * largest_size_m * largest_size_m / wavelength, wavelength);
}

std::vector<ExposureFigure> exposure_figures(Real eirp_w, Real frequency_hz) {
  std::vector<ExposureFigure> figures{{"ICNIRP 2020", icnirp_2020_general_public_w_m2(frequency_hz), std::nullopt},
                                      {"47 CFR 1.1310", us_general_population_w_m2(frequency_hz), std::nullopt}};
  for (auto& f : figures)
    if (f.limit_w_m2) f.distance_m = distance_under_limit_m(eirp_w, *f.limit_w_m2);
  return figures;
}

}  // namespace lobe
