#pragma once
/// Model text written back for the user: the source with every overridden `let` filled in.
#include <functional>
#include <string>

#include "geometry/model.hpp"

namespace lobe {

/// The model's text with every overridden `let` set to the value the model was solved
/// with, in the model's own units, and `note(value, old)` appended as a comment ("tuned by
/// lobe (was: ...)"), so that the file reproduces the solved model on its own.
std::string text_with_values(const Model& model,
                             const std::function<std::string(const ResolvedValue&, const std::string&)>& note);

}  // namespace lobe
