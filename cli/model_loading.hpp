#pragma once
/// Reads a model file and applies command-line overrides.
#include <string>
#include <vector>

#include "geometry/model.hpp"

namespace lobe::cli {

/// Reads `path` and parses it with `--set` options applied. Throws InputError.
Model load_model(const std::string& path, const std::vector<std::string>& set_options);

}  // namespace lobe::cli
