#include "post/svg_chart.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <optional>

#include "core/formatted_text.hpp"

namespace lobe {
namespace {

constexpr Real width = 720, height = 440, left = 78, right = 24, top = 44, bottom = 56;

std::string escaped(const std::string& s) { return xml_escaped(s); }

/// Round-number ticks covering [low, high], about `count` of them: steps of 1, 2 or 5 times
/// a power of ten.
std::vector<Real> ticks(Real low, Real high, int count = 6) {
  const Real raw = (high - low) / count;
  const Real power = std::pow(10.0, std::floor(std::log10(raw)));
  Real step = power;
  for (Real m : {1.0, 2.0, 5.0, 10.0})
    if (m * power >= raw) {
      step = m * power;
      break;
    }
  std::vector<Real> out;
  for (Real t = std::ceil(low / step - 1e-9) * step; t <= high + 1e-9 * step; t += step) out.push_back(std::abs(t) < 1e-12 * step ? 0.0 : t);
  return out;
}

std::string header(const std::string& title, Real document_width = width) {
  return formatted("<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"%.0f\" height=\"%.0f\" viewBox=\"0 0 %.0f %.0f\" "
                 "font-family=\"sans-serif\" font-size=\"13\">\n",
                 document_width, height, document_width, height) +
         "<rect width=\"100%\" height=\"100%\" fill=\"white\"/>\n" +
         formatted("<text x=\"%.0f\" y=\"26\" text-anchor=\"middle\" font-size=\"16\">", document_width / 2) + escaped(title) +
         "</text>\n";
}

/// Width of a legend line of `label` at 13 px (sans-serif averages about 7.2 px a character).
Real text_width(const std::string& label) {
  std::size_t characters = 0;
  for (unsigned char c : label) characters += (c & 0xC0) != 0x80;  // UTF-8: count characters, not bytes
  return 7.2 * static_cast<Real>(characters);
}

std::string stroke_attributes(const CurveStyle& style) {
  return "stroke-width=\"2\" stroke=\"" + style.colour + "\"" +
         (style.dash.empty() ? std::string() : " stroke-dasharray=\"" + style.dash + "\"");
}

/// One marker centred on (x, y).
std::string marker_svg(const CurveStyle& style, Real x, Real y) {
  const std::string fill = " fill=\"" + style.colour + "\"";
  if (style.marker == "circle") return formatted("<circle cx=\"%.2f\" cy=\"%.2f\" r=\"3.5\"", x, y) + fill + "/>\n";
  if (style.marker == "square")
    return formatted("<rect x=\"%.2f\" y=\"%.2f\" width=\"7\" height=\"7\"", x - 3.5, y - 3.5) + fill + "/>\n";
  if (style.marker == "triangle")
    return formatted("<polygon points=\"%.2f,%.2f %.2f,%.2f %.2f,%.2f\"", x, y - 4.5, x - 4, y + 3, x + 4, y + 3) + fill + "/>\n";
  if (style.marker == "diamond")
    return formatted("<polygon points=\"%.2f,%.2f %.2f,%.2f %.2f,%.2f %.2f,%.2f\"", x, y - 4.5, x + 4, y, x, y + 4.5, x - 4, y) +
           fill + "/>\n";
  return "";
}

/// Markers at about eight points spread along a curve of `count` points, each series
/// starting at its own offset so that overlapping curves show every series' markers.
template <class Position>
std::string markers_along(const CurveStyle& style, std::size_t count, std::size_t series_index, Position position) {
  if (style.marker.empty() || count == 0) return "";
  const std::size_t step = std::max<std::size_t>(1, count / 8);
  std::string out;
  for (std::size_t i = (series_index * step / 3) % step; i < count; i += step)
    if (const auto p = position(i)) out += marker_svg(style, p->first, p->second);
  return out;
}

/// A legend on a white card at (x, y): one line per entry, sized to the longest label.
std::string legend_svg(Real x, Real y, const std::vector<std::pair<std::string, CurveStyle>>& entries) {
  Real longest = 0;
  for (const auto& [label, style] : entries) longest = std::max(longest, text_width(label));
  std::string svg = formatted("<rect x=\"%.1f\" y=\"%.1f\" width=\"%.1f\" height=\"%.1f\" fill=\"white\" "
                              "fill-opacity=\"0.9\" stroke=\"#cccccc\"/>\n",
                              x, y, longest + 50, 18.0 * entries.size() + 8);
  for (std::size_t i = 0; i < entries.size(); ++i) {
    const auto& [label, style] = entries[i];
    const Real ly = y + 16 + 18 * i;
    svg += formatted("<line x1=\"%.1f\" y1=\"%.1f\" x2=\"%.1f\" y2=\"%.1f\" ", x + 6, ly, x + 34, ly) +
           stroke_attributes(style) + "/>\n" + marker_svg(style, x + 20, ly);
    svg += formatted("<text x=\"%.1f\" y=\"%.1f\">", x + 40, ly + 4) + escaped(label) + "</text>\n";
  }
  return svg;
}

Real legend_width(const std::vector<std::string>& labels) {
  Real longest = 0;
  for (const auto& l : labels) longest = std::max(longest, text_width(l));
  return longest + 50;
}

}  // namespace

CurveStyle series_style(std::size_t index) {
  static const std::vector<std::string> dashes{"", "8 4", "2 3", "12 4 2 4"};
  static const std::vector<std::string> markers{"circle", "square", "triangle", "diamond"};
  return {series_colour(index), dashes[index % dashes.size()], markers[index % markers.size()]};
}

std::string xml_escaped(const std::string& text) {
  std::string out;
  for (char c : text) {
    if (c == '<') out += "&lt;";
    else if (c == '>') out += "&gt;";
    else if (c == '&') out += "&amp;";
    else if (c == '"') out += "&quot;";
    else out += c;
  }
  return out;
}

const std::string& series_colour(std::size_t index) {
  static const std::vector<std::string> colours{"#1f4e9c", "#d1495b", "#2a9d55", "#8a4fbf", "#e08a00", "#333333"};
  return colours[index % colours.size()];
}

std::string line_chart_svg(const LineChart& chart) {
  Real x0 = 1e300, x1 = -1e300, y0 = 1e300, y1 = -1e300;
  for (const auto& s : chart.series)
    for (std::size_t i = 0; i < s.x.size(); ++i) {
      x0 = std::min(x0, s.x[i]), x1 = std::max(x1, s.x[i]);
      if (std::isfinite(s.y[i])) y0 = std::min(y0, s.y[i]), y1 = std::max(y1, s.y[i]);
    }
  if (!(x1 > x0)) x0 -= 1, x1 += 1;
  if (chart.y_min) y0 = *chart.y_min;
  if (chart.y_max) y1 = *chart.y_max;
  if (!(y1 > y0)) y0 -= 1, y1 += 1;
  if (!chart.y_min && !chart.y_max) {
    const Real pad = 0.05 * (y1 - y0);
    y0 -= pad, y1 += pad;
  }
  const Real pw = width - left - right, ph = height - top - bottom;
  auto px = [&](Real x) { return left + (x - x0) / (x1 - x0) * pw; };
  auto py = [&](Real y) { return top + (y1 - std::clamp(y, y0, y1)) / (y1 - y0) * ph; };
  std::string svg = header(chart.title);
  svg += formatted("<defs><clipPath id=\"plot\"><rect x=\"%.1f\" y=\"%.1f\" width=\"%.1f\" height=\"%.1f\"/></clipPath></defs>\n",
                 left, top, pw, ph);
  for (const auto& shade : chart.shades) {
    const Real a = std::max(px(shade.low), left), b = std::min(px(shade.high), left + pw);
    if (b <= a) continue;
    svg += formatted("<rect x=\"%.1f\" y=\"%.1f\" width=\"%.1f\" height=\"%.1f\" fill=\"#f2d16b\" fill-opacity=\"0.35\"/>\n", a,
                   top, std::max(b - a, 1.0), ph);
    svg += formatted("<text x=\"%.1f\" y=\"%.1f\" text-anchor=\"middle\" font-size=\"11\" fill=\"#7a5c00\">", 0.5 * (a + b),
                   top + 13) + escaped(shade.label) + "</text>\n";
  }
  for (Real t : ticks(x0, x1)) {
    svg += formatted("<line x1=\"%.1f\" y1=\"%.1f\" x2=\"%.1f\" y2=\"%.1f\" stroke=\"#dddddd\"/>\n", px(t), top, px(t), top + ph);
    svg += formatted("<text x=\"%.1f\" y=\"%.1f\" text-anchor=\"middle\">%g</text>\n", px(t), top + ph + 18, t);
  }
  for (Real t : ticks(y0, y1)) {
    svg += formatted("<line x1=\"%.1f\" y1=\"%.1f\" x2=\"%.1f\" y2=\"%.1f\" stroke=\"#dddddd\"/>\n", left, py(t), left + pw, py(t));
    svg += formatted("<text x=\"%.1f\" y=\"%.1f\" text-anchor=\"end\">%g</text>\n", left - 6, py(t) + 4, t);
  }
  for (const auto& [y, label] : chart.guides) {
    if (y < y0 || y > y1) continue;
    svg += formatted("<line x1=\"%.1f\" y1=\"%.1f\" x2=\"%.1f\" y2=\"%.1f\" stroke=\"#888888\" stroke-dasharray=\"6 4\"/>\n",
                   left, py(y), left + pw, py(y));
    svg += formatted("<text x=\"%.1f\" y=\"%.1f\" font-size=\"11\" fill=\"#555555\">", left + 6, py(y) - 4) +
           escaped(label) + "</text>\n";
  }
  svg += formatted("<rect x=\"%.1f\" y=\"%.1f\" width=\"%.1f\" height=\"%.1f\" fill=\"none\" stroke=\"#333333\"/>\n", left, top,
                 pw, ph);
  std::vector<std::string> beyond;  // curves with points past fixed limits
  for (std::size_t k = 0; k < chart.series.size(); ++k) {
    const auto& s = chart.series[k];
    std::string points;
    bool past = false;
    for (std::size_t i = 0; i < s.x.size(); ++i)
      if (std::isfinite(s.y[i])) {
        points += formatted("%.2f,%.2f ", px(s.x[i]), py(s.y[i]));
        past = past || s.y[i] > y1 || s.y[i] < y0;
      }
    if (past) beyond.push_back(s.label);
    svg += "<polyline clip-path=\"url(#plot)\" fill=\"none\" " + stroke_attributes(s.style) + " points=\"" + points + "\"/>\n";
    svg += markers_along(s.style, s.x.size(), k, [&](std::size_t i) -> std::optional<std::pair<Real, Real>> {
      if (!std::isfinite(s.y[i]) || s.y[i] > y1 || s.y[i] < y0) return std::nullopt;
      return std::pair{px(s.x[i]), py(s.y[i])};
    });
  }
  // The legend sits on a white card, top right, so guides and curves beneath it do not cross its text.
  if (!chart.series.empty()) {
    std::vector<std::pair<std::string, CurveStyle>> entries;
    std::vector<std::string> labels;
    for (const auto& s : chart.series) entries.emplace_back(s.label, s.style), labels.push_back(s.label);
    svg += legend_svg(left + pw - legend_width(labels) - 6, top + 6, entries);
  }
  if (!beyond.empty()) {
    std::string names;
    for (const auto& b : beyond) names += (names.empty() ? "" : ", ") + b;
    svg += formatted("<text x=\"%.1f\" y=\"%.1f\" font-size=\"11\" fill=\"#a02020\">", left, top - 5) +
           escaped("beyond the axis at some frequencies: " + names) + "</text>\n";
  }
  svg += formatted("<text x=\"%.1f\" y=\"%.1f\" text-anchor=\"middle\">", left + pw / 2, height - 14) + escaped(chart.x_label) +
         "</text>\n";
  svg += formatted("<text transform=\"translate(18 %.1f) rotate(-90)\" text-anchor=\"middle\">", top + ph / 2) +
         escaped(chart.y_label) + "</text>\n";
  return svg + "</svg>\n";
}

std::string smith_chart_svg(const std::string& title, Real reference_ohm, const std::vector<SmithSeries>& series,
                            const std::vector<SmithMark>& marks) {
  const Real cx = 300, cy = 236, radius = 180;
  auto px = [&](Complex g) { return formatted("%.2f,%.2f", cx + radius * g.real(), cy - radius * g.imag()); };
  std::vector<std::string> labels;
  for (const auto& s : series) labels.push_back(s.label);
  const Real document_width = std::max(width, 514 + legend_width(labels) + 8);
  std::string svg = header(title, document_width);
  svg += formatted("<defs><clipPath id=\"disc\"><circle cx=\"%.1f\" cy=\"%.1f\" r=\"%.1f\"/></clipPath></defs>\n", cx, cy, radius);
  // Constant resistance r: circle centre (r/(1+r), 0), radius 1/(1+r).
  for (Real r : {0.2, 0.5, 1.0, 2.0, 5.0}) {
    svg += formatted("<circle cx=\"%.2f\" cy=\"%.2f\" r=\"%.2f\" fill=\"none\" stroke=\"#cccccc\"/>\n",
                   cx + radius * r / (1 + r), cy, radius / (1 + r));
    svg += formatted("<text x=\"%.1f\" y=\"%.1f\" font-size=\"10\" fill=\"#777777\">%g</text>\n",
                   cx + radius * (r - 1) / (r + 1) + 2, cy - 3, r * reference_ohm);
  }
  // Constant reactance x: circle centre (1, 1/x), radius 1/|x|, clipped to the unit disc.
  for (Real x : {0.2, 0.5, 1.0, 2.0, 5.0})
    for (Real sign : {1.0, -1.0}) {
      svg += formatted("<circle clip-path=\"url(#disc)\" cx=\"%.2f\" cy=\"%.2f\" r=\"%.2f\" fill=\"none\" stroke=\"#cccccc\"/>\n",
                     cx + radius, cy - sign * radius / x, radius / x);
      const Complex z(0.0, sign * x), g = (z - 1.0) / (z + 1.0);
      svg += formatted("<text x=\"%.1f\" y=\"%.1f\" font-size=\"10\" fill=\"#777777\" text-anchor=\"middle\">%+gj</text>\n",
                     cx + 1.08 * radius * g.real(), cy - 1.08 * radius * g.imag() + 4, sign * x * reference_ohm);
    }
  svg += formatted("<line x1=\"%.1f\" y1=\"%.1f\" x2=\"%.1f\" y2=\"%.1f\" stroke=\"#cccccc\"/>\n", cx - radius, cy, cx + radius, cy);
  svg += formatted("<circle cx=\"%.1f\" cy=\"%.1f\" r=\"%.1f\" fill=\"none\" stroke=\"#333333\"/>\n", cx, cy, radius);
  // VSWR 2 circle: |Γ| = 1/3.
  svg += formatted("<circle cx=\"%.1f\" cy=\"%.1f\" r=\"%.1f\" fill=\"none\" stroke=\"#888888\" stroke-dasharray=\"6 4\"/>\n", cx,
                 cy, radius / 3);
  svg += formatted("<text x=\"%.1f\" y=\"%.1f\" font-size=\"11\" fill=\"#555555\">VSWR 2</text>\n", cx + radius / 3 * 0.72,
                 cy + radius / 3 * 0.72 + 12);
  std::vector<std::pair<std::string, CurveStyle>> entries;
  for (std::size_t i = 0; i < series.size(); ++i) {
    const auto& s = series[i];
    entries.emplace_back(s.label, s.style);
    if (s.reflection.empty()) continue;
    std::string points;
    for (const Complex& g : s.reflection) points += px(g) + " ";
    svg += "<polyline fill=\"none\" " + stroke_attributes(s.style) + " points=\"" + points + "\"/>\n";
    const Complex a = s.reflection.front(), b = s.reflection.back();
    svg += formatted("<circle cx=\"%.2f\" cy=\"%.2f\" r=\"4.5\" fill=\"white\" stroke-width=\"2\" stroke=\"",
                     cx + radius * a.real(), cy - radius * a.imag()) + s.style.colour + "\"/>\n";
    svg += formatted("<rect x=\"%.2f\" y=\"%.2f\" width=\"9\" height=\"9\" fill=\"white\" stroke-width=\"2\" stroke=\"",
                     cx + radius * b.real() - 4.5, cy - radius * b.imag() - 4.5) + s.style.colour + "\"/>\n";
    for (const auto& [index, text] : s.point_labels) {
      if (index >= s.reflection.size()) continue;
      const Complex g = s.reflection[index];
      svg += formatted("<text x=\"%.1f\" y=\"%.1f\" font-size=\"10\" fill=\"", cx + radius * g.real() + 7,
                       cy - radius * g.imag() - 6) + s.style.colour + "\">" + escaped(text) + "</text>\n";
    }
  }
  for (std::size_t i = 0; i < marks.size(); ++i) {
    const SmithMark& m = marks[i];
    const Real x = cx + radius * m.reflection.real(), y = cy - radius * m.reflection.imag();
    svg += formatted("<path d=\"M %.2f %.2f l 5 -9 l -10 0 z\" fill=\"", x, y) + m.colour + "\"/>\n";
    // Alternate marks label to the left and right: a narrow band's two edges lie close together.
    svg += formatted("<text x=\"%.1f\" y=\"%.1f\" font-size=\"10\" text-anchor=\"%s\" fill=\"", i % 2 ? x + 8 : x - 8,
                     y - 4, i % 2 ? "start" : "end") + m.colour + "\">" + escaped(m.label) + "</text>\n";
  }
  svg += legend_svg(514, top + 14, entries);
  const Real below = top + 14 + 18.0 * entries.size() + 24;
  svg += formatted("<text x=\"520\" y=\"%.1f\" font-size=\"11\" fill=\"#555555\">open circle: first frequency, square: last</text>\n",
                   below);
  if (!marks.empty())
    svg += formatted("<text x=\"520\" y=\"%.1f\" font-size=\"11\" fill=\"#7a5c00\">triangles: band edges</text>\n", below + 16);
  svg += formatted("<text x=\"520\" y=\"%.1f\" font-size=\"11\" fill=\"#555555\">labels in ohm (reference %g ohm)</text>\n",
                   below + 32, reference_ohm);
  return svg + "</svg>\n";
}

std::string polar_chart_svg(const std::string& title, Real floor_db, Real ceiling_db, const std::vector<PolarSeries>& series,
                            const std::string& unit, const std::string& orientation) {
  const Real cx = 300, cy = 240, radius = 175, pi = 3.14159265358979323846;
  auto scaled = [&](Real db) { return radius * std::clamp((db - floor_db) / (ceiling_db - floor_db), 0.0, 1.0); };
  std::vector<std::string> labels;
  for (const auto& s : series) labels.push_back(s.label);
  const Real document_width = std::max(width, 514 + legend_width(labels) + 8);
  std::string svg = header(title, document_width);
  for (Real ring : ticks(floor_db, ceiling_db)) {
    svg += formatted("<circle cx=\"%.1f\" cy=\"%.1f\" r=\"%.1f\" fill=\"none\" stroke=\"#dddddd\"/>\n", cx, cy, scaled(ring));
    svg += formatted("<text x=\"%.1f\" y=\"%.1f\" font-size=\"10\" fill=\"#777777\">%g %s</text>\n", cx + 3,
                   cy - scaled(ring) + 11, ring, unit.c_str());
  }
  for (int a = 0; a < 360; a += 30) {
    const Real r = a * pi / 180;
    svg += formatted("<line x1=\"%.1f\" y1=\"%.1f\" x2=\"%.1f\" y2=\"%.1f\" stroke=\"#dddddd\"/>\n", cx, cy,
                   cx + radius * std::sin(r), cy - radius * std::cos(r));
    svg += formatted("<text x=\"%.1f\" y=\"%.1f\" font-size=\"11\" text-anchor=\"middle\">%d&#176;</text>\n",
                   cx + (radius + 16) * std::sin(r), cy - (radius + 16) * std::cos(r) + 4, a <= 180 ? a : a - 360);
  }
  svg += formatted("<circle cx=\"%.1f\" cy=\"%.1f\" r=\"%.1f\" fill=\"none\" stroke=\"#333333\"/>\n", cx, cy, radius);
  std::vector<std::pair<std::string, CurveStyle>> entries;
  for (std::size_t i = 0; i < series.size(); ++i) {
    const auto& s = series[i];
    entries.emplace_back(s.label, s.style);
    auto position = [&](std::size_t k) -> std::optional<std::pair<Real, Real>> {
      const Real r = s.angle_deg[k] * pi / 180, d = scaled(s.value_db[k]);
      return std::pair{cx + d * std::sin(r), cy - d * std::cos(r)};
    };
    std::string points;
    for (std::size_t k = 0; k < s.angle_deg.size(); ++k) points += formatted("%.2f,%.2f ", position(k)->first, position(k)->second);
    svg += "<polyline fill=\"none\" " + stroke_attributes(s.style) + " points=\"" + points + "\"/>\n";
    svg += markers_along(s.style, s.angle_deg.size(), i, position);
  }
  svg += legend_svg(514, top + 14, entries);
  svg += formatted("<text x=\"520\" y=\"%.1f\" font-size=\"11\" fill=\"#555555\">", top + 14 + 18.0 * entries.size() + 24) +
         escaped(orientation) + "</text>\n";
  return svg + "</svg>\n";
}

namespace {

/// A perceptually even scale from dark violet (t = 0) through teal to yellow (t = 1),
/// readable in grey print and for common colour blindness (anchors of the viridis map).
std::string scale_colour(Real t) {
  static const Real anchors[5][3] = {{68, 1, 84}, {59, 82, 139}, {33, 145, 140}, {94, 201, 98}, {253, 231, 37}};
  const Real u = std::clamp(t, 0.0, 1.0) * 4;
  const int i = std::min(static_cast<int>(u), 3);
  const Real w = u - i;
  int rgb[3];
  for (int k = 0; k < 3; ++k) rgb[k] = static_cast<int>(std::lround((1 - w) * anchors[i][k] + w * anchors[i + 1][k]));
  return formatted("#%02x%02x%02x", rgb[0], rgb[1], rgb[2]);
}

/// Every k-th label, k chosen so that labels on cells `cell` px wide stand `spacing` px apart.
std::size_t label_stride(Real cell, Real spacing) {
  return std::max<std::size_t>(1, static_cast<std::size_t>(std::ceil(spacing / cell)));
}

}  // namespace

std::string heat_map_svg(const HeatMap& map) {
  const std::size_t rows = map.values.size(), columns = rows ? map.values[0].size() : 0;
  Real low = 1e300, high = -1e300;
  for (const auto& row : map.values)
    for (Real v : row)
      if (std::isfinite(v)) low = std::min(low, v), high = std::max(high, v);
  // The scale runs from the best value to the worst, clipped on the worse side.
  Real best = map.larger_is_better ? high : low, worst = map.larger_is_better ? low : high;
  bool clipped = false;
  if (map.colour_limit && (map.larger_is_better ? worst < *map.colour_limit : worst > *map.colour_limit))
    worst = *map.colour_limit, clipped = true;
  if (!(std::abs(worst - best) > 0)) worst = best + (map.larger_is_better ? -1 : 1);
  auto goodness = [&](Real v) { return std::clamp((v - worst) / (best - worst), 0.0, 1.0); };

  const Real map_left = 120, map_top = map.note.empty() ? 44 : 58, bar_width = 16, map_right = width - 110;
  const Real map_bottom = height - 64;
  const Real cell_w = (map_right - map_left) / std::max<std::size_t>(columns, 1);
  const Real cell_h = (map_bottom - map_top) / std::max<std::size_t>(rows, 1);
  std::string svg = header(map.title);
  if (!map.note.empty())
    svg += formatted("<text x=\"%.0f\" y=\"44\" text-anchor=\"middle\" font-size=\"11\" fill=\"#555555\">", width / 2) +
           escaped(map.note) + "</text>\n";
  // The best cell: found on the values, not on the clipped colours.
  std::size_t best_row = rows, best_column = 0;
  for (std::size_t r = 0; r < rows; ++r)
    for (std::size_t c = 0; c < columns; ++c) {
      const Real v = map.values[r][c];
      if (!std::isfinite(v)) continue;
      if (best_row == rows || (map.larger_is_better ? v > map.values[best_row][best_column] : v < map.values[best_row][best_column]))
        best_row = r, best_column = c;
    }
  const bool numbers_fit = cell_w >= 38 && cell_h >= 16;
  for (std::size_t r = 0; r < rows; ++r)
    for (std::size_t c = 0; c < columns; ++c) {
      const Real v = map.values[r][c], x = map_left + c * cell_w, y = map_bottom - (r + 1) * cell_h;
      const bool known = std::isfinite(v);
      const Real t = known ? goodness(v) : 0.0;
      svg += formatted("<rect x=\"%.2f\" y=\"%.2f\" width=\"%.2f\" height=\"%.2f\" shape-rendering=\"crispEdges\" fill=\"", x,
                     y, cell_w, cell_h) +
             (known ? scale_colour(t) : std::string("#e6e6e6")) + "\"><title>" + escaped(map.x_ticks[c]) + ", " +
             escaped(map.y_ticks[r]) + ": " + (known ? formatted("%.4g", v) : std::string("no case")) + "</title></rect>\n";
      if (known && numbers_fit)
        svg += formatted("<text x=\"%.2f\" y=\"%.2f\" text-anchor=\"middle\" font-size=\"11\" fill=\"%s\">%.3g</text>\n",
                       x + cell_w / 2, y + cell_h / 2 + 4, t > 0.55 ? "#000000" : "#ffffff", v);
    }
  if (best_row < rows)
    svg += formatted("<rect x=\"%.2f\" y=\"%.2f\" width=\"%.2f\" height=\"%.2f\" fill=\"none\" stroke=\"#000000\" "
                   "stroke-width=\"3\"/>\n",
                   map_left + best_column * cell_w + 1.5, map_bottom - (best_row + 1) * cell_h + 1.5, cell_w - 3, cell_h - 3);
  svg += formatted("<rect x=\"%.1f\" y=\"%.1f\" width=\"%.1f\" height=\"%.1f\" fill=\"none\" stroke=\"#333333\"/>\n", map_left,
                 map_top, map_right - map_left, map_bottom - map_top);
  const std::size_t x_stride = label_stride(cell_w, 64), y_stride = label_stride(cell_h, 16);
  for (std::size_t c = 0; c < columns; c += x_stride)
    svg += formatted("<text x=\"%.1f\" y=\"%.1f\" text-anchor=\"middle\">", map_left + (c + 0.5) * cell_w, map_bottom + 18) +
           escaped(map.x_ticks[c]) + "</text>\n";
  for (std::size_t r = 0; r < rows; r += y_stride)
    svg += formatted("<text x=\"%.1f\" y=\"%.1f\" text-anchor=\"end\">", map_left - 6, map_bottom - (r + 0.5) * cell_h + 4) +
           escaped(map.y_ticks[r]) + "</text>\n";
  svg += formatted("<text x=\"%.1f\" y=\"%.1f\" text-anchor=\"middle\">", 0.5 * (map_left + map_right), height - 30) +
         escaped(map.x_label) + "</text>\n";
  svg += formatted("<text transform=\"translate(18 %.1f) rotate(-90)\" text-anchor=\"middle\">", 0.5 * (map_top + map_bottom)) +
         escaped(map.y_label) + "</text>\n";
  svg += formatted("<text x=\"%.1f\" y=\"%.1f\" font-size=\"11\" fill=\"#555555\">outlined: the best case</text>\n", map_left,
                 height - 10);
  // Colour bar: best at the top.
  const Real bar_x = map_right + 24, bar_steps = 48, bar_h = map_bottom - map_top;
  for (int k = 0; k < bar_steps; ++k)
    svg += formatted("<rect x=\"%.1f\" y=\"%.2f\" width=\"%.1f\" height=\"%.2f\" fill=\"", bar_x, map_top + k * bar_h / bar_steps,
                   bar_width, bar_h / bar_steps + 0.5) + scale_colour(1 - (k + 0.5) / bar_steps) + "\"/>\n";
  svg += formatted("<rect x=\"%.1f\" y=\"%.1f\" width=\"%.1f\" height=\"%.1f\" fill=\"none\" stroke=\"#333333\"/>\n", bar_x,
                 map_top, bar_width, bar_h);
  auto bar_label = [&](Real value, const char* prefix) {
    const Real y = map_top + (1 - goodness(value)) * bar_h;
    svg += formatted("<line x1=\"%.1f\" y1=\"%.1f\" x2=\"%.1f\" y2=\"%.1f\" stroke=\"#333333\"/>\n", bar_x + bar_width, y,
                   bar_x + bar_width + 4, y);
    svg += formatted("<text x=\"%.1f\" y=\"%.1f\" font-size=\"11\">%s%g</text>\n", bar_x + bar_width + 6, y + 4, prefix, value);
  };
  // A clipped scale labels its worse end "at least" (or "at most") the limit.
  if (clipped) bar_label(worst, map.larger_is_better ? "&#8804; " : "&#8805; ");
  for (Real tick : ticks(std::min(best, worst), std::max(best, worst), 10))
    if (!clipped || std::abs(goodness(tick)) * bar_h > 14) bar_label(tick, "");
  svg += formatted("<text transform=\"translate(%.1f %.1f) rotate(-90)\" text-anchor=\"middle\" font-size=\"11\">", bar_x - 6,
                 map_top + bar_h / 2) + escaped(map.value_label) + " (best at top)</text>\n";
  return svg + "</svg>\n";
}

}  // namespace lobe
