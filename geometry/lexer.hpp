#pragma once
/// Splits one line of model text into tokens.
#include <string>
#include <string_view>
#include <vector>

#include "core/input_error.hpp"

namespace lobe {

enum class TokenKind { number, identifier, symbol, end };

/// One token; `text` is the spelling, `number` the value of a numeric literal.
struct Token {
  TokenKind kind = TokenKind::end;
  std::string text;
  double number = 0.0;
  SourceLocation where;
};

/// Longest line the reader accepts; longer lines are almost surely not a model.
constexpr std::size_t max_line_length = 65536;

/// Tokenizes `line` (without its newline); comments (`#` to end of line) are dropped.
/// The result always ends with a TokenKind::end token. Throws InputError on bytes that
/// cannot start a token.
std::vector<Token> tokenize_line(std::string_view line, const std::string& file, int line_number);

}  // namespace lobe
