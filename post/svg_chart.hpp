#pragma once
/// Small, dependency-free SVG figures: line charts against frequency and the Smith chart.
#include <optional>
#include <string>
#include <vector>

#include "core/types.hpp"

namespace lobe {

/// How a curve is drawn, so that curves stay told apart in grey print and where they overlap
/// (one port's curve over another's): a colour, an SVG dash pattern (empty: solid) and a
/// marker repeated along it ("circle", "square", "triangle", "diamond"; empty: none).
struct CurveStyle {
  std::string colour = "#1f4e9c";
  std::string dash;
  std::string marker;
};

/// The style of the index-th of several like curves (ports, frequencies): each differs from
/// the others in colour, dash and marker alike.
CurveStyle series_style(std::size_t index);

struct ChartSeries {
  std::string label;
  std::vector<Real> x, y;
  CurveStyle style;
};

/// A shaded stretch of the x axis (a band), labelled at its top.
struct ChartShade {
  Real low = 0.0, high = 0.0;
  std::string label;
};

struct LineChart {
  std::string title, x_label, y_label;
  std::vector<ChartSeries> series;
  std::vector<ChartShade> shades;
  std::optional<Real> y_min, y_max;        ///< fixed limits; otherwise from the data
  std::vector<std::pair<Real, std::string>> guides;  ///< horizontal reference lines (e.g. VSWR 2)
};

/// The chart as a standalone SVG document (720 × 440, axes with round-number ticks, a
/// legend sized to its labels, shaded bands, dashed guides). The axes hold every point of
/// every curve unless y limits are fixed; then a note under the plot names the curves that
/// run beyond them.
std::string line_chart_svg(const LineChart& chart);

struct SmithSeries {
  std::string label;
  std::vector<Complex> reflection;
  CurveStyle style;
  /// Points to label (a frequency, "433.05 MHz"), by index into `reflection`.
  std::vector<std::pair<std::size_t, std::string>> point_labels;
};

/// A labelled point that is not a sample, such as a band edge on a curve.
struct SmithMark {
  Complex reflection;
  std::string label;
  std::string colour = "#7a5c00";
};

/// A Smith chart (circles of constant normalised resistance 0, 0.2, 0.5, 1, 2, 5 and arcs of
/// constant reactance ±0.2, ±0.5, ±1, ±2, ±5) with each curve of reflections, its first
/// point marked by a circle and its last by a square, its labelled points and the marks.
std::string smith_chart_svg(const std::string& title, Real reference_ohm, const std::vector<SmithSeries>& series,
                            const std::vector<SmithMark>& marks = {});

/// A polar cut: angles in degrees from the top (θ from +z), radius in dB from `floor_db`
/// at the centre to `ceiling_db` at the rim.
struct PolarSeries {
  std::string label;
  std::vector<Real> angle_deg, value_db;
  CurveStyle style;
};
/// `unit` labels the rings ("dBi"); `orientation` says what 0° is ("0° is +z (zenith)").
std::string polar_chart_svg(const std::string& title, Real floor_db, Real ceiling_db, const std::vector<PolarSeries>& series,
                            const std::string& unit = "dBi", const std::string& orientation = "0\u00b0 is +z (zenith)");

/// A grid of one figure over two varied names: values[row][column], NaN where there is no
/// case. Colours run from dark (worst) to bright yellow (best); values on the worse side
/// of `colour_limit` take the worst colour, so one very bad case does not wash out the rest.
struct HeatMap {
  std::string title, x_label, y_label, value_label;
  std::vector<std::string> x_ticks, y_ticks;  ///< one per column, one per row (bottom row first)
  std::vector<std::vector<Real>> values;
  bool larger_is_better = false;
  std::optional<Real> colour_limit;
  std::string note;  ///< a line under the title, e.g. which values the other names are held at
};

/// The heat map as a standalone SVG document: cells with their values written in when they
/// fit, the best cell outlined, a colour bar with its scale.
std::string heat_map_svg(const HeatMap& map);

/// `text` with <, >, & and " written as entities, for SVG and HTML alike (attributes are
/// always double-quoted, so an apostrophe stays as it is).
std::string xml_escaped(const std::string& text);

/// Colours for successive series, distinguishable in print and for common colour blindness.
const std::string& series_colour(std::size_t index);

}  // namespace lobe
