#pragma once
/// One dataset of an HDF5 result file as numbers, for the command-line tests.
#include <filesystem>
#include <string>
#include <vector>

#include "post/hdf5_reading.hpp"

namespace lobe::testing {

inline std::vector<Real> dataset(const std::filesystem::path& file, const std::string& name) {
  const hid_t h = open_hdf5_for_reading(file);
  std::vector<hsize_t> dims;
  std::vector<Real> values = read_reals(h, name, dims);
  H5Fclose(h);
  return values;
}

}  // namespace lobe::testing
