#pragma once
/// Far-field estimates of RF exposure near a transmitting antenna, against the
/// general-public reference levels for whole-body exposure of two widely used rule sets.
/// An estimate only: it ignores the near field, reflections and duty cycle, and does not
/// replace an assessment under the rules that apply where the antenna is used.
#include <optional>
#include <string>
#include <vector>

#include "core/types.hpp"

namespace lobe {

/// ICNIRP (2020), "Guidelines for limiting exposure to electromagnetic fields (100 kHz to
/// 300 GHz)", Health Phys. 118(5):483–524, Table 5 (whole body, averaged over 30 min),
/// general public, incident power density: 2 W/m² above 30 MHz up to 400 MHz, f/200 W/m²
/// (f in MHz) up to 2 GHz, 10 W/m² up to 300 GHz. None outside (30 MHz, 300 GHz].
std::optional<Real> icnirp_2020_general_public_w_m2(Real frequency_hz);

/// US rules, 47 CFR § 1.1310, Table 1 (B), general population/uncontrolled exposure,
/// averaged over 30 min: 0.2 mW/cm² from 30 to 300 MHz, f/1500 mW/cm² (f in MHz) to
/// 1500 MHz, 1 mW/cm² to 100 GHz (1 mW/cm² = 10 W/m²). None outside [30 MHz, 100 GHz].
std::optional<Real> us_general_population_w_m2(Real frequency_hz);

/// Far-field power density EIRP / (4π r²), W/m², at r metres.
Real far_field_power_density_w_m2(Real eirp_w, Real distance_m);

/// The distance beyond which EIRP / (4π r²) stays under `limit_w_m2`.
Real distance_under_limit_m(Real eirp_w, Real limit_w_m2);

/// Where the far-field formula starts to be usable for an antenna of largest size D:
/// max(2D²/λ, λ). Closer in, the estimate does not hold (it may be low or high).
Real far_field_start_m(Real largest_size_m, Real frequency_hz);

/// One rule set's limit and the distance beyond which the estimate is under it.
struct ExposureFigure {
  std::string rule;  ///< "ICNIRP 2020" or "47 CFR 1.1310"
  std::optional<Real> limit_w_m2, distance_m;  ///< none when the frequency is outside the rule's table
};

/// Both rule sets at one frequency for a given EIRP.
std::vector<ExposureFigure> exposure_figures(Real eirp_w, Real frequency_hz);

}  // namespace lobe
