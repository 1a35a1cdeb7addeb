#pragma once
/// One HDF5 file for a whole sweep, assembled from the files of its finished cases.
#include <filesystem>
#include <string>
#include <vector>

#include "core/types.hpp"

namespace lobe {

/// Writes `path` with /cases/names (the varied `let` names), /cases/values (cases × names,
/// as override texts) and /cases/values_si (SI values the model resolved), and a group
/// /case-000001 … per case holding a copy of that case's whole result file.
void write_sweep_hdf5(const std::filesystem::path& path, const std::vector<std::string>& names,
                      const std::vector<std::vector<std::string>>& texts, const std::vector<std::vector<Real>>& si,
                      const std::vector<std::filesystem::path>& case_files);

/// The group name of case `index` (from 0): "case-000001" for the first.
std::string case_name(std::size_t index);

}  // namespace lobe
