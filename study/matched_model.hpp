#pragma once
/// A model written back with a designed matching network between the antenna and a port.
#include <string>

#include "geometry/model.hpp"
#include "study/match_design.hpp"

namespace lobe {

/// The model's text with `parts` (from the antenna toward the port) built as loads, lines
/// and stubs between port `port`'s place and the port, which moves to a new free point at
/// the network's far end; every overridden `let` filled in; `heading` as a comment above
/// the network. Throws InputError (at the port) for a port on a plate, which a network
/// cannot join.
std::string matched_model_text(const Model& model, std::size_t port, const std::vector<MatchPart>& parts,
                               const std::string& heading);

}  // namespace lobe
