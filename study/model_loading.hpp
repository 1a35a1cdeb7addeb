#pragma once
/// Reads a model file and applies command-line overrides.
#include <string>
#include <vector>

#include "geometry/model.hpp"
#include "geometry/model_parser.hpp"
#include "post/frequency_result.hpp"

namespace lobe {

/// Reads `path` and parses it with `--set` options applied. Throws InputError.
Model load_model(const std::string& path, const std::vector<std::string>& set_options);
/// The same with overrides already split (a sweep's or tune's varied names among them).
Model load_model(const std::string& path, const std::vector<Override>& overrides);

/// The band a sweep ranks or tune judges by: `band_option` (LOW:HIGH) if given, else the
/// model's first band, else all computed frequencies. Refuses one that lies wholly outside
/// the model's frequencies, where there is nothing to judge.
Band judged_band(const Model& model, const std::string& band_option);

/// The figure options of `--toward THETA,PHI` (degrees; θ from +z within 0 to 180, φ from
/// +x toward +y): the polarisation figures are then judged there instead of at the main
/// beam. Empty: at the main beam. Throws InputError at --toward.
FigureOptions figure_options(const std::string& toward_option);

/// The --set options followed by one override per varied name, located at its --vary.
std::vector<Override> overrides_with(const std::vector<std::string>& set_options,
                                     const std::vector<std::string>& varied_names,
                                     const std::vector<std::string>& values);

}  // namespace lobe
