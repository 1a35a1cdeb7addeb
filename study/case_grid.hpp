#pragma once
/// The cases of a sweep: every combination of the varied values.
#include <string>
#include <vector>

#include "geometry/model_parser.hpp"

namespace lobe {

struct CaseGrid {
  std::vector<VariedName> varied;
  std::vector<std::vector<std::string>> values;  ///< per case, the override text of each varied name
  std::vector<std::vector<std::string>> labels;  ///< the same for people ("25 deg")

  std::size_t size() const { return values.size(); }
  std::vector<std::string> names() const;
};

/// Parses the --vary options and builds every combination, the first name varying slowest.
/// The product is counted before it is built: more than max_sweep_values cases are refused
/// (InputError at --vary) without building them.
CaseGrid case_grid(const std::vector<std::string>& vary_options);

}  // namespace lobe
