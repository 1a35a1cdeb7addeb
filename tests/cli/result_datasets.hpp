#pragma once
/// One dataset or root attribute of an HDF5 result file, for the command-line tests.
#include <gtest/gtest.h>

#include <filesystem>
#include <string>
#include <vector>

#include "post/hdf5_reading.hpp"

namespace lobe::testing {

/// A dataset read by `reader` (read_reals, read_complex), flattened; a missing one fails the
/// test (an empty list would let comparisons pass on nothing).
template <class Reader>
auto dataset_read_by(const std::filesystem::path& file, const std::string& name, Reader reader) {
  const hid_t h = open_hdf5_for_reading(file);
  EXPECT_TRUE(hdf5_exists(h, name)) << file << " has no " << name;
  std::vector<hsize_t> dims;
  auto values = reader(h, name, dims);
  H5Fclose(h);
  return values;
}

/// A numeric dataset, flattened.
inline std::vector<Real> dataset(const std::filesystem::path& file, const std::string& name) {
  return dataset_read_by(file, name, read_reals);
}

/// A complex dataset ({r, i}), flattened.
inline std::vector<Complex> complex_dataset(const std::filesystem::path& file, const std::string& name) {
  return dataset_read_by(file, name, read_complex);
}

/// An integer attribute of the file's root group.
inline int root_int_attribute(const std::filesystem::path& file, const std::string& name) {
  const hid_t h = open_hdf5_for_reading(file);
  int value = -1;
  const hid_t attribute = H5Aopen(h, name.c_str(), H5P_DEFAULT);
  if (attribute >= 0) {
    H5Aread(attribute, H5T_NATIVE_INT, &value);
    H5Aclose(attribute);
  }
  H5Fclose(h);
  return value;
}

}  // namespace lobe::testing
