#pragma once
/// The main beam's figures over a band: each at the band centre and at its worst over the
/// band, so that a design is judged by its weakest frequency, not its best.
#include <map>
#include <optional>
#include <string>
#include <vector>

#include "core/types.hpp"

namespace lobe {

struct FrequencyResult;

/// One figure of the beam at each frequency (post/beam_figures.hpp), by name.
struct BeamFigureKind {
  std::string name;      ///< "front-to-back": as ranks and limits name it
  std::string dataset;   ///< "front_to_back_db": its array in a result file's /beam group
  std::string title;     ///< "front-to-back ratio"
  std::string unit;      ///< "dB"
  bool larger_is_better;
};

/// gain, realized-gain, efficiency, front-to-back, front-to-side, beamwidth-theta,
/// beamwidth-phi, axial-ratio, rhcp-gain, lhcp-gain, cross-polar. A narrower beam counts as
/// better (more gain where it points).
const std::vector<BeamFigureKind>& beam_figure_kinds();

/// Per frequency (ascending), each figure's value; none where it is not defined (the back
/// of a beam at the zenith over a ground plane).
struct BeamCurves {
  std::vector<Real> frequency_hz;
  std::map<std::string, std::vector<std::optional<Real>>> values;
  std::vector<Real> peak_theta_deg, peak_phi_deg;  ///< the main beam per frequency (may be empty)
};

BeamCurves beam_curves(const std::vector<FrequencyResult>& results);

/// A figure over a band. Between samples it is taken as linear in frequency, as the match
/// is; the worst is over the samples inside the band and the interpolated band edges.
struct BandFigure {
  Real centre = 0.0;
  Real worst = 0.0;
  Real worst_hz = 0.0;
  Real best = 0.0;  ///< the other extreme (the highest cross-polar gain is a circular antenna's worst)
  Real best_hz = 0.0;
};

/// Every figure of `curves` over [low, high]; a figure is left out where it is undefined
/// at any frequency that counts. Throws std::invalid_argument when the curves do not
/// overlap the band.
std::map<std::string, BandFigure> beam_band_report(const BeamCurves& curves, Real low_hz, Real high_hz);

}  // namespace lobe
