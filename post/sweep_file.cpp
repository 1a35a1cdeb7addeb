#include "post/sweep_file.hpp"

#include <cstdio>
#include <stdexcept>

#include "post/hdf5_handle.hpp"

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

void write_sweep_hdf5(const std::filesystem::path& path, const std::vector<std::string>& names,
                      const std::vector<std::vector<std::string>>& texts, const std::vector<std::vector<Real>>& si,
                      const std::vector<std::filesystem::path>& case_files) {
  Hdf5Handle file(H5Fcreate(path.c_str(), H5F_ACC_TRUNC, H5P_DEFAULT, H5P_DEFAULT), H5Fclose);
  {
    Hdf5Handle cases(H5Gcreate2(file, "cases", H5P_DEFAULT, H5P_DEFAULT, H5P_DEFAULT), H5Gclose);
    write_text_table(cases, "names", names, names.size(), 0);
    std::vector<std::string> flat;
    std::vector<Real> values;
    for (std::size_t c = 0; c < texts.size(); ++c) {
      flat.insert(flat.end(), texts[c].begin(), texts[c].end());
      values.insert(values.end(), si[c].begin(), si[c].end());
    }
    write_text_table(cases, "values", flat, texts.size(), names.size());
    const hsize_t dims[2] = {si.size(), names.size()};
    Hdf5Handle space(H5Screate_simple(2, dims, nullptr), H5Sclose);
    Hdf5Handle set(H5Dcreate2(cases, "values_si", H5T_IEEE_F64LE, space, H5P_DEFAULT, H5P_DEFAULT, H5P_DEFAULT), H5Dclose);
    if (!values.empty()) check(H5Dwrite(set, H5T_NATIVE_DOUBLE, H5S_ALL, H5S_ALL, H5P_DEFAULT, values.data()), "write values");
  }
  for (std::size_t c = 0; c < case_files.size(); ++c) {
    Hdf5Handle source(H5Fopen(case_files[c].c_str(), H5F_ACC_RDONLY, H5P_DEFAULT), H5Fclose);
    check(H5Ocopy(source, "/", file, case_name(c).c_str(), H5P_DEFAULT, H5P_DEFAULT), "copy a case");
  }
  check(H5Fflush(file, H5F_SCOPE_GLOBAL), "flush");
}

}  // namespace lobe
