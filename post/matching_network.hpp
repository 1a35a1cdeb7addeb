#pragma once
/// Matching networks between an antenna and its feed, as a cascade of simple parts:
/// inductors and capacitors in series or across, lines in series and stubs across.
#include <vector>

#include "core/types.hpp"

namespace lobe {

enum class MatchPartKind { series_inductor, series_capacitor, shunt_inductor, shunt_capacitor, line, open_stub, shorted_stub };

struct MatchPart {
  MatchPartKind kind = MatchPartKind::series_inductor;
  Real value = 0.0;            ///< H or F; a line's or stub's length, m
  Real impedance = 0.0;        ///< a line's or stub's characteristic impedance, ohm
  Real velocity_factor = 1.0;  ///< a line's or stub's
  bool is_lumped() const { return kind != MatchPartKind::line && kind != MatchPartKind::open_stub && kind != MatchPartKind::shorted_stub; }
  bool is_inductor() const { return kind == MatchPartKind::series_inductor || kind == MatchPartKind::shunt_inductor; }
  bool is_series() const {
    return kind == MatchPartKind::series_inductor || kind == MatchPartKind::series_capacitor || kind == MatchPartKind::line;
  }
};

/// The impedance looking into the port end of `parts` (listed from the antenna toward the
/// port) with `antenna` at the other end, lossless (Pozar, Microwave Engineering, 4th ed.,
/// eq. 2.44 for lines, 2.46 and 2.49 for stubs). Ohm.
Complex through_parts(Complex antenna, const std::vector<MatchPart>& parts, Real frequency_hz);

/// One lossless L-section matching R + jX to a real Z0 (Pozar §5.1): a shunt susceptance
/// B and a series reactance X, with the shunt part next to the load (`shunt_at_load`,
/// possible when R² + X² ≥ Z0 R) or the series part (possible when R ≤ Z0).
struct LSection {
  bool shunt_at_load = true;
  Real reactance = 0.0;    ///< X, ohm
  Real susceptance = 0.0;  ///< B, S
};

/// Every L-section that matches `load` to `z0` exactly (Pozar eqs. 5.3 and 5.6): two of
/// each form that exists for this load. None for R ≤ 0.
std::vector<LSection> l_sections(Complex load, Real z0);

/// The parts of an L-section at `frequency_hz`: X > 0 an inductor, X < 0 a capacitor;
/// B > 0 a capacitor, B < 0 an inductor. From the antenna toward the port.
std::vector<MatchPart> l_section_parts(const LSection& section, Real frequency_hz);

/// The preferred values of IEC 60063's E12 or E24 series (`per_decade` 12 or 24) nearest
/// `value` from below and from above (equal when `value` is one of them).
std::pair<Real, Real> preferred_neighbours(Real value, int per_decade);

}  // namespace lobe
