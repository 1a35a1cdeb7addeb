#pragma once
/// One self-describing HDF5 file per run.
#include <filesystem>

#include "post/run_record.hpp"

namespace lobe {

/// Writes a run in lobe's HDF5 layout (docs/hdf5_layout.md): format_version, every array on
/// named axes (dimension scales), complex values as {r, i}, UTF-8 text.
void write_hdf5(const std::filesystem::path& path, const RunRecord& run);

struct ScatteringRun;
/// A scattering run in the same layout, its results in /scattering.
void write_scattering_hdf5(const std::filesystem::path& path, const ScatteringRun& run);

}  // namespace lobe
