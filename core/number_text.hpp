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

}  // namespace lobe
