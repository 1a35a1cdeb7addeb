#pragma once
/// Physical and mathematical constants (SI, CODATA 2018 values).
#include "core/types.hpp"

namespace lobe {

constexpr Real pi = 3.14159265358979323846;
constexpr Real speed_of_light = 299792458.0;          ///< c0, m/s (exact)
constexpr Real mu0 = 1.25663706212e-6;                 ///< vacuum permeability, H/m
constexpr Real eps0 = 1.0 / (mu0 * speed_of_light * speed_of_light);  ///< F/m
constexpr Real eta0 = mu0 * speed_of_light;            ///< free-space impedance, ohm
constexpr Complex j_unit{0.0, 1.0};

}  // namespace lobe
