#include "cli/model_loading.hpp"

#include <fstream>
#include <sstream>

#include "geometry/model_parser.hpp"

namespace lobe::cli {

Model load_model(const std::string& path, const std::vector<std::string>& set_options) {
  std::ifstream in(path, std::ios::binary);
  if (!in) throw InputError({path, 1, 1}, "cannot open the model file");
  std::ostringstream text;
  text << in.rdbuf();
  if (in.bad()) throw InputError({path, 1, 1}, "cannot read the model file");
  std::vector<Override> overrides;
  for (std::size_t i = 0; i < set_options.size(); ++i)
    overrides.push_back(parse_override(set_options[i], static_cast<int>(i) + 1));
  return parse_model(text.str(), path, overrides);
}

}  // namespace lobe::cli
