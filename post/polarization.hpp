#pragma once
/// Circular components and axial ratio of a far-field sample (IEEE Std 145 hands).
#include "core/types.hpp"

namespace lobe {

/// Largest axial ratio reported: a linearly polarised (or absent) field has an infinite
/// one, and a finite cap keeps every output readable.
constexpr Real axial_ratio_ceiling_db = 99.0;

enum class Hand { right = 1, left = -1, linear = 0 };

/// Right- and left-hand circular components. With exp(+jωt) and (θ̂, φ̂, r̂) right-handed,
/// θ̂ − jφ̂ rotates from θ̂ toward φ̂, counter-clockwise about the direction of travel
/// r̂: right-hand circular per IEEE Std 145. Hence E_R = (E_θ + jE_φ)/√2 and
/// E_L = (E_θ − jE_φ)/√2, and |E_R|² + |E_L|² = |E_θ|² + |E_φ|².
struct CircularComponents {
  Complex right;
  Complex left;
};

CircularComponents circular_components(Complex e_theta, Complex e_phi);

/// (|E_R| + |E_L|) / ||E_R| − |E_L||, in dB, at most axial_ratio_ceiling_db.
Real axial_ratio_db(const CircularComponents& c);

/// Above this axial ratio a field counts as linearly polarised: the circular components
/// then differ by under 1 % (common practice treats 40 dB as linear for any antenna).
constexpr Real linear_axial_ratio_db = 40.0;

/// The sense of rotation: the larger circular component wins; an axial ratio above
/// linear_axial_ratio_db is linear.
Hand polarization_hand(const CircularComponents& c);

const char* hand_name(Hand hand);

}  // namespace lobe
