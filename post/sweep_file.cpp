#include "post/sweep_file.hpp"

#include <algorithm>
#include <cstdio>
#include <stdexcept>

#include "core/input_error.hpp"
#include "post/hdf5_memory_file.hpp"
#include "post/hdf5_reading.hpp"

namespace lobe {
namespace {

void check(herr_t status, const char* what) {
  if (status < 0) throw std::runtime_error(std::string("HDF5: ") + what + " failed");
}

void write_text_table(hid_t group, const char* name, const std::vector<std::string>& flat, hsize_t rows, hsize_t columns) {
  Hdf5Handle type(H5Tcopy(H5T_C_S1), H5Tclose);
  check(H5Tset_size(type, H5T_VARIABLE), "string type");
  const hsize_t dims[2] = {rows, columns};
  Hdf5Handle space(H5Screate_simple(columns ? 2 : 1, dims, nullptr), H5Sclose);
  Hdf5Handle set(H5Dcreate2(group, name, type, space, H5P_DEFAULT, H5P_DEFAULT, H5P_DEFAULT), H5Dclose);
  std::vector<const char*> pointers;
  for (const auto& s : flat) pointers.push_back(s.c_str());
  if (!pointers.empty()) check(H5Dwrite(set, type, H5S_ALL, H5S_ALL, H5P_DEFAULT, pointers.data()), "write strings");
}

}  // namespace

std::string case_name(std::size_t index) {
  char name[32];
  std::snprintf(name, sizeof name, "case-%06zu", index + 1);
  return name;
}

std::string case_group(std::size_t index) { return std::string("/").append(case_name(index)); }

void write_sweep_hdf5(const std::filesystem::path& path, const SweepTable& table,
                      const std::vector<std::filesystem::path>& case_files) {
  Hdf5MemoryFile file;
  {
    Hdf5Handle cases(H5Gcreate2(file, "cases", H5P_DEFAULT, H5P_DEFAULT, H5P_DEFAULT), H5Gclose);
    const hsize_t rows = table.values.size(), columns = table.names.size();
    write_text_table(cases, "names", table.names, columns, 0);
    std::vector<std::string> values, labels;
    std::vector<Real> si;
    for (std::size_t c = 0; c < rows; ++c) {
      values.insert(values.end(), table.values[c].begin(), table.values[c].end());
      labels.insert(labels.end(), table.labels[c].begin(), table.labels[c].end());
      si.insert(si.end(), table.values_si[c].begin(), table.values_si[c].end());
    }
    write_text_table(cases, "values", values, rows, columns);
    write_text_table(cases, "labels", labels, rows, columns);
    const hsize_t dims[2] = {rows, columns};
    Hdf5Handle space(H5Screate_simple(2, dims, nullptr), H5Sclose);
    Hdf5Handle set(H5Dcreate2(cases, "values_si", H5T_IEEE_F64LE, space, H5P_DEFAULT, H5P_DEFAULT, H5P_DEFAULT), H5Dclose);
    if (!si.empty()) check(H5Dwrite(set, H5T_NATIVE_DOUBLE, H5S_ALL, H5S_ALL, H5P_DEFAULT, si.data()), "write values");
  }
  for (std::size_t c = 0; c < case_files.size(); ++c) {
    Hdf5Handle source(H5Fopen(case_files[c].c_str(), H5F_ACC_RDONLY, H5P_DEFAULT), H5Fclose);
    check(H5Ocopy(source, "/", file, case_name(c).c_str(), H5P_DEFAULT, H5P_DEFAULT), "copy a case");
  }
  file.save(path);
}

bool is_sweep_file(const std::filesystem::path& path) {
  Hdf5Handle file(open_hdf5_for_reading(path), H5Fclose);
  return hdf5_exists(file, "/cases/names");
}

SweepTable read_sweep_table(const std::filesystem::path& path) {
  const SourceLocation where{path.string(), 1, 1};
  Hdf5Handle file(open_hdf5_for_reading(path), H5Fclose);
  if (!hdf5_exists(file, "/cases/names") || !hdf5_exists(file, "/cases/values") || !hdf5_exists(file, "/cases/values_si"))
    throw InputError(where, "this is not a lobe sweep file (it has no /cases table)");
  SweepTable table;
  std::vector<hsize_t> dims, si_dims;
  table.names = read_strings(file, "/cases/names", dims);
  const std::vector<std::string> values = read_strings(file, "/cases/values", dims);
  const std::vector<Real> si = read_reals(file, "/cases/values_si", si_dims);
  const std::size_t columns = table.names.size();
  if (columns == 0 || dims.size() != 2 || dims[1] != columns || si_dims != dims)
    throw InputError(where, "the case table of this sweep file is malformed");
  // Files from before labels were kept show the override texts instead.
  std::vector<hsize_t> label_dims;
  const std::vector<std::string> labels =
      hdf5_exists(file, "/cases/labels") ? read_strings(file, "/cases/labels", label_dims) : values;
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
