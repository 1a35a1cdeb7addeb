#include "study/match_design.hpp"

#include <nlopt.hpp>

#include <algorithm>
#include <cmath>
#include <functional>

#include "core/constants.hpp"
#include "core/formatted_text.hpp"
#include "core/input_error.hpp"
#include "post/port_quantities.hpp"

namespace lobe {
namespace {

/// Reactances a lumped part may take at the band's centre, ohm: beyond them no real part
/// behaves as an inductor or capacitor (a 0.1 ohm reactance at 100 MHz is 0.16 nH).
constexpr Real smallest_reactance = 0.1, largest_reactance = 1e4;
/// Lines and stubs from a two-hundredth to half a wavelength in the line.
constexpr Real shortest_line = 0.005, longest_line = 0.5;
/// Quarter-wave transformers from 5 to 500 ohm, beyond any line one can make.
constexpr Real lowest_line_ohm = 5.0, highest_line_ohm = 500.0;
/// Lengths as built, m.
constexpr Real length_step = 1e-4;

/// The request's frequencies the band report needs: those in the band and the nearest on
/// each side, through which the band's edges are interpolated.
struct BandSamples {
  std::vector<Real> frequency_hz;
  std::vector<Complex> antenna;
};

BandSamples band_samples(const MatchRequest& r, const SourceLocation& where) {
  BandSamples s;
  const std::size_t n = r.frequency_hz.size();
  std::size_t first = n, last = 0;
  for (std::size_t i = 0; i < n; ++i)
    if (r.frequency_hz[i] >= r.band.low_hz && r.frequency_hz[i] <= r.band.high_hz) first = std::min(first, i), last = i;
  if (first == n)
    throw InputError(where, "no computed frequency lies in the band " + formatted("%.6g", r.band.low_hz / 1e6) + " to " +
                                formatted("%.6g", r.band.high_hz / 1e6) + " MHz; run the model over it first");
  if (first > 0) --first;
  if (last + 1 < n) ++last;
  for (std::size_t i = first; i <= last; ++i) {
    s.frequency_hz.push_back(r.frequency_hz[i]);
    s.antenna.push_back(r.antenna_impedance[i]);
  }
  return s;
}

PortBandReport report_of(const BandSamples& s, const MatchRequest& r, const std::vector<MatchPart>& parts) {
  ReflectionCurve curve;
  curve.frequency_hz = s.frequency_hz;
  for (std::size_t i = 0; i < s.frequency_hz.size(); ++i)
    curve.reflection.push_back(reflection_coefficient(through_parts(s.antenna[i], parts, s.frequency_hz[i]), r.reference_ohm));
  return band_report(curve, r.band.low_hz, r.band.high_hz);
}

/// A topology's parts from the search's variables: the kinds are fixed, the variables set
/// their values (logarithms of reactances at the centre over Z0, or lengths in wavelengths
/// in the line, or a line's impedance).
struct Layout {
  std::string topology;
  std::vector<MatchPart> kinds;
  std::vector<Real> low, high;  ///< bounds of the variables
  std::function<std::vector<MatchPart>(const std::vector<double>&)> parts;
};

class Designer {
 public:
  Designer(const MatchRequest& request, const SourceLocation& where)
      : m_request(request), m_samples(band_samples(request, where)) {
    m_centre = 0.5 * (request.band.low_hz + request.band.high_hz);
    m_wavelength = request.velocity_factor * speed_of_light / m_centre;
    // The antenna at the centre, by linear interpolation between the nearest samples.
    const auto& f = m_samples.frequency_hz;
    const std::size_t k = static_cast<std::size_t>(std::upper_bound(f.begin(), f.end(), m_centre) - f.begin());
    if (k == 0 || k == f.size()) m_centre_antenna = m_samples.antenna[k == 0 ? 0 : f.size() - 1];
    else {
      const Real t = (m_centre - f[k - 1]) / (f[k] - f[k - 1]);
      m_centre_antenna = (1 - t) * m_samples.antenna[k - 1] + t * m_samples.antenna[k];
    }
  }

  std::vector<MatchDesign> designs() {
    std::vector<MatchDesign> all;
    for (const auto& topology : {"L", "pi", "T"}) all.push_back(best_lumped(topology));
    all.push_back(best_stub());
    all.push_back(best_transformer());
    std::stable_sort(all.begin(), all.end(), [](const MatchDesign& a, const MatchDesign& b) { return a.built_goal < b.built_goal; });
    return all;
  }

 private:
  Real goal(const std::vector<MatchPart>& parts) const {
    return band_figure(report_of(m_samples, m_request, parts), m_request.goal);
  }

  /// A lumped part of `kind` whose reactance at the centre is Z0 e^u in magnitude.
  MatchPart lumped(MatchPartKind kind, Real u) const {
    const Real x = m_request.reference_ohm * std::exp(u), omega = 2 * pi * m_centre;
    MatchPart part{kind};
    part.value = part.is_inductor() ? x / omega : 1.0 / (omega * x);
    return part;
  }
  Real log_reactance(const MatchPart& p) const {
    const Real omega = 2 * pi * m_centre;
    return std::log((p.is_inductor() ? omega * p.value : 1.0 / (omega * p.value)) / m_request.reference_ohm);
  }

