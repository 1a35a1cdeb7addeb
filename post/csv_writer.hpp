#pragma once
/// Plain CSV tables of port, pattern and current results.
#include <filesystem>

#include "post/run_record.hpp"

namespace lobe {

/// Where a feed network meets the antenna: one row per frequency and place (a feed line's
/// antenna end), as an analyser would see it without the line.
void write_antenna_ends_csv(const std::filesystem::path& path, const RunRecord& run);

/// One row per frequency and port. Header starts
/// frequency_hz,port,resistance_ohm,reactance_ohm,vswr,return_loss_db.
void write_ports_csv(const std::filesystem::path& path, const RunRecord& run);
/// One row per frequency and direction. Header starts
/// frequency_hz,theta_deg,phi_deg,gain_dbi,rhcp_dbi,lhcp_dbi,axial_ratio_db.
void write_pattern_csv(const std::filesystem::path& path, const RunRecord& run);
/// One row per frequency and segment: the current at the segment midpoint. Header
/// frequency_hz,wire,segment,distance_m,magnitude_a,phase_deg,real_a,imaginary_a,x_m,y_m,z_m:
/// the wire's name, the segment numbered from 1 along it, its midpoint's distance from the
/// wire's start, then the current (peak) and the midpoint's position.
void write_currents_csv(const std::filesystem::path& path, const RunRecord& run);

}  // namespace lobe
