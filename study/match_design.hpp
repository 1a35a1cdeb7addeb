#pragma once
/// Designing a matching network for a whole band from an antenna's computed impedance:
/// lumped L-, π- and T-networks, a single stub and a quarter-wave transformer, each
/// searched for the best band figure and then built from standard values.
#include <string>
#include <vector>

#include "geometry/model.hpp"
#include "post/band_report.hpp"
#include "post/matching_network.hpp"

namespace lobe {

struct MatchRequest {
  std::vector<Real> frequency_hz;          ///< ascending
  std::vector<Complex> antenna_impedance;  ///< ohm, at each frequency
  Real reference_ohm = 50.0;               ///< the feed's impedance
  Band band;
  std::string goal = "worst-vswr";         ///< worst-vswr, mean-vswr or mean-mismatch-loss
  int preferred_series = 12;               ///< IEC 60063 E12 or E24 for inductors and capacitors
  Real velocity_factor = 0.66;             ///< of the lines and stubs (of reference impedance)
};

struct MatchDesign {
  std::string topology;            ///< "L", "pi", "T", "stub" or "quarter-wave"
  std::vector<MatchPart> designed;  ///< from the antenna toward the port, exact values
  std::vector<MatchPart> built;     ///< the same with standard values (lumped: the E series;
                                    ///< lengths to 0.1 mm)
  PortBandReport designed_report, built_report;
  Real built_goal = 0.0;            ///< the goal's value as built
};

/// The antenna alone over the band, as `lobe run` reports it.
PortBandReport unmatched_report(const MatchRequest& request);

/// The best design of each topology, best first by the goal as built. Each is a local
/// search (NLopt's Sbplx on the logarithms of the reactances, or on lengths) from several
/// starts, among them the closed-form L-sections at the band's centre (Pozar §5.1), with
/// every choice of inductor or capacitor; the built values are the best combination of the
/// neighbouring standard values. Throws InputError (at `where`) when the band holds no
/// computed frequency.
std::vector<MatchDesign> design_matches(const MatchRequest& request, const SourceLocation& where);

/// "series 47 nH", "shunt 3.3 pF", "line 123.4 mm", "open stub 56.0 mm" ...
std::string part_text(const MatchPart& part);

}  // namespace lobe
