#pragma once
/// The compact text summary printed after a run.
#include <string>

#include "post/band_report.hpp"
#include "post/run_record.hpp"

namespace lobe {

/// VSWR above which the summary warns about reflected transmitter power (2:1 is the
/// usual acceptance limit for a transmitter; common practice).
constexpr Real vswr_caution_threshold = 2.0;

/// Below this reciprocal condition number the summary flags the matrix: about ten digits
/// of a double's sixteen would be lost to it. Fine surface meshes (a patch meshed at λ/50)
/// reach 1e9 without harm, since the EFIE's condition grows as the mesh refines.
constexpr Real ill_conditioned_rcond = 1e-10;

/// How far the power balance ½Re(V I*) = radiated + lost may miss before the summary and the
/// result file warn: the tolerance every reference case holds to.
constexpr Real power_balance_warning = 1e-3;

/// One warning per frequency whose power balance misses by more than power_balance_warning
/// (an efficiency above 100 % among them), for the summary and the result file.
std::vector<std::string> power_balance_warnings(const RunRecord& run);

/// "868.000 MHz", "1.5754 GHz": a frequency with a unit that suits it.
std::string frequency_text(Real hz);

/// "VSWR <= 2 over 80% of the band", or, when the samples cover only part of it, the share
/// of that part and how much of the band it is: "... over 100% of the covered 60% of the
/// band (433.050 to 434.000 MHz)", so that a half-computed band never reads as wholly good.
std::string share_within_text(const PortBandReport& report);


/// "1 port", "3 ports"; `plural` when adding "s" is wrong.
std::string count_text(std::size_t count, const std::string& noun, const std::string& plural = "");

/// Per port and frequency: impedance, VSWR and return loss; per frequency: the beam's
/// figures (gain, realized gain, direction, F/B, F/S, beamwidths, efficiency) and the
/// polarisation at the beam or --toward; per band: the match (band_report) and every beam
/// figure at the centre and at its worst; then cautions.
std::string run_summary(const RunRecord& run);

}  // namespace lobe
