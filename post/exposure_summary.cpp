#include "post/exposure_summary.hpp"

#include <algorithm>
#include <cmath>

#include "core/formatted_text.hpp"
#include "post/band_report.hpp"
#include "post/exposure_estimate.hpp"
#include "post/run_summary.hpp"
#include "solver/frequency_limits.hpp"

namespace lobe {
namespace {

/// The results a band's estimate looks at: those inside it, else the one nearest its centre.
std::vector<const FrequencyResult*> results_for(const RunRecord& run, const Band& band) {
  std::vector<const FrequencyResult*> inside;
  for (const auto& r : run.results)
    if (r.frequency_hz >= band.low_hz && r.frequency_hz <= band.high_hz) inside.push_back(&r);
  if (inside.empty()) {
    const Real centre = 0.5 * (band.low_hz + band.high_hz);
    inside.push_back(&*std::min_element(run.results.begin(), run.results.end(), [&](const auto& a, const auto& b) {
      return std::abs(a.frequency_hz - centre) < std::abs(b.frequency_hz - centre);
    }));
  }
  return inside;
}

}  // namespace

Real antenna_largest_size_m(const AntennaProblem& problem) {
  return structure_extent_m(problem.mesh, problem.surfaces.mesh, problem.medium);
}

std::string exposure_text(const RunRecord& run, Real forward_w) {
  const Model& model = run.problem.model;
  int driven = 0;
  for (const auto& p : run.results.front().ports) driven += p.driven;
  const Real size = antenna_largest_size_m(run.problem);
  std::vector<Band> bands = model.bands;
  if (bands.empty()) bands.push_back(all_frequencies_band(run.results.front().frequency_hz, run.results.back().frequency_hz));

  std::string out = formatted(
      "\nRF exposure estimate with %.4g W forward at each of %d driven port%s (an estimate, not a compliance assessment):\n"
      "  far-field power density S = P G / (4 pi r^2) in free space, P all the forward power, G the peak gain in any "
      "direction;\n  limits for the general public, whole body, averaged over 30 minutes\n",
      forward_w, driven, driven == 1 ? "" : "s");
  bool any_near = false;
  for (const auto& band : bands) {
    out += "  " + band.name + " (" + frequency_text(band.low_hz) + " to " + frequency_text(band.high_hz) + "):\n";
    for (std::size_t rule = 0; rule < 2; ++rule) {
      const FrequencyResult* worst = nullptr;
      ExposureFigure worst_figure;
      for (const FrequencyResult* r : results_for(run, band)) {
        const Real eirp = forward_w * driven * std::pow(10.0, r->beam.gain_dbi / 10);
        const ExposureFigure figure = exposure_figures(eirp, r->frequency_hz)[rule];
        if (figure.distance_m && (!worst_figure.distance_m || *figure.distance_m > *worst_figure.distance_m))
          worst = r, worst_figure = figure;
      }
      if (!worst) {
        out += "    " + exposure_figures(1.0, band.low_hz)[rule].rule + ": its table does not cover these frequencies\n";
        continue;
      }
      const Real eirp = forward_w * driven * std::pow(10.0, worst->beam.gain_dbi / 10);
      out += formatted("    %-14s limit %6.3g W/m^2 at %s; EIRP %.3g W (peak gain %.2f dBi): under it beyond %.2f m\n",
                       worst_figure.rule.c_str(), *worst_figure.limit_w_m2, frequency_text(worst->frequency_hz).c_str(),
                       eirp, worst->beam.gain_dbi, *worst_figure.distance_m);
      // Every distance inside its near-field bound is flagged, not only the nearest one.
      const Real start = far_field_start_m(size, worst->frequency_hz);
      if (*worst_figure.distance_m < start) {
        any_near = true;
        out += formatted("      ! %.2f m is inside this antenna's near field, where the formula does not hold: the limit "
                         "may not be met closer than %.2f m\n",
                         *worst_figure.distance_m, start);
      }
    }
  }
  if (any_near)
    out += formatted("  ! marks a distance inside the near field: the far-field formula needs r >= max(2 D^2 / lambda, lambda), "
                     "D = %.2f m\n",
                     size);
  out += "  Cautions for this estimate:\n"
         "    - ground or nearby metal reflecting in phase can double the field (four times the density): twice these "
         "distances\n"
         "    - ICNIRP 2020 (Table 5) and the US rules (47 CFR 1.1310, Table 1) are two rule sets among several; duty cycle,\n"
         "      occupational limits and the rules' own evaluation methods are not applied here\n"
         "    - local regulations and licensed practice decide what is safe and allowed where you transmit\n";
  return out;
}

}  // namespace lobe
