#include "post/touchstone.hpp"

#include <algorithm>
#include <cctype>
#include <cmath>
#include <cstdio>
#include <fstream>
#include <optional>
#include <sstream>

#include "core/constants.hpp"
#include "core/input_error.hpp"
#include "core/formatted_text.hpp"
#include "core/number_text.hpp"
#include "core/text_file.hpp"
#include "post/port_quantities.hpp"

namespace lobe {
namespace {

std::string lower(std::string text) {
  for (char& c : text) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  return text;
}

/// A number of the data section and where it stood (line and column only: a copy of the
/// file name per number once made a 92 MB file take 1.25 GB).
struct Number {
  Real value;
  int line, column;
};

/// Most ports a file may have: far beyond any antenna measurement, and small enough that
/// an extension such as .s40000p cannot demand gigabytes.
constexpr int max_ports = 64;
/// Far beyond any analyser export (a 64-port file of 1,001 points is about 150 MB; such
/// files are not antenna measurements).
constexpr std::size_t max_touchstone_bytes = 64u << 20;
/// How far above 1 a port's own reflection may lie: a passive antenna reflects at most what
/// it receives, and calibration noise stays far below this.
constexpr Real passive_tolerance = 1e-6;

enum class Parameter { s, y, z };
enum class Layout { full, lower, upper };

/// Everything the option line and the keywords say, then the numbers of the data section.
struct Parsed {
  int version = 1;
  int ports = 0;
  Real unit_hz = 1e9;
  Parameter parameter = Parameter::s;
  TouchstoneFormat format = TouchstoneFormat::magnitude_angle;
  Real reference = 50.0;
  bool two_port_21_12 = true;  ///< version 1 order: 11 21 12 22
  Layout layout = Layout::full;
  std::vector<Number> numbers;
  SourceLocation end_of_file;
  std::string file;
  SourceLocation where(const Number& n) const { return {file, n.line, n.column}; }
};

Real parse_number(const std::string& token, const SourceLocation& where) {
  char* end = nullptr;
  const Real value = std::strtod(token.c_str(), &end);
  if (end == token.c_str() || *end != '\0' || !std::isfinite(value))
    throw InputError(where, "expected a number, found '" + token + "'");
  return value;
}

/// Splits a line into whitespace-separated tokens with their columns.
std::vector<std::pair<std::string, int>> tokens_of(const std::string& line) {
  std::vector<std::pair<std::string, int>> tokens;
  std::size_t i = 0;
  while (i < line.size()) {
    while (i < line.size() && (std::isspace(static_cast<unsigned char>(line[i])) || line[i] == ',')) ++i;
    const std::size_t start = i;
    while (i < line.size() && !std::isspace(static_cast<unsigned char>(line[i])) && line[i] != ',') ++i;
    if (i > start) tokens.emplace_back(line.substr(start, i - start), static_cast<int>(start) + 1);
  }
  return tokens;
}

void read_option_line(const std::string& line, const SourceLocation& at, Parsed& p) {
  const auto tokens = tokens_of(line.substr(1));
  for (std::size_t t = 0; t < tokens.size(); ++t) {
    const std::string word = lower(tokens[t].first);
    const SourceLocation where{at.file, at.line, at.column + tokens[t].second};
    if (word == "hz") p.unit_hz = 1.0;
    else if (word == "khz") p.unit_hz = 1e3;
    else if (word == "mhz") p.unit_hz = 1e6;
    else if (word == "ghz") p.unit_hz = 1e9;
    else if (word == "s") p.parameter = Parameter::s;
    else if (word == "y") p.parameter = Parameter::y;
    else if (word == "z") p.parameter = Parameter::z;
    else if (word == "h" || word == "g") throw InputError(where, "hybrid (H, G) parameters are not supported; export S");
    else if (word == "ri") p.format = TouchstoneFormat::real_imaginary;
    else if (word == "ma") p.format = TouchstoneFormat::magnitude_angle;
    else if (word == "db") p.format = TouchstoneFormat::decibel_angle;
    else if (word == "r") {
      if (t + 1 >= tokens.size()) throw InputError(where, "'R' must be followed by the reference resistance");
      p.reference = parse_number(tokens[t + 1].first, {at.file, at.line, at.column + tokens[t + 1].second});
      if (!(p.reference > 0.0)) throw InputError(where, "the reference resistance must be above zero");
      ++t;
    } else {
      throw InputError(where, "unknown option '" + tokens[t].first + "' (expected a unit, S/Y/Z, DB/MA/RI or R)");
    }
  }
}

/// Handles one [Keyword] line of version 2; returns false when the data section ends.
bool read_keyword(const std::string& line, const SourceLocation& at, Parsed& p, bool& in_data) {
  const auto close = line.find(']');
  if (close == std::string::npos) throw InputError(at, "a keyword needs its closing ']'");
  const std::string key = lower(line.substr(1, close - 1));
  const std::string rest = line.substr(close + 1);
  const auto values = tokens_of(rest);
  const SourceLocation value_at{at.file, at.line,
                                at.column + static_cast<int>(close) + (values.empty() ? 1 : values[0].second)};
  auto first_value = [&]() {
    if (values.empty()) throw InputError(at, "[" + line.substr(1, close - 1) + "] needs a value");
    return values.front().first;
  };
  if (key == "version") {
    p.version = parse_number(first_value(), value_at) >= 2.0 ? 2 : 1;
  } else if (key == "number of ports") {
    // Checked as a number before it becomes an int: 3e9 ports once overflowed the cast.
    const Real ports = parse_number(first_value(), value_at);
    if (!(ports >= 1 && ports <= max_ports) || ports != std::floor(ports))
      throw InputError(value_at, "the number of ports must be a whole number from 1 to " + std::to_string(max_ports));
    p.ports = static_cast<int>(ports);
  } else if (key == "two-port data order") {
    const std::string order = first_value();
    if (order == "12_21") p.two_port_21_12 = false;
    else if (order == "21_12") p.two_port_21_12 = true;
    else throw InputError(value_at, "the two-port data order is 12_21 or 21_12");
  } else if (key == "matrix format") {
    const std::string layout = lower(first_value());
    if (layout == "full") p.layout = Layout::full;
    else if (layout == "lower") p.layout = Layout::lower;
    else if (layout == "upper") p.layout = Layout::upper;
    else throw InputError(value_at, "the matrix format is Full, Lower or Upper");
  } else if (key == "reference") {
    const Real common = parse_number(first_value(), value_at);
    for (const auto& v : values)
      if (parse_number(v.first, value_at) != common)
        throw InputError(value_at, "ports with different reference impedances are not supported");
    if (!(common > 0.0)) throw InputError(value_at, "the reference impedance must be above zero");
    p.reference = common;
  } else if (key == "network data") {
    in_data = true;
  } else if (key == "noise data" || key == "end") {
    return false;
  } else if (key == "mixed-mode order") {
    throw InputError(at, "mixed-mode data is not supported");
  }
  return true;  // [Number of Frequencies] and informational keywords need nothing
}

Parsed parse(const std::filesystem::path& path, int default_ports) {
  const std::string file = path.string();
  std::istringstream in(read_text_file(file, max_touchstone_bytes, "the Touchstone file"));
  Parsed p;
  p.file = file;
  p.ports = default_ports;
  const std::string extension = lower(path.extension().string());
  if (extension.size() >= 4 && extension[1] == 's' && extension.back() == 'p') {
    const std::string digits = extension.substr(2, extension.size() - 3);
    if (!digits.empty() && digits.find_first_not_of("0123456789") == std::string::npos)
      p.ports = digits.size() <= 3 ? std::stoi(digits) : max_ports + 1;
    if (p.ports > max_ports)
      throw InputError({file, 1, 1}, "the extension says " + digits + " ports; lobe reads Touchstone files of at most " +
                                         std::to_string(max_ports));
  }
  bool options_seen = false, in_data = false;
  std::string line;
  int number = 0;
  while (std::getline(in, line)) {
    ++number;
    if (const auto bang = line.find('!'); bang != std::string::npos) line.erase(bang);
    const auto first = line.find_first_not_of(" \t\r");
    if (first == std::string::npos) continue;
    const SourceLocation at{file, number, static_cast<int>(first) + 1};
    line = line.substr(first);
    if (line[0] == '#') {
      if (!options_seen) read_option_line(line, at, p);  // later option lines are ignored, as the format says
      options_seen = true;
      if (p.version == 1) in_data = true;
      continue;
    }
    if (line[0] == '[') {
      if (!read_keyword(line, at, p, in_data)) break;
      continue;
    }
    if (!in_data) {
      if (p.version == 2) throw InputError(at, "data before [Network Data]");
      in_data = true;  // version 1 without an option line: defaults apply
    }
    for (const auto& [token, column] : tokens_of(line))
      p.numbers.push_back({parse_number(token, {file, number, static_cast<int>(first) + column}), number,
                           static_cast<int>(first) + column});
  }
  p.end_of_file = {file, std::max(number, 1), 1};
  if (p.ports < 1) throw InputError({file, 1, 1}, "the number of ports is unknown: name the file .sNp or give [Number of Ports]");
  return p;
}

Complex pair_value(const Parsed& p, Real a, Real b) {
  switch (p.format) {
    case TouchstoneFormat::real_imaginary: return {a, b};
    case TouchstoneFormat::magnitude_angle: return std::polar(a, b * pi / 180);
    case TouchstoneFormat::decibel_angle: return std::polar(std::pow(10.0, a / 20), b * pi / 180);
  }
  return {};
}

/// The matrix entries of one record, in file order.
std::vector<std::pair<int, int>> entry_order(const Parsed& p) {
  const int n = p.ports;
  std::vector<std::pair<int, int>> order;
  if (n == 2 && p.layout == Layout::full) {
    if (p.two_port_21_12) return {{0, 0}, {1, 0}, {0, 1}, {1, 1}};
    return {{0, 0}, {0, 1}, {1, 0}, {1, 1}};
  }
  for (int i = 0; i < n; ++i)
    for (int j = 0; j < n; ++j)
      if (p.layout == Layout::full || (p.layout == Layout::lower && j <= i) || (p.layout == Layout::upper && j >= i))
        order.emplace_back(i, j);
  return order;
}

/// S = (Z − R)(Z + R)⁻¹ for Z and Y data; version 1 normalises Z and Y to the reference,
/// version 2 gives ohms and siemens.
ComplexMatrix to_scattering(const Parsed& p, const ComplexMatrix& m) {
  if (p.parameter == Parameter::s) return m;
  const Real scale = p.version == 1 ? p.reference : 1.0;
  const ComplexMatrix z = p.parameter == Parameter::z ? ComplexMatrix(m * scale) : ComplexMatrix((m / scale).inverse());
  const ComplexMatrix r = p.reference * ComplexMatrix::Identity(m.rows(), m.cols());
  return (z - r) * (z + r).inverse();
}

}  // namespace

NetworkData read_touchstone(const std::filesystem::path& path, int default_ports) {
  const Parsed p = parse(path, default_ports);
  const auto order = entry_order(p);
  const std::size_t record = 1 + 2 * order.size();
  NetworkData data;
  data.reference_ohm = p.reference;
  std::size_t k = 0;
  while (k < p.numbers.size()) {
    const Real f = p.numbers[k].value * p.unit_hz;
    // Version 1 two-port files may append noise data: its frequencies start over.
    if (!data.frequency_hz.empty() && f <= data.frequency_hz.back()) {
      if (p.version == 1 && p.ports == 2) break;
      throw InputError(p.where(p.numbers[k]), "frequencies must increase");
    }
    if (k + record > p.numbers.size())
      throw InputError(p.where(p.numbers[k]), "this frequency's record is incomplete: " + std::to_string(record) +
                                                  " numbers expected for " + std::to_string(p.ports) + " ports");
    if (!(f > 0.0)) throw InputError(p.where(p.numbers[k]), "a frequency must be above zero");
    ComplexMatrix m = ComplexMatrix::Zero(p.ports, p.ports);
    for (std::size_t e = 0; e < order.size(); ++e) {
      const Number& magnitude = p.numbers[k + 1 + 2 * e];
      const Complex v = pair_value(p, magnitude.value, p.numbers[k + 2 + 2 * e].value);
      if (!std::isfinite(v.real()) || !std::isfinite(v.imag()))
        throw InputError(p.where(magnitude),
                         formatted("%.6g dB is no measurement: its magnitude overflows", magnitude.value));
      const auto [i, j] = order[e];
      m(i, j) = v;
      if (p.layout != Layout::full) m(j, i) = v;
    }
    const ComplexMatrix s = to_scattering(p, m);
    if (!s.allFinite())
      throw InputError(p.where(p.numbers[k]),
                       std::string("these ") + (p.parameter == Parameter::z ? "impedances" : "admittances") +
                           " give no finite S-parameters (Z + R or Y is singular here)");
    for (int i = 0; i < p.ports; ++i)
      if (!(std::abs(s(i, i)) <= 1.0 + passive_tolerance))
        throw InputError(p.where(p.numbers[k]),
                         formatted("|S%d%d| is %.4g here: a passive antenna cannot reflect more than it receives (a "
                                   "positive S11 in dB, or a file in another format or normalisation)",
                                   i + 1, i + 1, std::abs(s(i, i))));
    data.frequency_hz.push_back(f);
    data.s.push_back(s);
    k += record;
  }
  if (data.frequency_hz.empty()) throw InputError(p.end_of_file, "the file holds no network data");
  return data;
}

void write_touchstone(const std::filesystem::path& path, const NetworkData& data, const TouchstoneStyle& style,
                      const std::string& comment) {
  std::ofstream out(path);
  if (!out) throw std::runtime_error("cannot write " + path.string());
  const int n = data.ports();
  const char* unit = style.unit_hz == 1.0 ? "Hz" : style.unit_hz == 1e3 ? "kHz" : style.unit_hz == 1e6 ? "MHz" : "GHz";
  const char* format = style.format == TouchstoneFormat::real_imaginary ? "RI"
                       : style.format == TouchstoneFormat::magnitude_angle ? "MA" : "DB";
  std::istringstream lines(comment);
  for (std::string line; std::getline(lines, line);) out << "! " << line << '\n';
  if (style.format == TouchstoneFormat::decibel_angle)
    out << "! magnitudes below " << coupling_floor_db << " dB (the solve's rounding, not a coupling) are written as "
        << coupling_floor_db << " dB\n";
  if (style.version == 2) out << "[Version] 2.0\n";
  out << "# " << unit << " S " << format << " R " << exact_text(data.reference_ohm) << '\n';
  if (style.version == 2) {
    out << "[Number of Ports] " << n << '\n';
    if (n == 2) out << "[Two-Port Data Order] 12_21\n";
    out << "[Number of Frequencies] " << data.frequency_hz.size() << "\n[Network Data]\n";
  }
  auto pair = [&](Complex v) {
    switch (style.format) {
      case TouchstoneFormat::real_imaginary: return " " + exact_text(v.real()) + " " + exact_text(v.imag());
      case TouchstoneFormat::magnitude_angle:
        return " " + exact_text(std::abs(v)) + " " + exact_text(std::arg(v) * 180 / pi);
      case TouchstoneFormat::decibel_angle:
        return " " + exact_text(std::max(coupling_floor_db, 20 * std::log10(std::abs(v)))) + " " +
               exact_text(std::arg(v) * 180 / pi);
    }
    return std::string();
  };
  for (std::size_t k = 0; k < data.frequency_hz.size(); ++k) {
    out << exact_text(data.frequency_hz[k] / style.unit_hz);
    const ComplexMatrix& s = data.s[k];
    if (n == 2 && style.version == 1) {
      out << pair(s(0, 0)) << pair(s(1, 0)) << pair(s(0, 1)) << pair(s(1, 1)) << '\n';
      continue;
    }
    for (int i = 0; i < n; ++i) {
      for (int j = 0; j < n; ++j) {
        // Version 1 allows at most four pairs on a line; rows start on new lines.
        if (n > 2 && j > 0 && j % 4 == 0) out << "\n ";
        out << pair(s(i, j));
      }
      out << (n > 2 && i + 1 < n ? "\n " : "");
    }
    out << '\n';
  }
  if (style.version == 2) out << "[End]\n";
  out.close();
  if (!out) throw std::runtime_error("writing " + path.string() + " failed");
}

}  // namespace lobe
