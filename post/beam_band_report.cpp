#include "post/beam_band_report.hpp"

#include <algorithm>
#include <stdexcept>

#include "core/constants.hpp"

#include "post/beam_figures.hpp"
#include "post/frequency_result.hpp"

namespace lobe {

const std::vector<BeamFigureKind>& beam_figure_kinds() {
  static const std::vector<BeamFigureKind> kinds{
      {"gain", "gain_dbi", "peak gain", "dBi", true},
      {"realized-gain", "realized_gain_dbi", "peak realized gain", "dBi", true},
      {"efficiency", "efficiency_percent", "radiation efficiency", "%", true},
      {"front-to-back", "front_to_back_db", "front-to-back ratio", "dB", true},
      {"front-to-side", "front_to_side_db", "front-to-side ratio", "dB", true},
      {"beamwidth-theta", "beamwidth_theta_deg", "half-power beamwidth along theta", "deg", false},
      {"beamwidth-phi", "beamwidth_phi_deg", "half-power beamwidth along phi", "deg", false},
      {"axial-ratio", "axial_ratio_db", "axial ratio", "dB", false},
      {"rhcp-gain", "rhcp_dbi", "RHCP gain", "dBi", true},
      {"lhcp-gain", "lhcp_dbi", "LHCP gain", "dBi", true},
      {"cross-polar", "cross_polar_discrimination_db", "circular cross-polar discrimination", "dB", true},
  };
  return kinds;
}

BeamCurves beam_curves(const std::vector<FrequencyResult>& results) {
  BeamCurves curves;
  auto& v = curves.values;
  for (const auto& r : results) {
    curves.frequency_hz.push_back(r.frequency_hz);
    curves.peak_theta_deg.push_back(r.beam.peak.theta * 180 / pi);
    curves.peak_phi_deg.push_back(r.beam.peak.phi * 180 / pi);
    v["gain"].push_back(r.beam.gain_dbi);
    v["realized-gain"].push_back(r.beam.realized_gain_dbi);
    v["efficiency"].push_back(100.0 * r.power.efficiency());
    v["front-to-back"].push_back(r.beam.front_to_back_db);
    v["front-to-side"].push_back(r.beam.front_to_side_db);
    v["beamwidth-theta"].push_back(r.beam.beamwidth_theta_deg);
    v["beamwidth-phi"].push_back(r.beam.beamwidth_phi_deg);
    v["axial-ratio"].push_back(r.polarization.axial_ratio_db);
    v["rhcp-gain"].push_back(r.polarization.rhcp_dbi);
    v["lhcp-gain"].push_back(r.polarization.lhcp_dbi);
    v["cross-polar"].push_back(r.polarization.cross_polar_discrimination_db);
  }
  return curves;
}

std::map<std::string, BandFigure> beam_band_report(const BeamCurves& curves, Real low_hz, Real high_hz) {
  const auto& f = curves.frequency_hz;
  if (f.empty() || !std::is_sorted(f.begin(), f.end()))
    throw std::invalid_argument("band figures need values at ascending frequencies");
  const Real low = std::max(low_hz, f.front()), high = std::min(high_hz, f.back());
  if (low > high) throw std::invalid_argument("the band lies outside the frequencies of the curves");
  std::map<std::string, BandFigure> report;
  for (const auto& kind : beam_figure_kinds()) {
    const auto found = curves.values.find(kind.name);
    if (found == curves.values.end()) continue;
    const auto& values = found->second;
    // The value at x, linear between the neighbouring samples; none when either is undefined.
    auto at = [&](Real x) -> std::optional<Real> {
      const std::size_t i = std::lower_bound(f.begin(), f.end(), x) - f.begin();
      if (i == f.size()) return values.back();
      if (i == 0 || f[i] == x) return values[i];
      const auto a = values[i - 1], b = values[i];
      if (!a || !b) return std::nullopt;
      // "No half-power point" is no width to interpolate toward.
      if (kind.unit == "deg" && std::max(*a, *b) >= no_half_power_deg) return no_half_power_deg;
      const Real t = (x - f[i - 1]) / (f[i] - f[i - 1]);
      return (1 - t) * *a + t * *b;
    };
    std::vector<std::pair<Real, std::optional<Real>>> counted{{low, at(low)}, {high, at(high)}};
    for (std::size_t i = 0; i < f.size(); ++i)
      if (f[i] > low && f[i] < high) counted.emplace_back(f[i], values[i]);
    const auto centre = at(std::clamp(0.5 * (low_hz + high_hz), low, high));
    if (!centre || std::any_of(counted.begin(), counted.end(), [](const auto& c) { return !c.second; })) continue;
    BandFigure figure{*centre, *counted.front().second, counted.front().first, *counted.front().second, counted.front().first};
    for (const auto& [hz, value] : counted) {
      if (kind.larger_is_better ? *value < figure.worst : *value > figure.worst) figure.worst = *value, figure.worst_hz = hz;
      if (kind.larger_is_better ? *value > figure.best : *value < figure.best) figure.best = *value, figure.best_hz = hz;
    }
    report[kind.name] = figure;
  }
  return report;
}

}  // namespace lobe
