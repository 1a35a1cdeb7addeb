#include "study/matched_model.hpp"

#include <sstream>

#include "core/constants.hpp"
#include "core/formatted_text.hpp"
#include "core/input_error.hpp"
#include "study/model_text.hpp"

namespace lobe {
namespace {

/// A prefix for the network's names that the model's text does not use yet.
std::string unused_prefix(const std::string& text) {
  for (int n = 1;; ++n) {
    const std::string prefix = n == 1 ? "match" : "match" + std::to_string(n);
    if (text.find(prefix + "_") == std::string::npos) return prefix;
  }
}

std::string values_text(const MatchPart& p) {
  switch (p.kind) {
    case MatchPartKind::series_inductor:
    case MatchPartKind::shunt_inductor: return formatted("inductance %.6g nH", p.value * 1e9);
    case MatchPartKind::series_capacitor:
    case MatchPartKind::shunt_capacitor: return formatted("capacitance %.6g pF", p.value * 1e12);
    case MatchPartKind::line:
    case MatchPartKind::open_stub:
    case MatchPartKind::shorted_stub:
      return formatted("impedance %.6g ohm length %.6g mm velocity %.6g", p.impedance, p.value * 1e3, p.velocity_factor) +
             (p.kind == MatchPartKind::open_stub ? " open" : p.kind == MatchPartKind::shorted_stub ? " short" : "");
  }
  return "";
}

}  // namespace

std::string matched_model_text(const Model& model, std::size_t port_index, const std::vector<MatchPart>& parts,
                               const std::string& heading) {
  const Port& port = model.ports[port_index];
  if (port.line)
    throw InputError(port.where, "port '" + port.name + "' is on a plate; a matching network joins a port on a wire "
                                                        "or at a free point of a feed network");
  const std::string prefix = unused_prefix(model.text);
  // A place written after `from`/`to`, and after `on`/`at` for a part across it.
  const std::string antenna_place = port.node.empty() ? port.position.wire + formatted(" at %.17g", port.position.fraction)
                                                      : port.node;
  std::string place = antenna_place;
  const auto across = [&](const std::string& p) { return p == antenna_place && port.node.empty() ? "on " + p : "at " + p; };
  std::ostringstream network;
  network << "# " << heading << '\n';
  int nodes = 0;
  for (std::size_t i = 0; i < parts.size(); ++i) {
    const MatchPart& p = parts[i];
    const std::string name = prefix + "_" + std::to_string(i + 1);
    const std::string statement = p.is_lumped() ? "load" : p.kind == MatchPartKind::line ? "line" : "stub";
    if (p.is_series()) {
      const std::string next = prefix + "_point" + std::to_string(++nodes);
      network << statement << ' ' << name << " from " << place << " to " << next << ' ' << values_text(p) << '\n';
      place = next;
    } else {
      network << statement << ' ' << name << ' ' << across(place) << ' ' << values_text(p) << '\n';
    }
  }
  std::string port_statement = "port " + port.name + " " + (place == antenna_place ? across(place) : "at " + place);
  if (std::abs(port.voltage) != 1.0) port_statement += formatted(" voltage %.17g V", std::abs(port.voltage));
  if (std::arg(port.voltage) != 0.0) port_statement += formatted(" phase %.17g deg", std::arg(port.voltage) * 180 / pi);
  network << port_statement << '\n';

  const std::string with_values = text_with_values(model, [](const ResolvedValue&, const std::string& old) {
    return "set by --set in the matched run (was: " + old + ")";
  });
  std::istringstream in(with_values);
  std::ostringstream out;
  int line = 0;
  for (std::string text; std::getline(in, text);) {
    if (++line == port.where.line) out << "# " << text << "   (moved behind the matching network below)\n" << network.str();
    else out << text << '\n';
  }
  return out.str();
}

}  // namespace lobe
