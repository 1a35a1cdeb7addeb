#include "post/band_report.hpp"

#include <algorithm>
#include <cmath>
#include <stdexcept>

#include "post/frequency_result.hpp"
#include "post/port_quantities.hpp"
#include "solver/gauss_legendre.hpp"

namespace lobe {
namespace {

/// |Γ| at 10 dB return loss.
const Real return_loss_10db_magnitude = std::pow(10.0, -0.5);
/// Gauss points per sample interval: |Γ| is linear there, VSWR and mismatch loss smooth.
constexpr int points_per_interval = 8;

struct LinearMagnitude {
  const ReflectionCurve& curve;
  Real at(std::size_t i) const { return std::abs(curve.reflection[i]); }
  /// |Γ| at f on interval [i, i + 1].
  Real interpolate(std::size_t i, Real f) const {
    const Real f0 = curve.frequency_hz[i], f1 = curve.frequency_hz[i + 1];
    const Real t = f1 > f0 ? (f - f0) / (f1 - f0) : 0.0;
    return (1 - t) * at(i) + t * at(i + 1);
  }
  /// Frequency on interval [i, i + 1] where |Γ| equals g (assumes it is crossed there).
  Real crossing(std::size_t i, Real g) const {
    const Real f0 = curve.frequency_hz[i], f1 = curve.frequency_hz[i + 1];
    return f0 + (g - at(i)) / (at(i + 1) - at(i)) * (f1 - f0);
  }
};

}  // namespace

PortBandReport band_report(const ReflectionCurve& curve, Real low_hz, Real high_hz, Real vswr_threshold) {
  const auto& f = curve.frequency_hz;
  if (f.empty() || f.size() != curve.reflection.size() || !std::is_sorted(f.begin(), f.end()))
    throw std::invalid_argument("a band report needs reflections at ascending frequencies");
  PortBandReport report;
  report.vswr_threshold = vswr_threshold;
  report.covered_low_hz = std::max(low_hz, f.front());
  report.covered_high_hz = std::min(high_hz, f.back());
  if (report.covered_low_hz > report.covered_high_hz)
    throw std::invalid_argument("the band lies outside the frequencies of the curve");
  if (high_hz > low_hz) report.covered_share = (report.covered_high_hz - report.covered_low_hz) / (high_hz - low_hz);
  const LinearMagnitude magnitude{curve};
  const Real threshold = (vswr_threshold - 1) / (vswr_threshold + 1);

  // Extremes: at samples inside the band and at the (interpolated) band edges.
  bool first = true;
  auto consider = [&](Real frequency, Real g) {
    const Real vswr = vswr_from_reflection(g);
    if (first || vswr > report.highest_vswr.value) report.highest_vswr = {vswr, frequency};
    if (first || vswr < report.lowest_vswr.value) report.lowest_vswr = {vswr, frequency};
    first = false;
  };
  auto magnitude_at = [&](Real frequency) {
    if (f.size() == 1) return magnitude.at(0);
    const std::size_t i = std::min<std::size_t>(std::upper_bound(f.begin(), f.end(), frequency) - f.begin(), f.size() - 1);
    return magnitude.interpolate(i - 1, frequency);
  };
  consider(report.covered_low_hz, magnitude_at(report.covered_low_hz));
  for (std::size_t i = 0; i < f.size(); ++i)
    if (f[i] > report.covered_low_hz && f[i] < report.covered_high_hz) consider(f[i], magnitude.at(i));
  consider(report.covered_high_hz, magnitude_at(report.covered_high_hz));

  // Averages and the fraction within the threshold, interval by interval.
  const Real width = report.covered_high_hz - report.covered_low_hz;
  if (width == 0.0) {
    const Real g = magnitude_at(report.covered_low_hz);
    report.mean_vswr = vswr_from_reflection(g);
    report.mean_mismatch_loss_db = mismatch_loss_db(g);
    report.fraction_within = g <= threshold ? 1.0 : 0.0;
  } else {
    const QuadratureRule& rule = gauss_legendre(points_per_interval);
    Real vswr_sum = 0.0, loss_sum = 0.0, within = 0.0;
    for (std::size_t i = 0; i + 1 < f.size(); ++i) {
      const Real a = std::max(f[i], report.covered_low_hz), b = std::min(f[i + 1], report.covered_high_hz);
      if (!(b > a)) continue;
      for (int q = 0; q < points_per_interval; ++q) {
        const Real x = a + (b - a) * rule.nodes[q], g = magnitude.interpolate(i, x);
        vswr_sum += (b - a) * rule.weights[q] * vswr_from_reflection(g);
        loss_sum += (b - a) * rule.weights[q] * mismatch_loss_db(g);
      }
      // |Γ| is linear on [a, b]: the part below the threshold is one piece.
      const Real ga = magnitude.interpolate(i, a), gb = magnitude.interpolate(i, b);
      if (ga <= threshold && gb <= threshold) within += b - a;
      else if (ga <= threshold || gb <= threshold) {
        const Real cross = a + (threshold - ga) / (gb - ga) * (b - a);
        within += ga <= threshold ? cross - a : b - cross;
      }
    }
    report.mean_vswr = vswr_sum / width;
    report.mean_mismatch_loss_db = loss_sum / width;
    report.fraction_within = within / width;
  }

  // The −10 dB stretch around the best match, over the whole curve.
  const Real best_hz = report.lowest_vswr.frequency_hz;
  const Real best = (report.lowest_vswr.value - 1) / (report.lowest_vswr.value + 1);
  if (best <= return_loss_10db_magnitude && f.size() > 1) {
    const Real limit = return_loss_10db_magnitude;
    const std::size_t n = f.size();
    // Samples at or below and at or above the best point (the same one when it is a sample).
    std::size_t k = std::upper_bound(f.begin(), f.end(), best_hz) - f.begin() - 1;
    std::size_t m = std::lower_bound(f.begin(), f.end(), best_hz) - f.begin();
    PortBandReport::Stretch stretch;
    if (magnitude.at(k) > limit) stretch.low_hz = magnitude.crossing(k, limit);
    else {
      while (k > 0 && magnitude.at(k - 1) <= limit) --k;
      stretch.open_low = k == 0;
      stretch.low_hz = k == 0 ? f.front() : magnitude.crossing(k - 1, limit);
    }
    if (magnitude.at(m) > limit) stretch.high_hz = magnitude.crossing(m - 1, limit);
    else {
      while (m + 1 < n && magnitude.at(m + 1) <= limit) ++m;
      stretch.open_high = m + 1 == n;
      stretch.high_hz = m + 1 == n ? f.back() : magnitude.crossing(m, limit);
    }
    report.return_loss_10db = stretch;
  }
  return report;
}

Band all_frequencies_band(Real lowest_hz, Real highest_hz) { return {"all computed frequencies", lowest_hz, highest_hz}; }

Band default_band(const std::vector<Band>& bands, Real lowest_hz, Real highest_hz) {
  return bands.empty() ? all_frequencies_band(lowest_hz, highest_hz) : bands.front();
}

const std::vector<std::string>& port_figure_names() {
  static const std::vector<std::string> names{"worst-vswr", "mean-vswr", "mean-mismatch-loss", "share-under-vswr-2"};
  return names;
}

Real band_figure(const PortBandReport& report, const std::string& name) {
  if (name == "worst-vswr") return report.highest_vswr.value;
  if (name == "mean-vswr") return report.mean_vswr;
  if (name == "mean-mismatch-loss") return report.mean_mismatch_loss_db;
  if (name == "share-under-vswr-2") return report.fraction_within;
  throw std::invalid_argument("unknown band figure '" + name + "'");
}

BandFigures band_figures(const ReflectionCurve& port, const BeamCurves& beam, Real low_hz, Real high_hz) {
  return {band_report(port, low_hz, high_hz), beam_band_report(beam, low_hz, high_hz)};
}

ReflectionCurve port_reflection_curve(const std::vector<FrequencyResult>& results, std::size_t port) {
  ReflectionCurve curve;
  for (const auto& r : results) curve.frequency_hz.push_back(r.frequency_hz), curve.reflection.push_back(r.ports[port].reflection);
  return curve;
}

std::optional<std::vector<BandFigures>> run_band_figures(const std::vector<FrequencyResult>& results, std::size_t ports,
                                                         const Band& band) {
  if (results.empty() || results.front().frequency_hz > band.high_hz || results.back().frequency_hz < band.low_hz)
    return std::nullopt;
  const BeamCurves beam = beam_curves(results);
  std::vector<BandFigures> figures;
  for (std::size_t p = 0; p < ports; ++p)
    figures.push_back(band_figures(port_reflection_curve(results, p), beam, band.low_hz, band.high_hz));
  return figures;
}

namespace {

/// The beam figure kind behind "centre-X" or "worst-X", and whether it is the centre's.
std::optional<std::pair<const BeamFigureKind*, bool>> beam_figure_of(const std::string& name) {
  for (const auto& kind : beam_figure_kinds()) {
    if (name == "centre-" + kind.name) return std::pair{&kind, true};
    if (name == "worst-" + kind.name) return std::pair{&kind, false};
  }
  return std::nullopt;
}

}  // namespace

const std::vector<std::string>& band_figure_names() {
  static const std::vector<std::string> names = [] {
    std::vector<std::string> all = port_figure_names();
    for (const auto& kind : beam_figure_kinds()) {
      all.push_back("centre-" + kind.name);
      all.push_back("worst-" + kind.name);
    }
    return all;
  }();
  return names;
}

bool is_beam_figure(const std::string& name) { return beam_figure_of(name).has_value(); }

std::optional<Real> band_figure(const BandFigures& figures, const std::string& name) {
  const auto beam = beam_figure_of(name);
  if (!beam) return band_figure(figures.port, name);
  const auto found = figures.beam.find(beam->first->name);
  if (found == figures.beam.end()) return std::nullopt;
  return beam->second ? found->second.centre : found->second.worst;
}

bool larger_is_better(const std::string& figure_name) {
  if (const auto beam = beam_figure_of(figure_name)) return beam->first->larger_is_better;
  return figure_name == "share-under-vswr-2";
}

std::string band_figure_title(const std::string& name) {
  if (const auto beam = beam_figure_of(name)) {
    const BeamFigureKind& kind = *beam->first;
    const std::string worst = kind.larger_is_better ? "lowest" : kind.unit == "deg" ? "widest" : "highest";
    return (beam->second ? "centre" : worst) + " " + kind.title + " (" + kind.unit + ")";
  }
  if (name == "worst-vswr") return "worst VSWR";
  if (name == "mean-vswr") return "mean VSWR";
  if (name == "mean-mismatch-loss") return "mean mismatch loss (dB)";
  if (name == "share-under-vswr-2") return "share of the band with VSWR <= 2";
  throw std::invalid_argument("unknown band figure '" + name + "'");
}

}  // namespace lobe
