#include "post/sweep_file.hpp"

#include <algorithm>
#include <cstdio>
#include <stdexcept>

#include "core/input_error.hpp"
#include "post/hdf5_layout.hpp"
#include "post/hdf5_memory_file.hpp"
#include "post/hdf5_reading.hpp"
#include "post/sweep_stacking.hpp"

namespace lobe {

std::string case_name(std::size_t index) {
  char name[32];
  std::snprintf(name, sizeof name, "case-%06zu", index + 1);
  return name;
}

std::string case_group(std::size_t index) { return std::string("/").append(case_name(index)); }

void write_sweep_hdf5(const std::filesystem::path& path, const SweepTable& table,
                      const std::vector<std::filesystem::path>& case_files) {
  Hdf5MemoryFile file;
  hdf5::mark_format(file, "lobe-sweep");
  hdf5::text_attribute(file, "program", "lobe");
  const std::size_t rows = table.values.size();
  hdf5::Handle cases = hdf5::create_group(file, "/cases");
  std::vector<std::string> names;
  for (std::size_t c = 0; c < rows; ++c) names.push_back(case_name(c));
  const hdf5::Axis case_axis = hdf5::text_axis(file, "/cases", "case", names);
  const hdf5::Axis variable = hdf5::text_axis(file, "/cases", "variable", table.names);
  std::vector<std::string> values, labels;
  std::vector<Real> si;
  for (std::size_t c = 0; c < rows; ++c) {
    values.insert(values.end(), table.values[c].begin(), table.values[c].end());
    labels.insert(labels.end(), table.labels[c].begin(), table.labels[c].end());
    si.insert(si.end(), table.values_si[c].begin(), table.values_si[c].end());
  }
  hdf5::write_texts(file, "/cases/values", {case_axis, variable}, values);
  hdf5::write_texts(file, "/cases/labels", {case_axis, variable}, labels);
  hdf5::write_reals(file, "/cases/values_si", {case_axis, variable}, si, "SI (metres, hertz, radians …)");
  std::vector<Hdf5Handle> sources;
  std::vector<hid_t> opened;
  for (std::size_t c = 0; c < case_files.size(); ++c) {
    sources.emplace_back(H5Fopen(case_files[c].c_str(), H5F_ACC_RDONLY, H5P_DEFAULT), H5Fclose);
    opened.push_back(sources.back());
    copy_case_group(file, case_group(c), sources.back());
  }
  write_stacked_arrays(file, names, opened);
  file.save(path);
}

bool is_sweep_file(const std::filesystem::path& path) {
  Hdf5Handle file(open_hdf5_for_reading(path), H5Fclose);
  return hdf5_exists(file, "/cases/variable");
}

SweepTable read_sweep_table(const std::filesystem::path& path) {
  const SourceLocation where{path.string(), 1, 1};
  Hdf5Handle file(open_hdf5_for_reading(path), H5Fclose);
  if (!hdf5_exists(file, "/cases/variable") || !hdf5_exists(file, "/cases/values") || !hdf5_exists(file, "/cases/values_si") ||
      !hdf5_exists(file, "/cases/labels"))
    throw InputError(where, "this is not a lobe sweep file (it has no /cases table)");
  SweepTable table;
  std::vector<hsize_t> dims, si_dims, label_dims;
  table.names = read_strings(file, "/cases/variable", dims);
  const std::vector<std::string> values = read_strings(file, "/cases/values", dims);
  const std::vector<Real> si = read_reals(file, "/cases/values_si", si_dims);
  const std::size_t columns = table.names.size();
  if (columns == 0 || dims.size() != 2 || dims[1] != columns || si_dims != dims)
    throw InputError(where, "the case table of this sweep file is malformed");
  const std::vector<std::string> labels = read_strings(file, "/cases/labels", label_dims);
  if (labels.size() != values.size()) throw InputError(where, "the case table of this sweep file is malformed");
  for (std::size_t c = 0; c < dims[0]; ++c) {
    table.values.emplace_back(values.begin() + c * columns, values.begin() + (c + 1) * columns);
    table.labels.emplace_back(labels.begin() + c * columns, labels.begin() + (c + 1) * columns);
    table.values_si.emplace_back(si.begin() + c * columns, si.begin() + (c + 1) * columns);
  }
  return table;
}

std::vector<std::string> names_at_grid_edge(const SweepTable& table, std::size_t index) {
  std::vector<std::string> names;
  for (std::size_t v = 0; v < table.names.size(); ++v) {
    Real low = table.values_si.front()[v], high = low;
    for (const auto& values : table.values_si) low = std::min(low, values[v]), high = std::max(high, values[v]);
    const Real value = table.values_si[index][v];
    if (high > low && (value == low || value == high))
      names.push_back(table.names[v] + " = " + table.labels[index][v] + (value == low ? " (its smallest)" : " (its largest)"));
  }
  return names;
}

}  // namespace lobe
