#include "study/case_grid.hpp"

#include "core/formatted_text.hpp"
#include "core/input_error.hpp"

namespace lobe {
namespace {

/// Every combination of the varied values (or of their labels).
std::vector<std::vector<std::string>> combinations(const std::vector<VariedName>& varied,
                                                   std::vector<std::string> VariedName::*texts) {
  std::vector<std::vector<std::string>> cases{{}};
  for (const auto& v : varied) {
    std::vector<std::vector<std::string>> next;
    for (const auto& c : cases)
      for (const auto& value : v.*texts) {
        next.push_back(c);
        next.back().push_back(value);
      }
    cases = std::move(next);
  }
  return cases;
}

}  // namespace

std::vector<std::string> CaseGrid::names() const {
  std::vector<std::string> names;
  for (const auto& v : varied) names.push_back(v.name);
  return names;
}

CaseGrid case_grid(const std::vector<std::string>& vary_options) {
  CaseGrid grid;
  for (std::size_t i = 0; i < vary_options.size(); ++i)
    grid.varied.push_back(parse_vary_option(vary_options[i], static_cast<int>(i) + 1));
  double count = 1.0;
  for (const auto& v : grid.varied) count *= static_cast<double>(v.values.size());
  if (count > max_sweep_values)
    throw InputError({"--vary", 1, 1}, "the sweep has " + formatted("%.3g", count) + " cases; at most " +
                                           std::to_string(max_sweep_values) + " are allowed");
  grid.values = combinations(grid.varied, &VariedName::values);
  grid.labels = combinations(grid.varied, &VariedName::labels);
  return grid;
}

}  // namespace lobe
