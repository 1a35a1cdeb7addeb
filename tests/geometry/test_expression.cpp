#include <gtest/gtest.h>

#include <cmath>

#include "core/constants.hpp"
#include "geometry/expression.hpp"

namespace lobe {
namespace {

Quantity evaluate(const std::string& text, const SymbolTable& symbols = {}) {
  const auto tokens = tokenize_line(text, "expr", 1);
  TokenCursor cursor(tokens);
  Quantity q = parse_expression(cursor, symbols);
  EXPECT_TRUE(cursor.at_end()) << text;
  return q;
}

std::string error_of(const std::string& text) {
  try {
    evaluate(text);
  } catch (const InputError& e) {
    return e.formatted();
  }
  return "";
}

TEST(Expression, ArithmeticPrecedence) {
  EXPECT_DOUBLE_EQ(evaluate("1 + 2 * 3").value, 7.0);
  EXPECT_DOUBLE_EQ(evaluate("(1 + 2) * 3").value, 9.0);
  EXPECT_DOUBLE_EQ(evaluate("-2 ^ 2").value, -4.0);
  EXPECT_DOUBLE_EQ(evaluate("2 ^ 3 ^ 2").value, 512.0);
  EXPECT_DOUBLE_EQ(evaluate("8 / 4 / 2").value, 1.0);
}

TEST(Expression, UnitsCarryDimensions) {
  const Quantity q = evaluate("10 mm + 1 cm");
  EXPECT_DOUBLE_EQ(q.value, 0.02);
  EXPECT_EQ(q.dim, dimension::length);
  EXPECT_EQ(evaluate("1575.42 MHz").dim, dimension::frequency);
  EXPECT_DOUBLE_EQ(evaluate("1575.42 MHz").value, 1575.42e6);
  EXPECT_EQ(evaluate("5.8e7 S/m").dim, dimension::conductivity);
  EXPECT_EQ(evaluate("10 nH").dim, dimension::inductance);
  EXPECT_EQ(evaluate("2 pF").dim, dimension::capacitance);
  EXPECT_EQ(evaluate("50 ohm").dim, dimension::resistance);
}

TEST(Expression, WavelengthFromSpeedOfLight) {
  const Quantity q = evaluate("c0 / (299.792458 MHz)");
  EXPECT_EQ(q.dim, dimension::length);
  EXPECT_NEAR(q.value, 1.0, 1e-15);
}

TEST(Expression, FunctionsAndAngles) {
  EXPECT_NEAR(evaluate("sin(30 deg)").value, 0.5, 1e-15);
  EXPECT_NEAR(evaluate("cos(pi rad)").value, -1.0, 1e-15);
  EXPECT_EQ(evaluate("atan2(1 mm, 1 mm)").dim, dimension::angle);
  EXPECT_NEAR(evaluate("atan2(1 mm, 1 mm)").value, pi / 4, 1e-15);
  EXPECT_EQ(evaluate("sqrt(4 mm ^ 2)").dim, dimension::length);
  EXPECT_DOUBLE_EQ(evaluate("max(1 mm, 3 mm, 2 mm)").value, 3e-3);
  EXPECT_DOUBLE_EQ(evaluate("abs(-2)").value, 2.0);
}

TEST(Expression, SymbolsAreLookedUp) {
  SymbolTable symbols{{"arm", {0.1, dimension::length}}};
  EXPECT_DOUBLE_EQ(evaluate("2 * arm", symbols).value, 0.2);
}

TEST(Expression, ErrorsNameTheProblemAndItsColumn) {
  EXPECT_EQ(error_of("1 mm + 1 MHz"), "expr:1:6: cannot add a length and a frequency");
  EXPECT_EQ(error_of("2 * nothing"), "expr:1:5: unknown name 'nothing'");
  EXPECT_EQ(error_of("1 / 0"), "expr:1:3: division by zero");
  EXPECT_NE(error_of("sin(30)").find("needs an angle"), std::string::npos);
  EXPECT_NE(error_of("sqrt(-1)").find("negative"), std::string::npos);
  EXPECT_NE(error_of("1e999").find("out of range"), std::string::npos);
  EXPECT_NE(error_of("10 ^ 400").find("not finite"), std::string::npos);
  EXPECT_NE(error_of(std::string(500, '(') + "1" + std::string(500, ')')).find("nested"), std::string::npos);
}

}  // namespace
}  // namespace lobe
