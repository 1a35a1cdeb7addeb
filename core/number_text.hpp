#pragma once
/// Decimal text for doubles that reads back exactly.
#include <cstdio>
#include <cstdlib>
#include <string>

namespace lobe {

/// The shortest of 15, 16 or 17 significant digits that reads back to exactly `value`.
inline std::string exact_text(double value) {
  char buffer[40];
  for (int digits = 15; digits <= 17; ++digits) {
    std::snprintf(buffer, sizeof buffer, "%.*g", digits, value);
    if (std::strtod(buffer, nullptr) == value) break;
  }
  return buffer;
}

/// `value` to `digits` significant digits, or to more (up to 9) until it reads differently
/// from `limit` at `digits`: a warning never says "8 radii long; below 8".
inline std::string beside_limit(double value, double limit, int digits = 3) {
  char limit_text[40], value_text[40];
  std::snprintf(limit_text, sizeof limit_text, "%.*g", digits, limit);
  for (int d = digits; d <= 9; ++d) {
    std::snprintf(value_text, sizeof value_text, "%.*g", d, value);
    if (std::string(value_text) != limit_text) break;
  }
  return value_text;
}

}  // namespace lobe
