#pragma once
/// A warning about a mesh: solvable, but questionable, located at the statement it concerns.
#include <string>
#include <vector>

#include "core/input_error.hpp"

namespace lobe {

struct MeshWarning {
  SourceLocation where;
  std::string message;
  /// The one-line form shown to the user and stored with results.
  std::string formatted() const {
    return where.file + ":" + std::to_string(where.line) + ":" + std::to_string(where.column) + ": warning: " + message;
  }
};

}  // namespace lobe
