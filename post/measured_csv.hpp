#pragma once
/// Measured reflection from a CSV table: what an analyser or a coupler-and-detector setup
/// exports, in whichever one quantity it measured.
#include <filesystem>

#include "post/band_report.hpp"

namespace lobe {

/// A measured curve; when only a magnitude was measured (return loss, |S11|, VSWR), the
/// reflections are real and non-negative and `phase_known` is false.
struct MeasuredCurve {
  ReflectionCurve curve;
  bool phase_known = false;
  std::string quantity;  ///< what the file gave, for reports
};

/// Reads a CSV whose header names a frequency column and one measured quantity
/// (case-insensitive; spaces, brackets and units in parentheses allowed):
///   frequency: frequency_hz | _khz | _mhz | _ghz, or "frequency (MHz)" and the like;
///   then one of: return_loss_db (positive, or negative as S11 in dB), s11_db (at most 0),
///   s11_magnitude, vswr or swr, s11_re with s11_im, s11_magnitude with s11_deg,
///   resistance_ohm with reactance_ohm (impedance, referred to `reference_ohm`). Extra
///   columns are ignored, so lobe's own ports table reads too (its first port). Fields are
///   split by RFC 4180 (quotes, doubled quotes) at commas, or at semicolons or tabs when the
///   header has them; a single decimal comma in a number is read as a decimal point. Rows
///   must ascend in positive frequency; a reflection above 1 is refused. Lines end in LF,
///   CR LF or CR; at most 64 MiB are read. Throws InputError at FILE:LINE:COL.
MeasuredCurve read_measured_csv(const std::filesystem::path& path, Real reference_ohm);

}  // namespace lobe
