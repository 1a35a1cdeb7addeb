#include "cli/model_loading.hpp"

#include <fstream>
#include <sstream>

namespace lobe::cli {

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

Model load_model(const std::string& path, const std::vector<Override>& overrides) {
  std::ifstream in(path, std::ios::binary);
  if (!in) throw InputError({path, 1, 1}, "cannot open the model file");
  std::ostringstream text;
  text << in.rdbuf();
  if (in.bad()) throw InputError({path, 1, 1}, "cannot read the model file");
  return parse_model(text.str(), path, overrides);
}

}  // namespace lobe::cli
