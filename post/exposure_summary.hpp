#pragma once
/// The far-field exposure estimate printed by a run given the transmitter's power.
#include <string>

#include "post/run_record.hpp"

namespace lobe {

/// The largest size of the antenna, for where its far field starts: the diagonal of the
/// box around every segment end and triangle corner (and their images under a ground).
Real antenna_largest_size_m(const AntennaProblem& problem);

/// Per band (or over all computed frequencies when the model has none): for each rule set,
/// the distance beyond which P·G/(4πr²) falls under its general-public limit, at the
/// frequency where that distance is largest, with EIRP = forward power × driven ports ×
/// peak gain; flags distances inside the antenna's near field; then the cautions.
std::string exposure_text(const RunRecord& run, Real forward_w);

}  // namespace lobe
