#pragma once
/// The map of a band figure over a sweep's cases: what `lobe plot` draws for a sweep file
/// and `lobe report` embeds.
#include <filesystem>
#include <string>
#include <vector>

#include "geometry/model.hpp"
#include "post/svg_chart.hpp"
#include "post/sweep_file.hpp"

namespace lobe {

struct SweepMap {
  std::string svg;
  std::string figure;
  Band band;
  SweepTable table;
  std::vector<Real> figures;  ///< per case
  std::size_t best = 0;       ///< the best case by the figure
};

/// One cell per case over two varied names (`axes`: X or X,Y; default the first two), the
/// other names held at the best case's values, coloured by `figure` (band_figure_names)
/// over the band `band_options` names (at most one; default the model's first band).
/// Throws InputError at --band, --axes or --figure for what cannot be drawn.
SweepMap sweep_map(const std::filesystem::path& path, const std::string& figure, const std::vector<std::string>& band_options,
                   const std::vector<std::string>& axes);

}  // namespace lobe
