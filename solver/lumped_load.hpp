#pragma once
/// Impedance of a lumped RLC load.
#include "geometry/model.hpp"

namespace lobe {

/// Series: R + jωL + 1/(jωC) (no capacitor when none is given). Parallel: the reciprocal
/// of the sum of the admittances of the elements given. Ohm.
Complex load_impedance(const Load& load, Real frequency_hz);

}  // namespace lobe
