#include "study/model_loading.hpp"

#include <algorithm>
#include <cmath>
#include <stdexcept>

#include "core/constants.hpp"
#include "core/input_error.hpp"
#include "core/number_text.hpp"
#include "core/text_file.hpp"
#include "post/band_report.hpp"

namespace lobe {

Model load_model(const std::string& path, const std::vector<std::string>& set_options) {
  return load_model(path, overrides_with(set_options, {}, {}));
}

std::vector<Override> overrides_with(const std::vector<std::string>& set_options,
                                     const std::vector<std::string>& varied_names,
                                     const std::vector<std::string>& values) {
  std::vector<Override> overrides;
  for (std::size_t i = 0; i < set_options.size(); ++i)
    overrides.push_back(parse_override(set_options[i], static_cast<int>(i) + 1));
  for (std::size_t v = 0; v < varied_names.size(); ++v)
    overrides.push_back({varied_names[v], values[v], {"--vary", static_cast<int>(v) + 1, static_cast<int>(varied_names[v].size()) + 2}});
  return overrides;
}

Band judged_band(const Model& model, const std::string& band_option) {
  const auto [lowest, highest] = std::minmax_element(model.frequencies_hz.begin(), model.frequencies_hz.end());
  const Band band = band_option.empty() ? default_band(model.bands, *lowest, *highest) : parse_band_option(band_option, 1);
  const SourceLocation where = band_option.empty() ? SourceLocation{model.file, 1, 1} : SourceLocation{"--band", 1, 1};
  if (band.high_hz < *lowest || band.low_hz > *highest)
    throw InputError(where, "band '" + band.name + "' lies outside the model's frequencies (" + exact_text(*lowest / 1e6) +
                                " to " + exact_text(*highest / 1e6) + " MHz); there is nothing to judge in it");
  return band;
}

FigureOptions figure_options(const std::string& toward_option) {
  if (toward_option.empty()) return {};
  const SourceLocation where{"--toward", 1, 1};
  const auto comma = toward_option.find(',');
  double theta = 0.0, phi = 0.0;
  std::size_t used_theta = 0, used_phi = 0;
  try {
    if (comma == std::string::npos) throw std::invalid_argument("no comma");
    theta = std::stod(toward_option.substr(0, comma), &used_theta);
    phi = std::stod(toward_option.substr(comma + 1), &used_phi);
  } catch (const std::exception&) {
    used_theta = 0;
  }
  if (used_theta != comma || used_phi != toward_option.size() - comma - 1 || !std::isfinite(theta) || !std::isfinite(phi))
    throw InputError(where, "'" + toward_option + "' is not a direction: give THETA,PHI in degrees, e.g. 0,0 for the zenith");
  if (theta < 0.0 || theta > 180.0)
    throw InputError(where, "theta " + exact_text(theta) + " deg lies outside 0 to 180 deg (theta is measured from +z)");
  return {Direction{theta * pi / 180.0, std::fmod(std::fmod(phi, 360.0) + 360.0, 360.0) * pi / 180.0}};
}

Model load_model(const std::string& path, const std::vector<Override>& overrides) {
  return parse_model(read_text_file(path, max_model_bytes, "the model file"), path, overrides);
}

}  // namespace lobe
