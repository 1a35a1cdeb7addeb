#include "post/result_figures.hpp"

#include <algorithm>
#include <cmath>

#include "core/formatted_text.hpp"
#include "post/beam_figures.hpp"
#include "post/polarization.hpp"
#include "post/port_quantities.hpp"
#include "post/result_reader.hpp"
#include "post/run_summary.hpp"
#include "post/svg_chart.hpp"

namespace lobe {
namespace {

/// Index of the value in `values` nearest to `x`.
std::size_t nearest(const std::vector<Real>& values, Real x) {
  std::size_t best = 0;
  for (std::size_t i = 1; i < values.size(); ++i)
    if (std::abs(values[i] - x) < std::abs(values[best] - x)) best = i;
  return best;
}

/// The angle `a` (degrees) folded into [0, 360).
Real turned(Real a) { return std::fmod(std::fmod(a, 360.0) + 360.0, 360.0); }

/// The grid column nearest the azimuth `phi` (degrees), or none when it is not within half
/// a step of the grid's own values.
std::optional<std::size_t> phi_column(const std::vector<Real>& phis, Real phi) {
  std::size_t best = 0;
  Real best_gap = 1e9;
  for (std::size_t i = 0; i < phis.size(); ++i) {
    const Real gap = std::abs(turned(phis[i] - phi + 180.0) - 180.0);
    if (gap < best_gap) best_gap = gap, best = i;
  }
  const Real step = phis.size() > 1 ? std::abs(phis[1] - phis[0]) : 360.0;
  if (best_gap > 0.5 * step + 1e-9) return std::nullopt;
  return best;
}

/// Γ of a curve at f, linear between samples.
Complex reflection_at(const std::vector<Real>& f, const std::vector<Complex>& gamma, Real x) {
  const std::size_t i = std::min<std::size_t>(std::upper_bound(f.begin(), f.end(), x) - f.begin(), f.size() - 1);
  if (i == 0) return gamma.front();
  const Real t = std::clamp((x - f[i - 1]) / (f[i] - f[i - 1]), 0.0, 1.0);
  return (1 - t) * gamma[i - 1] + t * gamma[i];
}

/// One quantity of the pattern table (gain, RHCP or LHCP) at frequency index f.
struct PatternQuantity {
  const std::vector<Real>* values;
  std::string name;
};

/// A cut through the pattern grid: in the vertical plane of azimuth `phi` (θ on the right
/// half, the opposite azimuth on the left when the grid holds it), or around the cone of
/// polar angle at theta index `cone` (φ as the angle).
struct Cut {
  bool vertical = true;
  std::size_t column = 0, opposite = 0;  ///< vertical: the grid's φ columns
  bool has_opposite = false;
  std::size_t cone = 0;  ///< conical: the θ row
};

PolarSeries cut_series(const PatternData& d, const Cut& cut, std::size_t f, const PatternQuantity& q, const CurveStyle& style,
                       const std::string& label) {
  PolarSeries s{label, {}, {}, style};
  if (cut.vertical) {
    for (std::size_t t = 0; t < d.theta_deg.size(); ++t)
      s.angle_deg.push_back(d.theta_deg[t]), s.value_db.push_back((*q.values)[d.at(f, t, cut.column)]);
    if (cut.has_opposite)
      for (std::size_t t = d.theta_deg.size(); t-- > 0;)
        s.angle_deg.push_back(360 - d.theta_deg[t]), s.value_db.push_back((*q.values)[d.at(f, t, cut.opposite)]);
  } else {
    for (std::size_t p = 0; p < d.phi_deg.size(); ++p)
      s.angle_deg.push_back(d.phi_deg[p]), s.value_db.push_back((*q.values)[d.at(f, cut.cone, p)]);
  }
  return s;
}

/// The computed frequencies a pattern is drawn at: the first band's low edge, centre and
/// high edge (the nearest computed ones), else the lowest, middle and highest; distinct.
std::vector<std::size_t> pattern_frequencies(const std::vector<Real>& f, const std::vector<Band>& bands) {
  std::vector<std::size_t> chosen;
  if (bands.empty())
    chosen = {0, f.size() / 2, f.size() - 1};
  else
    chosen = {nearest(f, bands.front().low_hz), nearest(f, 0.5 * (bands.front().low_hz + bands.front().high_hz)),
              nearest(f, bands.front().high_hz)};
  std::vector<std::size_t> distinct;
  for (std::size_t i : chosen)
    if (std::find(distinct.begin(), distinct.end(), i) == distinct.end()) distinct.push_back(i);
  return distinct;
}

}  // namespace

ResultFigures antenna_figures(const std::filesystem::path& result, const std::vector<Band>& extra_bands,
                              const std::optional<MeasuredCurve>& measured) {
  ResultFigures out;
  const std::string model = result.stem().string();
  const NetworkData network = read_result_network(result);
  const std::vector<std::string> names = read_result_port_names(result);
  std::vector<Band> bands = read_result_bands(result);
  bands.insert(bands.end(), extra_bands.begin(), extra_bands.end());

  const bool gigahertz = network.frequency_hz.back() >= 1e9;
  const Real unit = gigahertz ? 1e9 : 1e6;
  const std::string axis = gigahertz ? "frequency (GHz)" : "frequency (MHz)";
  LineChart vswr{model + ": VSWR", axis, "VSWR", {}, {}, 1.0, std::nullopt, {{2.0, "VSWR 2"}}};
  LineChart loss{model + ": return loss", axis, "return loss (dB)", {}, {}, 0.0, std::nullopt, {{10.0, "10 dB"}}};
  std::vector<SmithSeries> smith;
  std::vector<SmithMark> marks;
  Real highest_vswr = 2.0;
  auto add = [&](const std::string& label, const std::vector<Real>& f, const std::vector<Complex>& gamma,
                 const CurveStyle& style, bool phase_known) {
    ChartSeries v{label, {}, {}, style}, l = v;
    for (std::size_t k = 0; k < f.size(); ++k) {
      const Real g = std::abs(gamma[k]);
      v.x.push_back(f[k] / unit), v.y.push_back(vswr_from_reflection(g));
      l.x.push_back(f[k] / unit), l.y.push_back(std::min(return_loss_db(g), 60.0));
      highest_vswr = std::max(highest_vswr, v.y.back());
    }
    vswr.series.push_back(v);
    loss.series.push_back(l);
    if (phase_known)
      smith.push_back({label, gamma, style, {{0, frequency_text(f.front())}, {f.size() - 1, frequency_text(f.back())}}});
  };
  for (int p = 0; p < network.ports(); ++p) {
    std::vector<Complex> gamma;
    for (const auto& s : network.s) gamma.push_back(s(p, p));
    add("simulated, port " + names[p], network.frequency_hz, gamma, series_style(p), true);
    if (p == 0 && !bands.empty())
      for (Real edge : {bands.front().low_hz, bands.front().high_hz})
        if (edge >= network.frequency_hz.front() && edge <= network.frequency_hz.back())
          marks.push_back({reflection_at(network.frequency_hz, gamma, edge), bands.front().name + " " + frequency_text(edge)});
  }
  if (measured)
    add("measured (" + measured->quantity + ")", measured->curve.frequency_hz, measured->curve.reflection,
        {"#333333", "3 3", ""}, measured->phase_known);
  // Up to VSWR 10 (beyond, a note names the curves that leave the axis).
  vswr.y_max = std::min(highest_vswr * 1.05, 10.0);
  for (const auto& b : bands) {
    vswr.shades.push_back({b.low_hz / unit, b.high_hz / unit, b.name});
    loss.shades.push_back(vswr.shades.back());
  }
  out.figures.push_back({"vswr", line_chart_svg(vswr)});
  out.figures.push_back({"return_loss", line_chart_svg(loss)});
  out.figures.push_back({"smith", smith_chart_svg(model + ": impedance (Smith chart)", network.reference_ohm, smith, marks)});

  // Pattern cuts through the main beam at the band's edges and centre.
  const PatternData pattern = read_result_pattern(result);
  const BeamCurves beam = read_result_beam(result);
  const auto& axial = beam.values.at("axial-ratio");
  const bool circular = std::any_of(axial.begin(), axial.end(),
                                    [](const std::optional<Real>& a) { return a && *a < linear_axial_ratio_db; });
  const std::vector<std::size_t> at = pattern_frequencies(pattern.frequency_hz, bands);
  const std::size_t centre = at.size() > 1 ? at[1] : at[0];
  const Real beam_theta = beam.peak_theta_deg[centre], beam_phi = beam.peak_phi_deg[centre];
  const bool near_axis = beam_theta < zenith_beam_limit_deg || beam_theta > 180 - zenith_beam_limit_deg;
  auto draw = [&](const Cut& cut, const std::string& name, const std::string& title, const std::string& orientation) {
    std::vector<PolarSeries> series;
    for (std::size_t k = 0; k < at.size(); ++k)
      series.push_back(cut_series(pattern, cut, at[k], {&pattern.gain_dbi, "gain"}, series_style(k),
                                  "gain, " + frequency_text(pattern.frequency_hz[at[k]])));
    if (circular) {
      const std::string when = ", " + frequency_text(pattern.frequency_hz[centre]);
      series.push_back(cut_series(pattern, cut, centre, {&pattern.rhcp_dbi, "RHCP"}, {"#e08a00", "", "diamond"}, "RHCP" + when));
      series.push_back(cut_series(pattern, cut, centre, {&pattern.lhcp_dbi, "LHCP"}, {"#8a4fbf", "6 3", "circle"}, "LHCP" + when));
    }
    Real peak = -1e9;
    for (const auto& s : series)
      for (Real v : s.value_db) peak = std::max(peak, v);
    const Real ceiling = 5 * std::ceil(peak / 5);
    out.figures.push_back({name, polar_chart_svg(model + ": " + title, ceiling - 40, ceiling, series, "dBi", orientation)});
  };
  auto vertical_cut = [&](Real phi, const std::string& name, const std::string& what) {
    const auto column = phi_column(pattern.phi_deg, phi);
    if (pattern.theta_deg.size() < 2 || !column) {
      out.notes.push_back("no vertical cut " + what + ": the pattern grid does not hold that plane (widen its theta or phi range)");
      return;
    }
    Cut cut{true, *column, 0, false, 0};
    if (const auto opposite = phi_column(pattern.phi_deg, phi + 180); opposite && *opposite != *column)
      cut.opposite = *opposite, cut.has_opposite = true;
    draw(cut, name, formatted("gain in the vertical plane phi = %g deg", pattern.phi_deg[*column]) +
                        (cut.has_opposite ? formatted(" and %g deg", pattern.phi_deg[cut.opposite]) : std::string()) + " (" +
                        what + ")",
         "0\u00b0 is +z (zenith)");
  };
  vertical_cut(beam_phi, "pattern_vertical", "through the main beam");
  if (near_axis) {
    vertical_cut(beam_phi + 90, "pattern_vertical_across", "the other principal plane, across the beam");
  } else if (pattern.phi_deg.size() < 2) {
    out.notes.push_back("no horizontal cut: the pattern grid holds one azimuth (widen its phi range)");
  } else {
    const std::size_t row = nearest(pattern.theta_deg, beam_theta);
    const Real theta = pattern.theta_deg[row];
    draw({false, 0, 0, false, row}, "pattern_horizontal",
         std::abs(theta - 90) < 1e-9 ? std::string("gain around the horizon (theta = 90 deg)")
                                     : formatted("gain around the cone theta = %g deg, through the main beam", theta),
         "0\u00b0 is +x, 90\u00b0 is +y");
  }

  // The axial ratio only where the antenna is meant to be circular.
  if (circular) {
    LineChart chart{model + ": axial ratio where the polarisation is judged", axis, "axial ratio (dB)", {}, vswr.shades, 0.0,
                    std::nullopt, {{3.0, "3 dB"}}};
    ChartSeries ratio{"axial ratio", {}, {}, series_style(0)};
    for (std::size_t k = 0; k < beam.frequency_hz.size(); ++k) {
      ratio.x.push_back(beam.frequency_hz[k] / unit);
      ratio.y.push_back(std::min(axial[k].value_or(axial_ratio_ceiling_db), linear_axial_ratio_db));
    }
    chart.y_max = std::max(6.0, *std::max_element(ratio.y.begin(), ratio.y.end()) * 1.05);
    chart.series.push_back(ratio);
    out.figures.push_back({"axial_ratio", line_chart_svg(chart)});
  } else {
    out.notes.push_back("no axial-ratio chart: the antenna is linearly polarised (axial ratio above " +
                        formatted("%.0f", linear_axial_ratio_db) + " dB at every frequency)");
  }
  return out;
}

ResultFigures scattering_figures(const std::filesystem::path& result) {
  ResultFigures out;
  const std::string model = result.stem().string();
  const RcsData d = read_result_rcs(result);
  auto dbsm = [](Real m2) { return 10 * std::log10(std::max(m2, 1e-30)); };
  const bool gigahertz = d.frequency_hz.back() >= 1e9;
  const Real unit = gigahertz ? 1e9 : 1e6;
  LineChart mono{model + ": monostatic radar cross-section", gigahertz ? "frequency (GHz)" : "frequency (MHz)", "RCS (dBsm)",
                 {}, {}, std::nullopt, std::nullopt, {}};
  ChartSeries s{"monostatic RCS", {}, {}, series_style(0)};
  for (std::size_t k = 0; k < d.frequency_hz.size(); ++k) s.x.push_back(d.frequency_hz[k] / unit), s.y.push_back(dbsm(d.monostatic_m2[k]));
  mono.series.push_back(s);
  out.figures.push_back({"rcs_monostatic", line_chart_svg(mono)});

  // The bistatic cut in the vertical plane of the wave's azimuth, at the middle frequency.
  const std::size_t f = d.frequency_hz.size() / 2;
  PatternData grid;
  grid.frequency_hz = d.frequency_hz, grid.theta_deg = d.theta_deg, grid.phi_deg = d.phi_deg;
  std::vector<Real> values;
  for (Real m2 : d.rcs_m2) values.push_back(dbsm(m2));
  const auto column = phi_column(d.phi_deg, d.wave_phi_deg);
  Cut cut;
  std::string title;
  if (d.theta_deg.size() >= 2 && column) {
    cut = {true, *column, 0, false, 0};
    if (const auto opposite = phi_column(d.phi_deg, d.wave_phi_deg + 180); opposite && *opposite != *column)
      cut.opposite = *opposite, cut.has_opposite = true;
    title = formatted("bistatic RCS in the vertical plane phi = %g deg", d.phi_deg[*column]);
  } else if (d.phi_deg.size() >= 2) {
    cut = {false, 0, 0, false, nearest(d.theta_deg, d.wave_theta_deg)};
    title = formatted("bistatic RCS around the cone theta = %g deg", d.theta_deg[cut.cone]);
  } else {
    out.notes.push_back("no bistatic cut: the pattern grid holds a single direction");
    return out;
  }
  const PolarSeries series = cut_series(grid, cut, f, {&values, "RCS"}, series_style(0), "RCS, " + frequency_text(d.frequency_hz[f]));
  const Real peak = *std::max_element(series.value_db.begin(), series.value_db.end());
  const Real ceiling = 5 * std::ceil(peak / 5);
  out.figures.push_back({"rcs_bistatic", polar_chart_svg(model + ": " + title + formatted(" (wave from theta %g, phi %g deg)",
                                                                                        d.wave_theta_deg, d.wave_phi_deg),
                                                         ceiling - 40, ceiling, {series}, "dBsm",
                                                         cut.vertical ? "0\u00b0 is +z (zenith)" : "0\u00b0 is +x, 90\u00b0 is +y")});
  return out;
}

}  // namespace lobe
