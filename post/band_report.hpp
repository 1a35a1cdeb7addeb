#pragma once
/// Honest figures over a whole band: extremes and frequency averages of a port's match,
/// not its single best point.
#include <map>
#include <optional>
#include <string>
#include <vector>

#include "core/types.hpp"
#include "geometry/model.hpp"
#include "post/beam_band_report.hpp"

namespace lobe {

/// A port's reflection coefficient at ascending frequencies (computed or measured).
struct ReflectionCurve {
  std::vector<Real> frequency_hz;
  std::vector<Complex> reflection;
};

struct AtFrequency {
  Real value = 0.0;
  Real frequency_hz = 0.0;
};

/// The match of one port over [low, high]. Between samples |Γ| is taken as linear in
/// frequency (no extrapolation: only the part of the band the samples cover counts), and
/// averages are integrals over frequency divided by the covered width, so uneven sampling
/// does not weight any part of the band more than another.
struct PortBandReport {
  Real covered_low_hz = 0.0, covered_high_hz = 0.0;  ///< the part of the band the samples cover
  Real covered_share = 1.0;  ///< of the band's width (1 when the samples cover all of it)
  AtFrequency lowest_vswr, highest_vswr;
  Real mean_vswr = 0.0;
  Real mean_mismatch_loss_db = 0.0;
  Real vswr_threshold = 2.0;
  Real fraction_within = 0.0;  ///< of the covered band with VSWR ≤ vswr_threshold
  /// The contiguous stretch around the best match in the band where the return loss is at
  /// least 10 dB (|Γ| ≤ 10^(−1/2)), searched over the whole curve; none when the best match
  /// is worse than that. An end that reaches the curve's first or last sample is open: the
  /// stretch may go on beyond it.
  struct Stretch {
    Real low_hz = 0.0, high_hz = 0.0;
    bool open_low = false, open_high = false;
  };
  std::optional<Stretch> return_loss_10db;
};

/// Throws std::invalid_argument when the curve does not overlap [low, high] or is not
/// ascending.
PortBandReport band_report(const ReflectionCurve& curve, Real low_hz, Real high_hz, Real vswr_threshold = 2.0);

/// Every computed frequency, lowest to highest, as a band: what is judged when no band is named.
Band all_frequencies_band(Real lowest_hz, Real highest_hz);
/// The band a figure is judged over when none is chosen: the model's first band, else
/// all computed frequencies.
Band default_band(const std::vector<Band>& bands, Real lowest_hz, Real highest_hz);

/// The match figures of one port, by name: worst-vswr, mean-vswr, mean-mismatch-loss (dB)
/// and share-under-vswr-2 (the fraction of the band with VSWR at most 2).
const std::vector<std::string>& port_figure_names();
Real band_figure(const PortBandReport& report, const std::string& name);

/// Every figure of a design over a band: the first port's match and the main beam's.
struct BandFigures {
  PortBandReport port;
  std::map<std::string, BandFigure> beam;  ///< post/beam_band_report.hpp
};
BandFigures band_figures(const ReflectionCurve& port, const BeamCurves& beam, Real low_hz, Real high_hz);

/// Port `port`'s reflection at each of a run's frequencies.
ReflectionCurve port_reflection_curve(const std::vector<FrequencyResult>& results, std::size_t port);
/// Every port's band figures over `band` from a run's results (the beam's shared by all);
/// none when no computed frequency reaches the band.
std::optional<std::vector<BandFigures>> run_band_figures(const std::vector<FrequencyResult>& results, std::size_t ports,
                                                         const Band& band);

/// The figures a sweep ranks by, a tuner minimises, a limit bounds and a map shows: the
/// port's, and for every beam figure X (beam_figure_kinds) centre-X at the band centre and
/// worst-X at its worst over the band.
const std::vector<std::string>& band_figure_names();
bool is_beam_figure(const std::string& name);
/// None where the figure is not defined over this band (the back of a zenith beam).
std::optional<Real> band_figure(const BandFigures& figures, const std::string& name);
bool larger_is_better(const std::string& figure_name);
/// The figure's name in words with its unit, for headings and axes ("worst VSWR").
std::string band_figure_title(const std::string& name);

}  // namespace lobe
