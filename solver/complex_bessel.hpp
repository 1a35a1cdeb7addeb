#pragma once
/// Bessel J0 and Hankel H0⁽²⁾ of complex argument, which the layered-medium kernels need on
/// deformed integration paths and for the surface waves of a lossy slab (the standard
/// library takes real arguments only).
#include "core/types.hpp"

namespace lobe {

/// J0(z) for Re z ≥ 0.
Complex bessel_j0(Complex z);

/// J_n(z) for n = 0, 1, 2 and Re z ≥ 0 (the same series and expansions).
Complex bessel_j(int order, Complex z);

/// H0⁽²⁾(z) = J0(z) − j Y0(z) for Re z > 0 (the outgoing wave for exp(+jωt)). Where it
/// decays strongly (|z| < 12 with Im z < −3) the series loses digits, about e^{2|Im z|}
/// × 1e-16: a lossy slab's surface wave has |Im z| below 1 over any antenna.
Complex hankel2_0(Complex z);

}  // namespace lobe
