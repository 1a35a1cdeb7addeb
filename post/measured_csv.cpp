#include "post/measured_csv.hpp"

#include <cctype>
#include <cmath>
#include <fstream>
#include <map>
#include <optional>

#include "core/constants.hpp"
#include "core/input_error.hpp"
#include "post/port_quantities.hpp"

namespace lobe {
namespace {

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

std::vector<std::pair<std::string, int>> cells_of(const std::string& line) {
  std::vector<std::pair<std::string, int>> cells;
  std::size_t start = 0;
  while (true) {
    const std::size_t comma = line.find(',', start);
    std::string cell = line.substr(start, comma == std::string::npos ? std::string::npos : comma - start);
    const auto first = cell.find_first_not_of(" \t\r\"");
    const auto last = cell.find_last_not_of(" \t\r\"");
    cells.emplace_back(first == std::string::npos ? "" : cell.substr(first, last - first + 1),
                       static_cast<int>(start + (first == std::string::npos ? 0 : first)) + 1);
    if (comma == std::string::npos) break;
    start = comma + 1;
  }
  return cells;
}

}  // namespace

MeasuredCurve read_measured_csv(const std::filesystem::path& path, Real reference_ohm) {
  const std::string file = path.string();
  std::ifstream in(path, std::ios::binary);
  if (!in) throw InputError({file, 1, 1}, "cannot open the measured file");
  std::string line;
  int number = 0;
  // The header: the first line that is neither empty nor a comment.
  std::map<std::string, int> column;
  while (std::getline(in, line)) {
    ++number;
    if (line.find_first_not_of(" \t\r") == std::string::npos || line[line.find_first_not_of(" \t\r")] == '#') continue;
    const auto cells = cells_of(line);
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
  else
    throw InputError(header, "no measured quantity: give return_loss_db, s11_db, s11_magnitude, vswr, s11_re and "
                             "s11_im, or resistance_ohm and reactance_ohm");
  measured.phase_known = kind == Kind::real_imaginary || kind == Kind::magnitude_angle || kind == Kind::impedance;
  const char* names[] = {"return loss", "S11 in dB", "|S11|", "VSWR", "complex S11", "complex S11", "impedance"};
  measured.quantity = names[static_cast<int>(kind)];

  while (std::getline(in, line)) {
    ++number;
    const auto first = line.find_first_not_of(" \t\r");
    if (first == std::string::npos || line[first] == '#') continue;
    const auto cells = cells_of(line);
    auto value = [&](int c) {
      if (c >= static_cast<int>(cells.size())) throw InputError({file, number, 1}, "this row has too few columns");
      char* end = nullptr;
      const Real v = std::strtod(cells[c].first.c_str(), &end);
      if (cells[c].first.empty() || *end != '\0' || !std::isfinite(v))
        throw InputError({file, number, cells[c].second}, "expected a number, found '" + cells[c].first + "'");
      return v;
    };
    const Real f = value(frequency_column) * unit;
    if (!measured.curve.frequency_hz.empty() && f <= measured.curve.frequency_hz.back())
      throw InputError({file, number, cells[frequency_column].second}, "frequencies must increase");
    const Real x = value(a), y = b >= 0 ? value(b) : 0.0;
    Complex gamma;
    switch (kind) {
      case Kind::return_loss: gamma = std::pow(10.0, -std::abs(x) / 20); break;
      case Kind::s11_db: gamma = std::pow(10.0, -std::abs(x) / 20); break;
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
