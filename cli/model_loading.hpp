#pragma once
/// Reads a model file and applies command-line overrides.
#include <string>
#include <vector>

#include "geometry/model.hpp"
#include "geometry/model_parser.hpp"

namespace lobe::cli {

/// Reads `path` and parses it with `--set` options applied. Throws InputError.
Model load_model(const std::string& path, const std::vector<std::string>& set_options);
/// The same with overrides already split (a sweep's or tune's varied names among them).
Model load_model(const std::string& path, const std::vector<Override>& overrides);

/// The --set options followed by one override per varied name, located at its --vary.
std::vector<Override> overrides_with(const std::vector<std::string>& set_options,
                                     const std::vector<std::string>& varied_names,
                                     const std::vector<std::string>& values);

}  // namespace lobe::cli
