#pragma once
/// Errors caused by the user's input, carrying where in the input they were found.
#include <stdexcept>
#include <string>

namespace lobe {

/// A position in an input text; line and column are 1-based.
struct SourceLocation {
  std::string file;
  int line = 1;
  int column = 1;
};

/// Bad user input. Caught only in cli/, printed as `FILE:LINE:COL: message`, exit code 2.
class InputError : public std::runtime_error {
 public:
  InputError(SourceLocation where, const std::string& message)
      : std::runtime_error(message), m_where(std::move(where)) {}
  const SourceLocation& where() const { return m_where; }
  /// The one-line form shown to the user.
  std::string formatted() const {
    return m_where.file + ":" + std::to_string(m_where.line) + ":" +
           std::to_string(m_where.column) + ": " + what();
  }

 private:
  SourceLocation m_where;
};

}  // namespace lobe
