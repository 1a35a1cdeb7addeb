#include "post/hdf5_reading.hpp"

#include "core/input_error.hpp"

namespace lobe {
namespace {

/// Reads the dimensions of a dataset's space; returns the element count.
hsize_t dimensions(hid_t set, std::vector<hsize_t>& dims) {
  Hdf5Handle space(H5Dget_space(set), H5Sclose);
  dims.assign(static_cast<std::size_t>(H5Sget_simple_extent_ndims(space)), 0);
  H5Sget_simple_extent_dims(space, dims.data(), nullptr);
  hsize_t count = 1;
  for (hsize_t d : dims) count *= d;
  return count;
}

}  // namespace

hid_t open_hdf5_for_reading(const std::filesystem::path& path) {
  H5Eset_auto2(H5E_DEFAULT, nullptr, nullptr);
  if (H5Fis_hdf5(path.c_str()) <= 0) throw InputError({path.string(), 1, 1}, "cannot open this as an HDF5 result file");
  return H5Fopen(path.c_str(), H5F_ACC_RDONLY, H5P_DEFAULT);
}

bool hdf5_exists(hid_t file, const std::string& name) {
  // H5Lexists needs every parent group to exist, so check the path one link at a time.
  for (std::size_t slash = name.find('/', 1);; slash = name.find('/', slash + 1)) {
    if (H5Lexists(file, name.substr(0, slash).c_str(), H5P_DEFAULT) <= 0) return false;
    if (slash == std::string::npos) return true;
  }
}

std::vector<Real> read_reals(hid_t file, const std::string& name, std::vector<hsize_t>& dims) {
  dims.clear();
  if (!hdf5_exists(file, name)) return {};
  Hdf5Handle set(H5Dopen2(file, name.c_str(), H5P_DEFAULT), H5Dclose);
  std::vector<Real> values(dimensions(set, dims));
  if (!values.empty() && H5Dread(set, H5T_NATIVE_DOUBLE, H5S_ALL, H5S_ALL, H5P_DEFAULT, values.data()) < 0)
    throw std::runtime_error("cannot read " + name);
  return values;
}

std::vector<std::string> read_strings(hid_t file, const std::string& name, std::vector<hsize_t>& dims) {
  Hdf5Handle set(H5Dopen2(file, name.c_str(), H5P_DEFAULT), H5Dclose);
  const hsize_t count = dimensions(set, dims);
  Hdf5Handle space(H5Dget_space(set), H5Sclose);
  Hdf5Handle type(H5Tcopy(H5T_C_S1), H5Tclose);
  H5Tset_size(type, H5T_VARIABLE);
  std::vector<char*> pointers(count, nullptr);
  if (count > 0 && H5Dread(set, type, H5S_ALL, H5S_ALL, H5P_DEFAULT, pointers.data()) < 0)
    throw std::runtime_error("cannot read " + name);
  std::vector<std::string> strings;
  for (char* p : pointers) strings.emplace_back(p ? p : "");
  if (count > 0) H5Dvlen_reclaim(type, space, H5P_DEFAULT, pointers.data());
  return strings;
}

}  // namespace lobe
