#include "geometry/expression.hpp"

#include <cmath>

#include "core/constants.hpp"

namespace lobe {
namespace {

struct UnitDefinition {
  std::string_view name;
  Real scale;
  Dimension dim;
};

constexpr Real degree = pi / 180.0;

const std::vector<UnitDefinition>& unit_table() {
  using namespace dimension;
  static const std::vector<UnitDefinition> units = {
      {"Hz", 1.0, frequency},        {"kHz", 1e3, frequency},      {"MHz", 1e6, frequency},
      {"GHz", 1e9, frequency},       {"m", 1.0, length},           {"cm", 1e-2, length},
      {"mm", 1e-3, length},          {"um", 1e-6, length},         {"in", 0.0254, length},
      {"mil", 25.4e-6, length},      {"ohm", 1.0, resistance},     {"V", 1.0, voltage},
      {"A", 1.0, Dimension{{0, 0, 0, 1, 0}}},                      {"deg", degree, angle},
      {"rad", 1.0, angle},           {"H", 1.0, inductance},       {"uH", 1e-6, inductance},
      {"nH", 1e-9, inductance},      {"F", 1.0, capacitance},      {"nF", 1e-9, capacitance},
      {"pF", 1e-12, capacitance},    {"S", 1.0, conductivity * length},
  };
  return units;
}

const UnitDefinition* find_unit(std::string_view name) {
  for (const auto& unit : unit_table())
    if (unit.name == name) return &unit;
  return nullptr;
}

const std::map<std::string, Quantity, std::less<>>& constant_table() {
  static const std::map<std::string, Quantity, std::less<>> constants = {
      {"pi", {pi, dimension::none}},
      {"c0", {speed_of_light, Dimension{{1, 0, -1, 0, 0}}}},
      {"eps0", {eps0, dimension::capacitance / dimension::length}},
      {"mu0", {mu0, dimension::inductance / dimension::length}},
      {"eta0", {eta0, dimension::resistance}},
  };
  return constants;
}

const std::vector<std::string_view>& function_names() {
  static const std::vector<std::string_view> names = {"sqrt", "sin", "cos", "tan", "atan2",
                                                      "exp",  "log", "abs", "min", "max"};
  return names;
}

/// Nesting deeper than this is refused rather than risking the stack.
constexpr int max_nesting = 200;

/// Largest power of a base unit any intermediate value may carry.
constexpr int max_unit_exponent = 64;

class Evaluator {
 public:
  Evaluator(TokenCursor& cursor, const SymbolTable& symbols) : m_cursor(cursor), m_symbols(symbols) {}

  Quantity sum() {
    Guard guard(*this);
    Quantity left = product();
    while (m_cursor.peek_symbol('+') || m_cursor.peek_symbol('-')) {
      const Token op = m_cursor.next();
      const Quantity right = product();
      require_same(left, right, op, op.text == "+" ? "add" : "subtract");
      left.value = op.text == "+" ? left.value + right.value : left.value - right.value;
      finite(left, op);
    }
    return left;
  }

 private:
  struct Guard {
    explicit Guard(Evaluator& e) : evaluator(e) {
      if (++evaluator.m_depth > max_nesting)
        throw InputError(evaluator.m_cursor.peek().where,
                         "expression is nested more than " + std::to_string(max_nesting) + " deep");
    }
    ~Guard() { --evaluator.m_depth; }
    Evaluator& evaluator;
  };

  Quantity product() {
    Quantity left = unary();
    while (m_cursor.peek_symbol('*') || m_cursor.peek_symbol('/')) {
      const Token op = m_cursor.next();
      const Quantity right = unary();
      if (op.text == "*") {
        left = {left.value * right.value, left.dim * right.dim};
      } else {
        if (right.value == 0.0) throw InputError(op.where, "division by zero");
        left = {left.value / right.value, left.dim / right.dim};
      }
      finite(left, op);
    }
    return left;
  }

  Quantity unary() {
    Guard guard(*this);
    if (m_cursor.peek_symbol('-')) {
      m_cursor.next();
      Quantity q = unary();
      q.value = -q.value;
      return q;
    }
    if (m_cursor.peek_symbol('+')) {
      m_cursor.next();
      return unary();
    }
    return power();
  }

  Quantity power() {
    Quantity base = with_unit(primary());
    if (!m_cursor.peek_symbol('^')) return base;
    const Token op = m_cursor.next();
    const Token& exponent_token = m_cursor.peek();
    const Quantity exponent = unary();
    if (!exponent.dim.is_none())
      throw InputError(exponent_token.where, "an exponent must be a plain number, not " +
                                                 dimension_name(exponent.dim));
    Quantity result;
    if (base.dim.is_none()) {
      result = {std::pow(base.value, exponent.value), dimension::none};
    } else {
      const Real rounded = std::round(exponent.value);
      if (rounded != exponent.value || std::abs(rounded) > 12)
        throw InputError(exponent_token.where,
                         "a quantity with a unit can only be raised to a whole power from -12 to 12");
      result = {std::pow(base.value, rounded), base.dim.power(static_cast<int>(rounded))};
    }
    finite(result, op);
    return result;
  }

