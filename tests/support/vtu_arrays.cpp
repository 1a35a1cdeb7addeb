#include "support/vtu_arrays.hpp"

#include <cstdint>
#include <cstring>
#include <stdexcept>

namespace lobe::testing {
namespace {

std::string attribute(const std::string& element, const std::string& name) {
  const std::size_t at = element.find(" " + name + "=\"");
  if (at == std::string::npos) return "";
  const std::size_t start = at + name.size() + 3;
  return element.substr(start, element.find('"', start) - start);
}

template <class T>
std::vector<double> decode(const char* bytes, std::uint64_t size) {
  std::vector<double> values(size / sizeof(T));
  for (std::size_t i = 0; i < values.size(); ++i) {
    T v;
    std::memcpy(&v, bytes + i * sizeof(T), sizeof(T));
    values[i] = static_cast<double>(v);
  }
  return values;
}

}  // namespace

std::string vtu_structure(const std::string& vtu) {
  const std::size_t appended = vtu.find("<AppendedData");
  if (appended == std::string::npos) return vtu;
  return vtu.substr(0, appended) + "</VTKFile>\n";
}

std::vector<double> vtu_array(const std::string& vtu, const std::string& name) {
  const std::size_t tag = name.empty() ? vtu.find("<Points>") : vtu.find(" Name=\"" + name + "\"");
  if (tag == std::string::npos) return {};
  const std::size_t open = name.empty() ? vtu.find("<DataArray", tag) : vtu.rfind("<DataArray", tag);
  const std::string element = vtu.substr(open, vtu.find('>', open) - open);
  if (attribute(element, "format") != "appended") throw std::runtime_error("array '" + name + "' is not appended");
  const std::size_t data = vtu.find('_', vtu.find("<AppendedData encoding=\"raw\">")) + 1;
  const std::size_t at = data + std::stoull(attribute(element, "offset"));
  std::uint64_t size = 0;
  std::memcpy(&size, vtu.data() + at, sizeof size);
  if (at + sizeof size + size > vtu.size()) throw std::runtime_error("array '" + name + "' runs past the file's end");
  const char* bytes = vtu.data() + at + sizeof size;
  const std::string type = attribute(element, "type");
  if (type == "Float64") return decode<double>(bytes, size);
  if (type == "Int64") return decode<std::int64_t>(bytes, size);
  if (type == "Int32") return decode<std::int32_t>(bytes, size);
  if (type == "UInt8") return decode<std::uint8_t>(bytes, size);
  throw std::runtime_error("array '" + name + "' has type " + type);
}

}  // namespace lobe::testing
