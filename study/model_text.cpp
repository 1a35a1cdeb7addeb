#include "study/model_text.hpp"

#include <regex>
#include <sstream>

#include "geometry/model_parser.hpp"

namespace lobe {

std::string text_with_values(const Model& model,
                             const std::function<std::string(const ResolvedValue&, const std::string&)>& note) {
  std::istringstream in(model.text);
  std::ostringstream out;
  for (std::string line; std::getline(in, line);) {
    for (const ResolvedValue& v : model.values) {
      if (!v.overridden) continue;
      const std::regex let("^(\\s*let\\s+" + v.name + "\\s*=).*$");
      if (!std::regex_match(line, let)) continue;
      std::string old = line.substr(line.find('=') + 1);
      old = old.substr(std::min(old.size(), old.find_first_not_of(' ')));
      line = std::regex_replace(line, let, "$1 " + model_value_text(v, model)) + "   # " + note(v, old);
    }
    out << line << '\n';
  }
  return out.str();
}

}  // namespace lobe