  /// A unit right after a value multiplies it: `10 mm`, `(a + b) MHz`, `5 S/m`.
  Quantity with_unit(Quantity q) {
    const Token& token = m_cursor.peek();
    if (token.kind != TokenKind::identifier) return q;
    const UnitDefinition* unit = find_unit(token.text);
    if (!unit) return q;
    m_cursor.next();
    Quantity result{q.value * unit->scale, q.dim * unit->dim};
    // A compound unit per metre: S/m (conductivity), V/m (field strength).
    const bool per_metre = m_cursor.peek_symbol('/') && m_cursor.peek(1).text == "m";
    if (token.text == "S" && !per_metre)
      throw InputError(token.where, "the unit S is only accepted as S/m (conductivity)");
    if (per_metre && (token.text == "S" || token.text == "V")) {
      m_cursor.next();
      m_cursor.next();
      result.dim = result.dim / dimension::length;
    }
    finite(result, token);
    return result;
  }

  Quantity primary() {
    const Token& token = m_cursor.peek();
    if (token.kind == TokenKind::number) {
      m_cursor.next();
      return {token.number, dimension::none};
    }
    if (token.kind == TokenKind::symbol && token.text == "(") {
      m_cursor.next();
      Quantity inner = sum();
      m_cursor.expect_symbol(')', "to close the parenthesis");
      return inner;
    }
    if (token.kind == TokenKind::identifier) {
      const Token name = m_cursor.next();
      if (m_cursor.peek_symbol('(')) return call(name);
      if (auto it = m_symbols.find(name.text); it != m_symbols.end()) return it->second;
      if (auto it = constant_table().find(name.text); it != constant_table().end()) return it->second;
      if (find_unit(name.text))
        throw InputError(name.where, "unit '" + name.text + "' must follow a number, as in 2 " + name.text);
      throw InputError(name.where, "unknown name '" + name.text + "'");
    }
    if (token.kind == TokenKind::end) throw InputError(token.where, "expected a value at the end of the line");
    throw InputError(token.where, "expected a value, found '" + token.text + "'");
  }

  Quantity call(const Token& name) {
    m_cursor.expect_symbol('(', "after the function name");
    std::vector<Quantity> args;
    std::vector<Token> arg_tokens;
    if (!m_cursor.peek_symbol(')')) {
      do {
        arg_tokens.push_back(m_cursor.peek());
        args.push_back(sum());
      } while (m_cursor.accept_symbol(','));
    }
    m_cursor.expect_symbol(')', "to close the argument list of " + name.text);
    const std::string& f = name.text;
    auto want_args = [&](std::size_t n) {
      if (args.size() != n)
        throw InputError(name.where, f + " takes " + std::to_string(n) + " argument" +
                                         (n == 1 ? "" : "s") + ", got " + std::to_string(args.size()));
    };
    auto want_plain = [&](std::size_t i) {
      if (!args[i].dim.is_none())
        throw InputError(arg_tokens[i].where, f + " needs a plain number, not " + dimension_name(args[i].dim));
    };
    Quantity result;
    if (f == "sqrt") {
      want_args(1);
      for (int e : args[0].dim.exponent)
        if (e % 2 != 0)
          throw InputError(arg_tokens[0].where, "sqrt of " + dimension_name(args[0].dim) + " has no unit");
      if (args[0].value < 0) throw InputError(arg_tokens[0].where, "sqrt of a negative value");
      Dimension half;
      for (std::size_t i = 0; i < half.exponent.size(); ++i) half.exponent[i] = args[0].dim.exponent[i] / 2;
      result = {std::sqrt(args[0].value), half};
    } else if (f == "sin" || f == "cos" || f == "tan") {
      want_args(1);
      if (args[0].dim != dimension::angle)
        throw InputError(arg_tokens[0].where,
                         f + " needs an angle, such as 30 deg or 0.5 rad; got " + dimension_name(args[0].dim));
      const Real x = args[0].value;
      result = {f == "sin" ? std::sin(x) : f == "cos" ? std::cos(x) : std::tan(x), dimension::none};
    } else if (f == "atan2") {
      want_args(2);
      if (args[0].dim != args[1].dim)
        throw InputError(arg_tokens[1].where, "atan2 needs two values of the same kind; got " +
                                                  dimension_name(args[0].dim) + " and " + dimension_name(args[1].dim));
      result = {std::atan2(args[0].value, args[1].value), dimension::angle};
    } else if (f == "exp" || f == "log") {
      want_args(1);
      want_plain(0);
      if (f == "log" && args[0].value <= 0) throw InputError(arg_tokens[0].where, "log of a value that is not positive");
      result = {f == "exp" ? std::exp(args[0].value) : std::log(args[0].value), dimension::none};
    } else if (f == "abs") {
      want_args(1);
      result = {std::abs(args[0].value), args[0].dim};
    } else if (f == "min" || f == "max") {
      if (args.empty()) throw InputError(name.where, f + " needs at least one argument");
      result = args[0];
      for (std::size_t i = 1; i < args.size(); ++i) {
        if (args[i].dim != result.dim)
          throw InputError(arg_tokens[i].where, f + " cannot compare " + dimension_name(result.dim) +
                                                    " with " + dimension_name(args[i].dim));
        result.value = f == "min" ? std::min(result.value, args[i].value) : std::max(result.value, args[i].value);
      }
    } else {
      throw InputError(name.where, "unknown function '" + f + "'");
    }
    finite(result, name);
    return result;
  }

