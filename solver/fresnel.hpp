#pragma once
/// Reflection of plane waves from real (lossy, non-magnetic) ground below z = 0, and the
/// image of a current element it implies in the reflection-coefficient approximation.
#include "core/types.hpp"

namespace lobe {

/// Fresnel's coefficients at incidence θ from the normal (Balanis, Antenna Theory, 3rd ed.,
/// §4.8.3; Advanced Engineering Electromagnetics §5.3), in image theory's sense:
///   vertical (E in the plane of incidence):  Γv = (εg cos θ − √(εg − sin²θ)) / (εg cos θ + √(εg − sin²θ)),
///   horizontal (E across it):               Γh = (cos θ − √(εg − sin²θ)) / (cos θ + √(εg − sin²θ)),
/// so that a perfect conductor gives Γv = +1 (a vertical image current as the source) and
/// Γh = −1 (a horizontal one reversed), and grazing incidence gives −1 for both.
struct FresnelCoefficients {
  Complex vertical, horizontal;
};
FresnelCoefficients fresnel_coefficients(Complex ground_permittivity, Real cos_theta);

/// εg = εr − jσ/(ωε0) at `frequency_hz` (exp(+jωt)).
Complex ground_permittivity(Real permittivity, Real conductivity, Real frequency_hz);

/// The reflection-coefficient image seen from `observer` of a source at `source` (both
/// above the ground): the ray from the source's mirror point to the observer meets the
/// ground at incidence θ, cos θ = (z_obs + z_src)/R. The image current is `current` times
/// a source current J (the perfect ground's image −M J with its part in the plane of
/// incidence scaled by Γv and its part across it by −Γh), the image charge `charge` times
/// the source's (−Γv; −1 over a perfect conductor). Exact for the far field; near the ground
/// an approximation whose error grows as the height falls below a quarter wavelength.
struct GroundImageWeights {
  Eigen::Matrix3cd current;
  Complex charge;
};
GroundImageWeights ground_image_weights(Complex ground_permittivity, const Vec3& observer, const Vec3& source);

}  // namespace lobe
