#include "geometry/quantity.hpp"

#include <utility>
#include <vector>

namespace lobe {

Dimension Dimension::operator*(const Dimension& other) const {
  Dimension result;
  for (std::size_t i = 0; i < exponent.size(); ++i) result.exponent[i] = exponent[i] + other.exponent[i];
  return result;
}

Dimension Dimension::operator/(const Dimension& other) const {
  Dimension result;
  for (std::size_t i = 0; i < exponent.size(); ++i) result.exponent[i] = exponent[i] - other.exponent[i];
  return result;
}

Dimension Dimension::power(int n) const {
  Dimension result;
  for (std::size_t i = 0; i < exponent.size(); ++i) result.exponent[i] = exponent[i] * n;
  return result;
}

std::string dimension_name(const Dimension& d) {
  static const std::vector<std::pair<Dimension, const char*>> named = {
      {dimension::none, "a plain number"},
      {dimension::length, "a length"},
      {dimension::frequency, "a frequency"},
      {dimension::angle, "an angle"},
      {dimension::voltage, "a voltage"},
      {dimension::resistance, "a resistance"},
      {dimension::inductance, "an inductance"},
      {dimension::capacitance, "a capacitance"},
      {dimension::conductivity, "a conductivity"},
      {Dimension{{0, 0, 1, 0, 0}}, "a time"},
      {Dimension{{1, 0, -1, 0, 0}}, "a speed"},
      {Dimension{{2, 0, 0, 0, 0}}, "an area"},
  };
  for (const auto& [dim, name] : named)
    if (dim == d) return name;
  return "a quantity in " + unit_symbols(d);
}

std::string unit_symbols(const Dimension& d) {
  static const char* symbols[] = {"m", "kg", "s", "A", "rad"};
  std::string text;
  for (std::size_t i = 0; i < d.exponent.size(); ++i) {
    if (d.exponent[i] == 0) continue;
    if (!text.empty()) text += ' ';
    text += symbols[i];
    if (d.exponent[i] != 1) {
      text += '^';
      text += std::to_string(d.exponent[i]);
    }
  }
  return text;
}

}  // namespace lobe