  /// Sums need one dimension. A bare number is read in the model's units only where a
  /// length is expected as a whole, never inside arithmetic, so the message says how to
  /// write it.
  static void require_same(const Quantity& a, const Quantity& b, const Token& op, const char* verb) {
    if (a.dim == b.dim) return;
    std::string message = std::string("cannot ") + verb + " " + dimension_name(a.dim) + " and " + dimension_name(b.dim);
    if (a.dim.is_none() || b.dim.is_none())
      message += ": inside arithmetic a bare number has no unit; give it one where it is written (0.6 mm) or where "
                 "it is defined (let s = 0.6 mm)";
    throw InputError(op.where, message);
  }

  /// Checked after every operation: a finite value, and unit exponents small enough that
  /// the next operation cannot overflow them (repeated powers once wrapped m^(12^9) round to
  /// a plain number).
  static void finite(const Quantity& q, const Token& at) {
    if (!std::isfinite(q.value)) throw InputError(at.where, "the value is not finite (overflow or undefined)");
    for (int e : q.dim.exponent)
      if (std::abs(e) > max_unit_exponent)
        throw InputError(at.where, "a unit is raised beyond the " + std::to_string(max_unit_exponent) +
                                       "th power; no quantity in a model needs that");
  }

  TokenCursor& m_cursor;
  const SymbolTable& m_symbols;
  int m_depth = 0;
};

}  // namespace

const Token& TokenCursor::peek(std::size_t ahead) const {
  const std::size_t index = std::min(m_index + ahead, m_tokens.size() - 1);
  return m_tokens[index];
}

const Token& TokenCursor::next() {
  const Token& token = m_tokens[m_index];
  if (m_index + 1 < m_tokens.size()) ++m_index;
  return token;
}

bool TokenCursor::peek_symbol(char c) const {
  const Token& t = peek();
  return t.kind == TokenKind::symbol && t.text[0] == c;
}

bool TokenCursor::accept_symbol(char c) {
  if (!peek_symbol(c)) return false;
  next();
  return true;
}

void TokenCursor::expect_symbol(char c, const std::string& context) {
  if (accept_symbol(c)) return;
  const Token& t = peek();
  const std::string found = t.kind == TokenKind::end ? "the end of the line" : "'" + t.text + "'";
  throw InputError(t.where, std::string("expected '") + c + "' " + context + ", found " + found);
}

bool TokenCursor::peek_word(std::string_view word, std::size_t ahead) const {
  const Token& t = peek(ahead);
  return t.kind == TokenKind::identifier && t.text == word;
}

bool TokenCursor::accept_word(std::string_view word) {
  if (!peek_word(word)) return false;
  next();
  return true;
}

void TokenCursor::expect_word(std::string_view word, const std::string& context) {
  if (accept_word(word)) return;
  const Token& t = peek();
  const std::string found = t.kind == TokenKind::end ? "the end of the line" : "'" + t.text + "'";
  throw InputError(t.where, "expected '" + std::string(word) + "' " + context + ", found " + found);
}

const Token& TokenCursor::expect_name(const std::string& what) {
  const Token& t = peek();
  if (t.kind != TokenKind::identifier) {
    const std::string found = t.kind == TokenKind::end ? "the end of the line" : "'" + t.text + "'";
    throw InputError(t.where, "expected " + what + ", found " + found);
  }
  return next();
}

Quantity parse_expression(TokenCursor& cursor, const SymbolTable& symbols) {
  Evaluator evaluator(cursor, symbols);
  return evaluator.sum();
}

bool is_unit_name(std::string_view name) { return find_unit(name) != nullptr; }

bool is_builtin_name(std::string_view name) {
  if (is_unit_name(name) || constant_table().count(name)) return true;
  for (auto f : function_names())
    if (f == name) return true;
  return false;
}

}  // namespace lobe
