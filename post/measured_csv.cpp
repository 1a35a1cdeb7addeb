#include "post/measured_csv.hpp"

#include <cctype>
#include <cmath>
#include <sstream>
#include <map>
#include <optional>

#include "core/constants.hpp"
#include "core/input_error.hpp"
#include "core/text_file.hpp"
#include "post/output_files.hpp"
#include "post/port_quantities.hpp"

namespace lobe {
namespace {

/// Far beyond any analyser export (100,001 points of a two-port in RI are about 20 MB).
constexpr std::size_t max_measured_bytes = 64u << 20;

/// The next line, ended by LF, CR LF or a lone CR.
bool next_line(std::istream& in, std::string& line) {
  line.clear();
  for (int c = in.get(); c != EOF; c = in.get()) {
    if (c == '\n') return true;
    if (c == '\r') {
      if (in.peek() == '\n') in.get();
      return true;
    }
    line += static_cast<char>(c);
  }
  return !line.empty();
}

/// "Frequency (MHz)" → "frequency_mhz"; "S11 [dB]" → "s11_db".
std::string normalised(const std::string& header) {
  std::string out;
  for (char c : header) {
    const auto u = static_cast<unsigned char>(c);
    if (std::isalnum(u)) out += static_cast<char>(std::tolower(u));
    else if (!out.empty() && out.back() != '_') out += '_';
  }
  while (!out.empty() && out.back() == '_') out.pop_back();
  return out;
}

/// The separator a table uses, from its header line: a semicolon or a tab where one stands
/// outside quotes (European analysers write "820,5;−12,3"), else a comma.
char separator_of(const std::string& header) {
  bool quoted = false, semicolon = false, tab = false;
  for (char c : header) {
    if (c == '"') quoted = !quoted;
    else if (!quoted && c == ';') semicolon = true;
    else if (!quoted && c == '\t') tab = true;
  }
  return semicolon ? ';' : tab ? '\t' : ',';
}

/// The cells of one line by RFC 4180: fields split at `separator` outside double quotes,
/// a doubled quote inside quotes standing for one; each with its 1-based column.
std::vector<std::pair<std::string, int>> cells_of(const std::string& line, char separator) {
  std::vector<std::pair<std::string, int>> cells;
  std::string cell;
  int column = 1;
  bool quoted = false;
  for (std::size_t i = 0; i <= line.size(); ++i) {
    const char c = i < line.size() ? line[i] : separator;
    if (quoted) {
      if (c == '"' && i + 1 < line.size() && line[i + 1] == '"') cell += '"', ++i;
      else if (c == '"') quoted = false;
      else if (i < line.size()) cell += c;
      continue;
    }
    if (c == '"') {
      quoted = true;
    } else if (c == separator) {
      const auto first = cell.find_first_not_of(" \t\r"), last = cell.find_last_not_of(" \t\r");
      cells.emplace_back(first == std::string::npos ? "" : cell.substr(first, last - first + 1), column);
      cell.clear();
      column = static_cast<int>(i) + 2;
    } else {
      cell += c;
    }
  }
  return cells;
}

/// A number as analysers write it: a decimal point, or a single decimal comma ("820,5")
/// where the comma cannot be a separator.
std::optional<Real> number_in(std::string text) {
  if (const auto comma = text.find(','); comma != std::string::npos) {
    if (text.find(',', comma + 1) != std::string::npos || text.find('.') != std::string::npos) return std::nullopt;
    text[comma] = '.';
  }
  char* end = nullptr;
  const Real v = std::strtod(text.c_str(), &end);
  if (text.empty() || *end != '\0' || !std::isfinite(v)) return std::nullopt;
  return v;
}

}  // namespace

MeasuredCurve read_measured_csv(const std::filesystem::path& path, Real reference_ohm) {
  const std::string file = path.string();
  if (const auto marker = publishing_marker_for(path))
    throw InputError({file, 1, 1}, "this table belongs to a result set that was interrupted while it was being written");
  std::istringstream in(read_text_file(file, max_measured_bytes, "the measured file"));
  std::string line;
  int number = 0;
  char separator = ',';
  // The header: the first line that is neither empty nor a comment.
  std::map<std::string, int> column;
  while (next_line(in, line)) {
    ++number;
    if (line.find_first_not_of(" \t\r") == std::string::npos || line[line.find_first_not_of(" \t\r")] == '#') continue;
    separator = separator_of(line);
    const auto cells = cells_of(line, separator);
    for (std::size_t i = 0; i < cells.size(); ++i) column.emplace(normalised(cells[i].first), static_cast<int>(i));
    break;
  }
  const SourceLocation header{file, std::max(number, 1), 1};
  Real unit = 0.0;
  int frequency_column = -1;
  for (const auto& [name, scale] : {std::pair<const char*, Real>{"frequency_hz", 1.0}, {"frequency_khz", 1e3},
                                    {"frequency_mhz", 1e6}, {"frequency_ghz", 1e9}, {"freq_hz", 1.0},
                                    {"freq_mhz", 1e6}, {"freq_ghz", 1e9}})
    if (column.count(name)) {
      frequency_column = column[name];
      unit = scale;
      break;
    }
  if (frequency_column < 0)
    throw InputError(header, "no frequency column: name it frequency_hz, frequency_mhz, \"Frequency (GHz)\" or similar");
  auto has = [&](const char* name) { return column.count(name) > 0; };
  MeasuredCurve measured;
  enum class Kind { return_loss, s11_db, magnitude, vswr, real_imaginary, magnitude_angle, impedance } kind;
  int a = -1, b = -1;
  if (has("s11_re") && has("s11_im")) kind = Kind::real_imaginary, a = column["s11_re"], b = column["s11_im"];
  else if (has("resistance_ohm") && has("reactance_ohm"))
    kind = Kind::impedance, a = column["resistance_ohm"], b = column["reactance_ohm"];
  else if (has("r_ohm") && has("x_ohm")) kind = Kind::impedance, a = column["r_ohm"], b = column["x_ohm"];
  else if (has("s11_magnitude") && has("s11_deg"))
    kind = Kind::magnitude_angle, a = column["s11_magnitude"], b = column["s11_deg"];
  else if (has("return_loss_db")) kind = Kind::return_loss, a = column["return_loss_db"];
  else if (has("s11_db")) kind = Kind::s11_db, a = column["s11_db"];
  else if (has("s11_magnitude")) kind = Kind::magnitude, a = column["s11_magnitude"];
  else if (has("reflection_magnitude")) kind = Kind::magnitude, a = column["reflection_magnitude"];
  else if (has("vswr")) kind = Kind::vswr, a = column["vswr"];
  else if (has("swr")) kind = Kind::vswr, a = column["swr"];
  else
    throw InputError(header, "no measured quantity: give return_loss_db, s11_db, s11_magnitude, vswr, s11_re and "
                             "s11_im, or resistance_ohm and reactance_ohm");
  measured.phase_known = kind == Kind::real_imaginary || kind == Kind::magnitude_angle || kind == Kind::impedance;
  const char* names[] = {"return loss", "S11 in dB", "|S11|", "VSWR", "complex S11", "complex S11", "impedance"};
  measured.quantity = names[static_cast<int>(kind)];

  while (next_line(in, line)) {
    ++number;
    const auto first = line.find_first_not_of(" \t\r");
    if (first == std::string::npos || line[first] == '#') continue;
    const auto cells = cells_of(line, separator);
    auto value = [&](int c) {
      if (c >= static_cast<int>(cells.size())) throw InputError({file, number, 1}, "this row has too few columns");
      const std::optional<Real> v = number_in(cells[c].first);
      if (!v) throw InputError({file, number, cells[c].second}, "expected a number, found '" + cells[c].first + "'");
      return *v;
    };
    const Real f = value(frequency_column) * unit;
    if (!(f > 0.0)) throw InputError({file, number, cells[frequency_column].second}, "a frequency must be above zero");
    if (!measured.curve.frequency_hz.empty() && f <= measured.curve.frequency_hz.back())
      throw InputError({file, number, cells[frequency_column].second}, "frequencies must increase");
    const Real x = value(a), y = b >= 0 ? value(b) : 0.0;
    Complex gamma;
    switch (kind) {
      case Kind::return_loss: gamma = std::pow(10.0, -std::abs(x) / 20); break;
      case Kind::s11_db: gamma = std::pow(10.0, x / 20); break;  // +6 dB is |S11| = 2, refused below
      case Kind::magnitude: gamma = x; break;
      case Kind::vswr:
        if (x < 1.0) throw InputError({file, number, cells[a].second}, "a VSWR cannot be below 1");
        gamma = (x - 1) / (x + 1);
        break;
      case Kind::real_imaginary: gamma = {x, y}; break;
      case Kind::magnitude_angle: gamma = std::polar(x, y * pi / 180); break;
      case Kind::impedance: gamma = reflection_coefficient({x, y}, reference_ohm); break;
    }
    if (std::abs(gamma) > 1.0 + 1e-9)
      throw InputError({file, number, cells[a].second}, "a passive antenna cannot reflect more than it receives (|S11| > 1)");
    measured.curve.frequency_hz.push_back(f);
    measured.curve.reflection.push_back(gamma);
  }
  if (measured.curve.frequency_hz.size() < 2) throw InputError({file, number, 1}, "at least two measured rows are needed");
  return measured;
}

}  // namespace lobe
