#pragma once
/// The figures of one result, as SVG documents: what `lobe plot` writes and `lobe report`
/// embeds.
#include <filesystem>
#include <optional>
#include <string>
#include <vector>

#include "geometry/model.hpp"
#include "post/measured_csv.hpp"

namespace lobe {

struct NamedFigure {
  std::string name;  ///< a file suffix: "vswr", "smith", "pattern_vertical", ...
  std::string svg;
};

struct ResultFigures {
  std::vector<NamedFigure> figures;
  /// What was left out and why ("linear polarisation: no axial-ratio chart").
  std::vector<std::string> notes;
};

/// An antenna result's figures, each titled with the model's name (the result's stem):
/// VSWR and return loss against frequency (every port told apart by colour, dash and
/// marker; the model's bands and `extra_bands` shaded; `measured` overlaid), the Smith
/// chart (first and last frequencies and the first band's edges labelled), gain cuts in
/// the two principal planes through the main beam at the first band's edges and centre
/// (the horizon cut for a beam near the horizon; RHCP and LHCP too for a circular antenna),
/// and the axial ratio against frequency only where the antenna is not linearly polarised.
ResultFigures antenna_figures(const std::filesystem::path& result, const std::vector<Band>& extra_bands,
                              const std::optional<MeasuredCurve>& measured);

/// A scatterer's figures: the monostatic RCS against frequency and a bistatic cut through
/// the direction the wave comes from, at the middle frequency.
ResultFigures scattering_figures(const std::filesystem::path& result);

}  // namespace lobe
