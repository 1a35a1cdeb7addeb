#include "geometry/lexer.hpp"

#include <cctype>
#include <charconv>
#include <cmath>
#include <cstdio>

namespace lobe {
namespace {

bool is_identifier_start(char c) { return std::isalpha(static_cast<unsigned char>(c)) || c == '_'; }
bool is_identifier_char(char c) { return std::isalnum(static_cast<unsigned char>(c)) || c == '_'; }
bool is_digit(char c) { return std::isdigit(static_cast<unsigned char>(c)) != 0; }

std::string describe_byte(unsigned char c) {
  char buffer[64];
  std::snprintf(buffer, sizeof buffer, "unexpected byte 0x%02X (a model is plain ASCII text)", c);
  return buffer;
}

}  // namespace

std::vector<Token> tokenize_line(std::string_view line, const std::string& file, int line_number) {
  auto location = [&](std::size_t index) {
    return SourceLocation{file, line_number, static_cast<int>(index) + 1};
  };
  if (line.size() > max_line_length)
    throw InputError(location(0), "line is " + std::to_string(line.size()) +
                                      " characters long; at most " +
                                      std::to_string(max_line_length) + " are accepted");
  std::vector<Token> tokens;
  std::size_t i = 0;
  while (i < line.size()) {
    const char c = line[i];
    if (c == '#') break;
    if (c == ' ' || c == '\t' || c == '\r') {
      ++i;
      continue;
    }
    Token token;
    token.where = location(i);
    if (is_digit(c) || (c == '.' && i + 1 < line.size() && is_digit(line[i + 1]))) {
      std::size_t end = i;
      while (end < line.size() && (is_digit(line[end]) || line[end] == '.')) ++end;
      // An exponent only when 'e' is followed by digits, so "2 em" stays a number and a name.
      if (end < line.size() && (line[end] == 'e' || line[end] == 'E')) {
        std::size_t k = end + 1;
        if (k < line.size() && (line[k] == '+' || line[k] == '-')) ++k;
        if (k < line.size() && is_digit(line[k])) {
          while (k < line.size() && is_digit(line[k])) ++k;
          end = k;
        }
      }
      token.kind = TokenKind::number;
      token.text = std::string(line.substr(i, end - i));
      const auto result = std::from_chars(token.text.data(), token.text.data() + token.text.size(),
                                          token.number);
      if (result.ec == std::errc::result_out_of_range || !std::isfinite(token.number))
        throw InputError(token.where, "number '" + token.text + "' is out of range");
      if (result.ec != std::errc() || result.ptr != token.text.data() + token.text.size())
        throw InputError(token.where, "malformed number '" + token.text + "'");
      i = end;
    } else if (is_identifier_start(c)) {
      std::size_t end = i;
      while (end < line.size() && is_identifier_char(line[end])) ++end;
      token.kind = TokenKind::identifier;
      token.text = std::string(line.substr(i, end - i));
      i = end;
    } else if (std::string_view("()+-*/^=,").find(c) != std::string_view::npos) {
      token.kind = TokenKind::symbol;
      token.text = std::string(1, c);
      ++i;
    } else {
      throw InputError(token.where, describe_byte(static_cast<unsigned char>(c)));
    }
    tokens.push_back(std::move(token));
  }
  Token end_token;
  end_token.kind = TokenKind::end;
  end_token.where = location(line.size());
  tokens.push_back(end_token);
  return tokens;
}

}  // namespace lobe