  /// Local search from `start`; returns the best variables found.
  std::vector<double> search(const Layout& layout, std::vector<double> x) const {
    struct Context {
      const Designer* designer;
      const Layout* layout;
    } context{this, &layout};
    nlopt::opt optimiser(nlopt::LN_SBPLX, static_cast<unsigned>(x.size()));
    optimiser.set_lower_bounds(std::vector<double>(layout.low.begin(), layout.low.end()));
    optimiser.set_upper_bounds(std::vector<double>(layout.high.begin(), layout.high.end()));
    optimiser.set_min_objective(
        [](const std::vector<double>& v, std::vector<double>&, void* data) {
          const auto* c = static_cast<const Context*>(data);
          return c->designer->goal(c->layout->parts(v));
        },
        &context);
    optimiser.set_xtol_rel(1e-7);
    optimiser.set_maxeval(600 * static_cast<int>(x.size()));
    for (std::size_t i = 0; i < x.size(); ++i) x[i] = std::clamp(x[i], layout.low[i], layout.high[i]);
    double best = 0.0;
    try {
      optimiser.optimize(x, best);
    } catch (const nlopt::roundoff_limited&) {
      // The best point so far is kept in x: a flat goal stops the search, not the design.
    }
    return x;
  }

  MatchDesign finish(const std::string& topology, std::vector<MatchPart> designed) const {
    MatchDesign d;
    d.topology = topology;
    d.designed = designed;
    d.designed_report = report_of(m_samples, m_request, designed);
    d.built = built(designed);
    d.built_report = report_of(m_samples, m_request, d.built);
    d.built_goal = band_figure(d.built_report, m_request.goal);
    return d;
  }

  /// Every lumped part rounded down or up to its neighbouring standard values, the best
  /// combination kept; lengths to the nearest 0.1 mm.
  std::vector<MatchPart> built(const std::vector<MatchPart>& designed) const {
    std::vector<MatchPart> best = designed;
    std::vector<std::size_t> lumped;
    for (std::size_t i = 0; i < designed.size(); ++i) {
      if (designed[i].is_lumped()) lumped.push_back(i);
      else best[i].value = std::max(length_step, std::round(designed[i].value / length_step) * length_step);
    }
    Real best_goal = INFINITY;
    const std::vector<MatchPart> lengths_rounded = best;
    for (std::size_t choice = 0; choice < (std::size_t{1} << lumped.size()); ++choice) {
      std::vector<MatchPart> trial = lengths_rounded;
      for (std::size_t k = 0; k < lumped.size(); ++k) {
        const auto [below, above] = preferred_neighbours(designed[lumped[k]].value, m_request.preferred_series);
        trial[lumped[k]].value = (choice >> k) & 1 ? above : below;
      }
      if (const Real g = goal(trial); g < best_goal) best_goal = g, best = trial;
    }
    return best;
  }

  MatchDesign best_lumped(const std::string& topology) const {
    // Which positions are in series, from the antenna: L (either order), π, T.
    std::vector<std::vector<bool>> orders;
    if (topology == "L") orders = {{false, true}, {true, false}};
    else if (topology == "pi") orders = {{false, true, false}};
    else orders = {{true, false, true}};
    std::vector<MatchPart> best_parts;
    Real best_goal = INFINITY;
    for (const auto& series : orders) {
      const std::size_t n = series.size();
      for (std::size_t types = 0; types < (std::size_t{1} << n); ++types) {
        Layout layout;
        for (std::size_t i = 0; i < n; ++i) {
          const bool inductor = (types >> i) & 1;
          layout.kinds.push_back({series[i] ? (inductor ? MatchPartKind::series_inductor : MatchPartKind::series_capacitor)
                                            : (inductor ? MatchPartKind::shunt_inductor : MatchPartKind::shunt_capacitor)});
          layout.low.push_back(std::log(smallest_reactance / m_request.reference_ohm));
          layout.high.push_back(std::log(largest_reactance / m_request.reference_ohm));
        }
        layout.parts = [this, kinds = layout.kinds](const std::vector<double>& u) {
          std::vector<MatchPart> parts;
          for (std::size_t i = 0; i < kinds.size(); ++i) parts.push_back(lumped(kinds[i].kind, u[i]));
          return parts;
        };
        for (const std::vector<double>& start : lumped_starts(layout)) {
          const std::vector<MatchPart> parts = layout.parts(search(layout, start));
          if (const Real g = goal(parts); g < best_goal) best_goal = g, best_parts = parts;
        }
      }
    }
    return finish(topology, best_parts);
  }

