#include "post/svg_chart.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>

namespace lobe {
namespace {

constexpr Real width = 720, height = 440, left = 78, right = 24, top = 44, bottom = 56;

std::string text_of(const char* format, auto... values) {
  char buffer[256];
  std::snprintf(buffer, sizeof buffer, format, values...);
  return buffer;
}

std::string escaped(const std::string& s) {
  std::string out;
  for (char c : s) {
    if (c == '<') out += "&lt;";
    else if (c == '>') out += "&gt;";
    else if (c == '&') out += "&amp;";
    else if (c == '"') out += "&quot;";
    else out += c;
  }
  return out;
}

/// Round-number ticks covering [low, high]: steps of 1, 2 or 5 times a power of ten.
std::vector<Real> ticks(Real low, Real high) {
  const Real raw = (high - low) / 6;
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

std::string header(const std::string& title) {
  return text_of("<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"%.0f\" height=\"%.0f\" viewBox=\"0 0 %.0f %.0f\" "
                 "font-family=\"sans-serif\" font-size=\"13\">\n",
                 width, height, width, height) +
         "<rect width=\"100%\" height=\"100%\" fill=\"white\"/>\n" +
         text_of("<text x=\"%.0f\" y=\"26\" text-anchor=\"middle\" font-size=\"16\">", width / 2) + escaped(title) +
         "</text>\n";
}

}  // namespace

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
  svg += text_of("<defs><clipPath id=\"plot\"><rect x=\"%.1f\" y=\"%.1f\" width=\"%.1f\" height=\"%.1f\"/></clipPath></defs>\n",
                 left, top, pw, ph);
  for (const auto& shade : chart.shades) {
    const Real a = std::max(px(shade.low), left), b = std::min(px(shade.high), left + pw);
    if (b <= a) continue;
    svg += text_of("<rect x=\"%.1f\" y=\"%.1f\" width=\"%.1f\" height=\"%.1f\" fill=\"#f2d16b\" fill-opacity=\"0.35\"/>\n", a,
                   top, std::max(b - a, 1.0), ph);
    svg += text_of("<text x=\"%.1f\" y=\"%.1f\" text-anchor=\"middle\" font-size=\"11\" fill=\"#7a5c00\">", 0.5 * (a + b),
                   top + 13) + escaped(shade.label) + "</text>\n";
  }
  for (Real t : ticks(x0, x1)) {
    svg += text_of("<line x1=\"%.1f\" y1=\"%.1f\" x2=\"%.1f\" y2=\"%.1f\" stroke=\"#dddddd\"/>\n", px(t), top, px(t), top + ph);
    svg += text_of("<text x=\"%.1f\" y=\"%.1f\" text-anchor=\"middle\">%g</text>\n", px(t), top + ph + 18, t);
  }
  for (Real t : ticks(y0, y1)) {
    svg += text_of("<line x1=\"%.1f\" y1=\"%.1f\" x2=\"%.1f\" y2=\"%.1f\" stroke=\"#dddddd\"/>\n", left, py(t), left + pw, py(t));
    svg += text_of("<text x=\"%.1f\" y=\"%.1f\" text-anchor=\"end\">%g</text>\n", left - 6, py(t) + 4, t);
  }
  for (const auto& [y, label] : chart.guides) {
    if (y < y0 || y > y1) continue;
    svg += text_of("<line x1=\"%.1f\" y1=\"%.1f\" x2=\"%.1f\" y2=\"%.1f\" stroke=\"#888888\" stroke-dasharray=\"6 4\"/>\n",
                   left, py(y), left + pw, py(y));
    svg += text_of("<text x=\"%.1f\" y=\"%.1f\" font-size=\"11\" fill=\"#555555\">", left + 6, py(y) - 4) +
           escaped(label) + "</text>\n";
  }
  svg += text_of("<rect x=\"%.1f\" y=\"%.1f\" width=\"%.1f\" height=\"%.1f\" fill=\"none\" stroke=\"#333333\"/>\n", left, top,
                 pw, ph);
  for (const auto& s : chart.series) {
    std::string points;
    for (std::size_t i = 0; i < s.x.size(); ++i)
      if (std::isfinite(s.y[i])) points += text_of("%.2f,%.2f ", px(s.x[i]), py(s.y[i]));
    svg += "<polyline clip-path=\"url(#plot)\" fill=\"none\" stroke-width=\"2\" stroke=\"" + s.colour + "\"" +
           (s.dashed ? " stroke-dasharray=\"7 4\"" : "") + " points=\"" + points + "\"/>\n";
  }
  for (std::size_t i = 0; i < chart.series.size(); ++i) {
    const auto& s = chart.series[i];
    const Real y = top + 18 + 18 * i, x = left + pw - 190;
    svg += text_of("<line x1=\"%.1f\" y1=\"%.1f\" x2=\"%.1f\" y2=\"%.1f\" stroke-width=\"2\" stroke=\"", x, y, x + 28, y) +
           s.colour + "\"" + (s.dashed ? " stroke-dasharray=\"7 4\"" : "") + "/>\n";
    svg += text_of("<text x=\"%.1f\" y=\"%.1f\">", x + 34, y + 4) + escaped(s.label) + "</text>\n";
  }
  svg += text_of("<text x=\"%.1f\" y=\"%.1f\" text-anchor=\"middle\">", left + pw / 2, height - 14) + escaped(chart.x_label) +
         "</text>\n";
  svg += text_of("<text transform=\"translate(18 %.1f) rotate(-90)\" text-anchor=\"middle\">", top + ph / 2) +
         escaped(chart.y_label) + "</text>\n";
  return svg + "</svg>\n";
}

std::string smith_chart_svg(const std::string& title, Real reference_ohm, const std::vector<SmithSeries>& series) {
  const Real cx = 300, cy = 236, radius = 180;
  auto px = [&](Complex g) { return text_of("%.2f,%.2f", cx + radius * g.real(), cy - radius * g.imag()); };
  std::string svg = header(title);
  svg += text_of("<defs><clipPath id=\"disc\"><circle cx=\"%.1f\" cy=\"%.1f\" r=\"%.1f\"/></clipPath></defs>\n", cx, cy, radius);
  // Constant resistance r: circle centre (r/(1+r), 0), radius 1/(1+r).
  for (Real r : {0.2, 0.5, 1.0, 2.0, 5.0}) {
    svg += text_of("<circle cx=\"%.2f\" cy=\"%.2f\" r=\"%.2f\" fill=\"none\" stroke=\"#cccccc\"/>\n",
                   cx + radius * r / (1 + r), cy, radius / (1 + r));
    svg += text_of("<text x=\"%.1f\" y=\"%.1f\" font-size=\"10\" fill=\"#777777\">%g</text>\n",
                   cx + radius * (r - 1) / (r + 1) + 2, cy - 3, r * reference_ohm);
  }
  // Constant reactance x: circle centre (1, 1/x), radius 1/|x|, clipped to the unit disc.
  for (Real x : {0.2, 0.5, 1.0, 2.0, 5.0})
    for (Real sign : {1.0, -1.0}) {
      svg += text_of("<circle clip-path=\"url(#disc)\" cx=\"%.2f\" cy=\"%.2f\" r=\"%.2f\" fill=\"none\" stroke=\"#cccccc\"/>\n",
                     cx + radius, cy - sign * radius / x, radius / x);
      const Complex z(0.0, sign * x), g = (z - 1.0) / (z + 1.0);
      svg += text_of("<text x=\"%.1f\" y=\"%.1f\" font-size=\"10\" fill=\"#777777\" text-anchor=\"middle\">%+gj</text>\n",
                     cx + 1.08 * radius * g.real(), cy - 1.08 * radius * g.imag() + 4, sign * x * reference_ohm);
    }
  svg += text_of("<line x1=\"%.1f\" y1=\"%.1f\" x2=\"%.1f\" y2=\"%.1f\" stroke=\"#cccccc\"/>\n", cx - radius, cy, cx + radius, cy);
  svg += text_of("<circle cx=\"%.1f\" cy=\"%.1f\" r=\"%.1f\" fill=\"none\" stroke=\"#333333\"/>\n", cx, cy, radius);
  // VSWR 2 circle: |Γ| = 1/3.
  svg += text_of("<circle cx=\"%.1f\" cy=\"%.1f\" r=\"%.1f\" fill=\"none\" stroke=\"#888888\" stroke-dasharray=\"6 4\"/>\n", cx,
                 cy, radius / 3);
  svg += text_of("<text x=\"%.1f\" y=\"%.1f\" font-size=\"11\" fill=\"#555555\">VSWR 2</text>\n", cx + radius / 3 * 0.72,
                 cy + radius / 3 * 0.72 + 12);
  for (std::size_t i = 0; i < series.size(); ++i) {
    const auto& s = series[i];
    if (s.reflection.empty()) continue;
    std::string points;
    for (const Complex& g : s.reflection) points += px(g) + " ";
    svg += "<polyline fill=\"none\" stroke-width=\"2\" stroke=\"" + s.colour + "\"" +
           (s.dashed ? " stroke-dasharray=\"7 4\"" : "") + " points=\"" + points + "\"/>\n";
    const Complex a = s.reflection.front(), b = s.reflection.back();
    svg += text_of("<circle cx=\"%.2f\" cy=\"%.2f\" r=\"4\" fill=\"", cx + radius * a.real(), cy - radius * a.imag()) +
           s.colour + "\"/>\n";
    svg += text_of("<rect x=\"%.2f\" y=\"%.2f\" width=\"8\" height=\"8\" fill=\"", cx + radius * b.real() - 4,
                   cy - radius * b.imag() - 4) + s.colour + "\"/>\n";
    const Real y = top + 30 + 20 * i;
    svg += text_of("<line x1=\"520\" y1=\"%.1f\" x2=\"548\" y2=\"%.1f\" stroke-width=\"2\" stroke=\"", y, y) + s.colour + "\"" +
           (s.dashed ? " stroke-dasharray=\"7 4\"" : "") + "/>\n";
    svg += text_of("<text x=\"554\" y=\"%.1f\">", y + 4) + escaped(s.label) + "</text>\n";
  }
  svg += text_of("<text x=\"520\" y=\"%.1f\" font-size=\"11\" fill=\"#555555\">circle: first frequency, square: last</text>\n",
                 top + 30 + 20 * series.size() + 6);
  svg += text_of("<text x=\"520\" y=\"%.1f\" font-size=\"11\" fill=\"#555555\">labels in ohm (reference %g ohm)</text>\n",
                 top + 30 + 20 * series.size() + 22, reference_ohm);
  return svg + "</svg>\n";
}

std::string polar_chart_svg(const std::string& title, Real floor_db, Real ceiling_db, const std::vector<PolarSeries>& series) {
  const Real cx = 300, cy = 240, radius = 175, pi = 3.14159265358979323846;
  auto scaled = [&](Real db) { return radius * std::clamp((db - floor_db) / (ceiling_db - floor_db), 0.0, 1.0); };
  std::string svg = header(title);
  for (Real ring : ticks(floor_db, ceiling_db)) {
    svg += text_of("<circle cx=\"%.1f\" cy=\"%.1f\" r=\"%.1f\" fill=\"none\" stroke=\"#dddddd\"/>\n", cx, cy, scaled(ring));
    svg += text_of("<text x=\"%.1f\" y=\"%.1f\" font-size=\"10\" fill=\"#777777\">%g dBi</text>\n", cx + 3,
                   cy - scaled(ring) + 11, ring);
  }
  for (int a = 0; a < 360; a += 30) {
    const Real r = a * pi / 180;
    svg += text_of("<line x1=\"%.1f\" y1=\"%.1f\" x2=\"%.1f\" y2=\"%.1f\" stroke=\"#dddddd\"/>\n", cx, cy,
                   cx + radius * std::sin(r), cy - radius * std::cos(r));
    svg += text_of("<text x=\"%.1f\" y=\"%.1f\" font-size=\"11\" text-anchor=\"middle\">%d&#176;</text>\n",
                   cx + (radius + 16) * std::sin(r), cy - (radius + 16) * std::cos(r) + 4, a <= 180 ? a : a - 360);
  }
  svg += text_of("<circle cx=\"%.1f\" cy=\"%.1f\" r=\"%.1f\" fill=\"none\" stroke=\"#333333\"/>\n", cx, cy, radius);
  for (std::size_t i = 0; i < series.size(); ++i) {
    const auto& s = series[i];
    std::string points;
    for (std::size_t k = 0; k < s.angle_deg.size(); ++k) {
      const Real r = s.angle_deg[k] * pi / 180, d = scaled(s.value_db[k]);
      points += text_of("%.2f,%.2f ", cx + d * std::sin(r), cy - d * std::cos(r));
    }
    svg += "<polyline fill=\"none\" stroke-width=\"2\" stroke=\"" + s.colour + "\"" +
           (s.dashed ? " stroke-dasharray=\"7 4\"" : "") + " points=\"" + points + "\"/>\n";
    const Real y = top + 30 + 20 * i;
    svg += text_of("<line x1=\"520\" y1=\"%.1f\" x2=\"548\" y2=\"%.1f\" stroke-width=\"2\" stroke=\"", y, y) + s.colour +
           "\"" + (s.dashed ? " stroke-dasharray=\"7 4\"" : "") + "/>\n";
    svg += text_of("<text x=\"554\" y=\"%.1f\">", y + 4) + escaped(s.label) + "</text>\n";
  }
  svg += text_of("<text x=\"520\" y=\"%.1f\" font-size=\"11\" fill=\"#555555\">0&#176; is +z (zenith)</text>\n",
                 top + 30 + 20 * series.size() + 6);
  return svg + "</svg>\n";
}

}  // namespace lobe
