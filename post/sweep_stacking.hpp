#pragma once
/// A sweep file's case groups and stacked arrays (internal to post/): each case's
/// per-frequency results side by side, case first, so that a notebook slices a whole sweep
/// without walking its groups.
#include <string>
#include <vector>

#include "post/hdf5_layout.hpp"

namespace lobe {

/// Copies a case's whole result file into `group` of the sweep file, its arrays attached to
/// the copies of their axes.
void copy_case_group(hid_t sweep_file, const std::string& group, hid_t case_file);

/// Writes /stacked/GROUP/NAME [case, …] for every numeric array of the cases' groups of
/// results (ports, power, beam, band figures, pattern, network, solver, scattering) whose
/// shape and axes are the same in every case; the axes are copied beside them
/// (/stacked/frequency, /stacked/ports/port, …). An array whose axes differ between
/// cases (frequencies an adaptive sweep chose, ports of a varied model) is left out and
/// named in /stacked's attribute `left_out`, with the reason.
void write_stacked_arrays(hid_t sweep_file, const std::vector<std::string>& case_names, const std::vector<hid_t>& case_files);

}  // namespace lobe