  /// Starts for a lumped search: every part at Z0/2 or 2 Z0, and for an L the closed-form
  /// sections of its kinds at the centre.
  std::vector<std::vector<double>> lumped_starts(const Layout& layout) const {
    const std::size_t n = layout.kinds.size();
    std::vector<std::vector<double>> starts;
    for (std::size_t corner = 0; corner < (std::size_t{1} << n); ++corner) {
      std::vector<double> x;
      for (std::size_t i = 0; i < n; ++i) x.push_back(std::log((corner >> i) & 1 ? 2.0 : 0.5));
      starts.push_back(x);
    }
    if (n != 2) return starts;
    for (const LSection& section : l_sections(m_centre_antenna, m_request.reference_ohm)) {
      const std::vector<MatchPart> parts = l_section_parts(section, m_centre);
      if (parts[0].kind != layout.kinds[0].kind || parts[1].kind != layout.kinds[1].kind) continue;
      starts.push_back({log_reactance(parts[0]), log_reactance(parts[1])});
    }
    return starts;
  }

  MatchDesign best_stub() const {
    std::vector<MatchPart> best_parts;
    Real best_goal = INFINITY;
    for (const MatchPartKind stub : {MatchPartKind::open_stub, MatchPartKind::shorted_stub}) {
      Layout layout;
      layout.low = {shortest_line, shortest_line};
      layout.high = {longest_line, longest_line};
      layout.parts = [this, stub](const std::vector<double>& x) {
        return std::vector<MatchPart>{line_part(MatchPartKind::line, x[0]), line_part(stub, x[1])};
      };
      for (Real d = 0.05; d < 0.5; d += 0.1)
        for (Real l = 0.05; l < 0.5; l += 0.1) {
          const std::vector<MatchPart> parts = layout.parts(search(layout, {d, l}));
          if (const Real g = goal(parts); g < best_goal) best_goal = g, best_parts = parts;
        }
    }
    return finish("stub", best_parts);
  }

  MatchDesign best_transformer() const {
    Layout layout;
    layout.low = {0.0, lowest_line_ohm};
    layout.high = {longest_line, highest_line_ohm};
    layout.parts = [this](const std::vector<double>& x) {
      MatchPart section = line_part(MatchPartKind::line, 0.25);
      section.impedance = x[1];
      return std::vector<MatchPart>{line_part(MatchPartKind::line, x[0]), section};
    };
    std::vector<MatchPart> best_parts;
    Real best_goal = INFINITY;
    // Starts where the line has turned the antenna's impedance real (R between Z0/SWR and
    // Z0·SWR), with the transformer's impedance √(Z0 R) there.
    for (Real d = 0.0; d < 0.5; d += 0.05) {
      const Complex z = through_parts(m_centre_antenna, {line_part(MatchPartKind::line, d)}, m_centre);
      const Real zt = std::clamp(std::sqrt(m_request.reference_ohm * std::max(z.real(), 1e-3)), lowest_line_ohm, highest_line_ohm);
      const std::vector<MatchPart> parts = layout.parts(search(layout, {d, zt}));
      if (const Real g = goal(parts); g < best_goal) best_goal = g, best_parts = parts;
    }
    return finish("quarter-wave", best_parts);
  }

  /// A line or stub of reference impedance, `wavelengths` long in the line at the centre.
  MatchPart line_part(MatchPartKind kind, Real wavelengths) const {
    return {kind, wavelengths * m_wavelength, m_request.reference_ohm, m_request.velocity_factor};
  }

  const MatchRequest& m_request;
  BandSamples m_samples;
  Real m_centre = 0.0, m_wavelength = 0.0;
  Complex m_centre_antenna;
};

}  // namespace

PortBandReport unmatched_report(const MatchRequest& request) {
  ReflectionCurve curve;
  curve.frequency_hz = request.frequency_hz;
  for (const Complex z : request.antenna_impedance) curve.reflection.push_back(reflection_coefficient(z, request.reference_ohm));
  return band_report(curve, request.band.low_hz, request.band.high_hz);
}

std::vector<MatchDesign> design_matches(const MatchRequest& request, const SourceLocation& where) {
  return Designer(request, where).designs();
}

std::string part_text(const MatchPart& p) {
  switch (p.kind) {
    case MatchPartKind::series_inductor: return formatted("series %.3g nH", p.value * 1e9);
    case MatchPartKind::series_capacitor: return formatted("series %.3g pF", p.value * 1e12);
    case MatchPartKind::shunt_inductor: return formatted("shunt %.3g nH", p.value * 1e9);
    case MatchPartKind::shunt_capacitor: return formatted("shunt %.3g pF", p.value * 1e12);
    case MatchPartKind::line: return formatted("line %.4g ohm %.1f mm", p.impedance, p.value * 1e3);
    case MatchPartKind::open_stub: return formatted("open stub %.4g ohm %.1f mm", p.impedance, p.value * 1e3);
    case MatchPartKind::shorted_stub: return formatted("shorted stub %.4g ohm %.1f mm", p.impedance, p.value * 1e3);
  }
  return "";
}

}  // namespace lobe
