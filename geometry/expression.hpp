#pragma once
/// Dimension-checked arithmetic expressions of the model language.
#include <map>
#include <string>
#include <string_view>
#include <vector>

#include "geometry/lexer.hpp"
#include "geometry/quantity.hpp"

namespace lobe {

/// Walks the tokens of one statement.
class TokenCursor {
 public:
  explicit TokenCursor(const std::vector<Token>& tokens) : m_tokens(tokens) {}
  const Token& peek(std::size_t ahead = 0) const;
  const Token& next();
  bool at_end() const { return peek().kind == TokenKind::end; }
  bool peek_symbol(char c) const;
  bool accept_symbol(char c);
  void expect_symbol(char c, const std::string& context);
  bool peek_word(std::string_view word, std::size_t ahead = 0) const;
  bool accept_word(std::string_view word);
  void expect_word(std::string_view word, const std::string& context);
  /// Reads a name (identifier) and returns its token.
  const Token& expect_name(const std::string& what);

 private:
  const std::vector<Token>& m_tokens;
  std::size_t m_index = 0;
};

/// Named values of `let` statements and `--set` overrides.
using SymbolTable = std::map<std::string, Quantity, std::less<>>;

/// Parses and evaluates one expression. Stops before a token that cannot continue it
/// (a keyword, a comma, a closing parenthesis, the end of the line).
/// Throws InputError on dimension mismatches, unknown names and non-finite results.
Quantity parse_expression(TokenCursor& cursor, const SymbolTable& symbols);

/// Unit names usable after a number: "mm", "MHz", "ohm", "deg", ...
bool is_unit_name(std::string_view name);
/// Names that `let` may not define: units, constants and functions.
bool is_builtin_name(std::string_view name);

}  // namespace lobe
