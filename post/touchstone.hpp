#pragma once
/// Touchstone network-parameter files (the open IBIS Touchstone specification, versions
/// 1.1 and 2.0): measured data in, computed results out.
#include <filesystem>
#include <vector>

#include "core/types.hpp"

namespace lobe {

/// S-parameters at ascending frequencies, all ports referred to one real impedance.
struct NetworkData {
  Real reference_ohm = 50.0;
  std::vector<Real> frequency_hz;
  std::vector<ComplexMatrix> s;  ///< one N × N matrix per frequency
  int ports() const { return s.empty() ? 0 : static_cast<int>(s.front().rows()); }
};

enum class TouchstoneFormat { real_imaginary, magnitude_angle, decibel_angle };

struct TouchstoneStyle {
  int version = 1;                 ///< 1 or 2
  TouchstoneFormat format = TouchstoneFormat::real_imaginary;
  Real unit_hz = 1e9;              ///< 1 (Hz), 1e3, 1e6 or 1e9 (GHz)
};

/// Reads a .sNp file: the option line (any order, any case; defaults GHz, S, MA, R 50),
/// `!` comments, data records spread over any number of lines, version 2 keyword sections
/// ([Number of Ports], [Two-Port Data Order], [Matrix Format] full/lower/upper,
/// [Number of Frequencies], [Reference] with one common value, noise data skipped).
/// Version 1 takes the port count from the extension. Z and Y data are converted to S
/// (normalised to R in version 1, in ohms and siemens in version 2). Throws InputError at
/// FILE:LINE:COL for anything it cannot read faithfully (H and G data, per-port references).
/// `default_ports` stands in for the extension's count when the file is named otherwise (an
/// analyser's .txt); 0 requires the extension or [Number of Ports]. Refuses more than 64
/// ports, frequencies that are not positive and ascending, and a port reflecting more than
/// it receives (|S_ii| > 1).
NetworkData read_touchstone(const std::filesystem::path& path, int default_ports = 0);

/// Writes S-parameters in the given style, full precision, with a comment header.
void write_touchstone(const std::filesystem::path& path, const NetworkData& data, const TouchstoneStyle& style,
                      const std::string& comment);

}  // namespace lobe
