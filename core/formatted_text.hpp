#pragma once
/// printf-style formatting into a std::string of whatever length it needs.
#include <cstdio>
#include <string>

namespace lobe {

/// The text snprintf would produce for `format` and `args`, never truncated.
inline std::string formatted(const char* format, auto... args) {
  const int length = std::snprintf(nullptr, 0, format, args...);
  if (length <= 0) return {};
  std::string text(static_cast<std::size_t>(length) + 1, '\0');
  std::snprintf(text.data(), text.size(), format, args...);
  text.pop_back();
  return text;
}

}  // namespace lobe
