#pragma once
/// One HDF5 file for a whole sweep, assembled from the files of its finished cases.
#include <filesystem>
#include <string>
#include <vector>

#include "core/types.hpp"

namespace lobe {

/// The varied `let` names and, per case, their values (cases × names).
struct SweepTable {
  std::vector<std::string> names;
  std::vector<std::vector<std::string>> values;  ///< override texts, exactly as the cases were solved
  std::vector<std::vector<std::string>> labels;  ///< the same values for people ("25 deg")
  std::vector<std::vector<Real>> values_si;      ///< as the model resolved them (SI)
};

/// Writes `path` with the case table (/cases/case, /cases/variable, /cases/values,
/// /cases/labels, /cases/values_si), a group /case-000001 … per case holding a copy of that
/// case's whole result file, and the cases' results stacked in /stacked (sweep_stacking.hpp).
void write_sweep_hdf5(const std::filesystem::path& path, const SweepTable& table,
                      const std::vector<std::filesystem::path>& case_files);

/// The case table of a sweep file; throws InputError at FILE:1:1 when `path` is not one.
SweepTable read_sweep_table(const std::filesystem::path& path);

/// Whether `path` is an HDF5 file with a sweep's case table.
bool is_sweep_file(const std::filesystem::path& path);

/// The varied names whose value in case `index` is the smallest or largest of the table's
/// ("length = 160 mm (its largest)"): a best case there may have a better one beyond.
std::vector<std::string> names_at_grid_edge(const SweepTable& table, std::size_t index);

/// The group name of case `index` (from 0): "case-000001" for the first.
std::string case_name(std::size_t index);
/// Its path in the sweep file, "/case-000001", as the result readers take it.
std::string case_group(std::size_t index);

}  // namespace lobe
