#pragma once
/// Whether a text is well-formed XML, judged by a general-purpose XML parser (Expat).
#include <string>

namespace lobe::testing {

/// Empty when `text` is well-formed XML; otherwise the parser's message with its line.
std::string xml_error(const std::string& text);

}  // namespace lobe::testing
