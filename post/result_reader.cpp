#include "post/result_reader.hpp"

#include <vector>

#include "core/input_error.hpp"
#include "post/hdf5_handle.hpp"

namespace lobe {
namespace {

/// A dataset of doubles and its dimensions; nullopt-like empty dims when absent.
std::vector<Real> read_reals(hid_t file, const char* name, std::vector<hsize_t>& dims) {
  if (H5Lexists(file, name, H5P_DEFAULT) <= 0) return {};
  Hdf5Handle set(H5Dopen2(file, name, H5P_DEFAULT), H5Dclose);
  Hdf5Handle space(H5Dget_space(set), H5Sclose);
  dims.assign(static_cast<std::size_t>(H5Sget_simple_extent_ndims(space)), 0);
  H5Sget_simple_extent_dims(space, dims.data(), nullptr);
  hsize_t count = 1;
  for (hsize_t d : dims) count *= d;
  std::vector<Real> values(count);
  if (count > 0 && H5Dread(set, H5T_NATIVE_DOUBLE, H5S_ALL, H5S_ALL, H5P_DEFAULT, values.data()) < 0)
    throw std::runtime_error(std::string("cannot read ") + name);
  return values;
}

/// Opens a result file for reading, or throws InputError at FILE:1:1.
hid_t open_result(const std::filesystem::path& path) {
  H5Eset_auto2(H5E_DEFAULT, nullptr, nullptr);  // failures are reported here, not printed by HDF5
  if (H5Fis_hdf5(path.c_str()) <= 0) throw InputError({path.string(), 1, 1}, "cannot open this as an HDF5 result file");
  return H5Fopen(path.c_str(), H5F_ACC_RDONLY, H5P_DEFAULT);
}

/// A one-dimensional dataset of variable-length strings.
std::vector<std::string> read_strings(hid_t file, const char* name) {
  Hdf5Handle set(H5Dopen2(file, name, H5P_DEFAULT), H5Dclose);
  Hdf5Handle space(H5Dget_space(set), H5Sclose);
  hsize_t count = 0;
  H5Sget_simple_extent_dims(space, &count, nullptr);
  Hdf5Handle type(H5Tcopy(H5T_C_S1), H5Tclose);
  H5Tset_size(type, H5T_VARIABLE);
  std::vector<char*> pointers(count, nullptr);
  if (count > 0 && H5Dread(set, type, H5S_ALL, H5S_ALL, H5P_DEFAULT, pointers.data()) < 0)
    throw std::runtime_error(std::string("cannot read ") + name);
  std::vector<std::string> names(pointers.begin(), pointers.end());
  if (count > 0) H5Dvlen_reclaim(type, space, H5P_DEFAULT, pointers.data());
  return names;
}

bool exists(hid_t file, const char* group, const char* name) {
  return H5Lexists(file, group, H5P_DEFAULT) > 0 && H5Lexists(file, name, H5P_DEFAULT) > 0;
}

}  // namespace

std::vector<std::string> read_result_port_names(const std::filesystem::path& path) {
  Hdf5Handle file(open_result(path), H5Fclose);
  if (!exists(file, "/ports", "/ports/names"))
    throw InputError({path.string(), 1, 1}, "this is not a lobe antenna result (it has no /ports/names)");
  return read_strings(file, "/ports/names");
}

PatternData read_result_pattern(const std::filesystem::path& path) {
  Hdf5Handle file(open_result(path), H5Fclose);
  if (!exists(file, "/pattern", "/pattern/gain_dbi"))
    throw InputError({path.string(), 1, 1}, "this is not a lobe antenna result (it has no /pattern)");
  PatternData d;
  std::vector<hsize_t> dims;
  d.frequency_hz = read_reals(file, "/frequency_hz", dims);
  d.theta_deg = read_reals(file, "/pattern/theta_deg", dims);
  d.phi_deg = read_reals(file, "/pattern/phi_deg", dims);
  d.gain_dbi = read_reals(file, "/pattern/gain_dbi", dims);
  d.rhcp_dbi = read_reals(file, "/pattern/rhcp_dbi", dims);
  d.lhcp_dbi = read_reals(file, "/pattern/lhcp_dbi", dims);
  d.axial_ratio_db = read_reals(file, "/pattern/axial_ratio_db", dims);
  if (d.gain_dbi.size() != d.frequency_hz.size() * d.theta_deg.size() * d.phi_deg.size())
    throw InputError({path.string(), 1, 1}, "the pattern arrays of this result do not fit its grid");
  return d;
}

std::vector<Band> read_result_bands(const std::filesystem::path& path) {
  Hdf5Handle file(open_result(path), H5Fclose);
  if (!exists(file, "/model", "/model/band_names")) return {};
  const std::vector<std::string> names = read_strings(file, "/model/band_names");
  std::vector<hsize_t> dims;
  const std::vector<Real> edges = read_reals(file, "/model/band_edges_hz", dims);
  std::vector<Band> bands;
  for (std::size_t b = 0; b < names.size() && 2 * b + 1 < edges.size(); ++b)
    bands.push_back({names[b], edges[2 * b], edges[2 * b + 1]});
  return bands;
}

NetworkData read_result_network(const std::filesystem::path& path, const std::string& group) {
  const SourceLocation where{path.string(), 1, 1};
  Hdf5Handle file(open_result(path), H5Fclose);
  std::vector<hsize_t> f_dims, re_dims, im_dims, r_dims;
  if (!group.empty() && H5Lexists(file, group.c_str(), H5P_DEFAULT) <= 0)
    throw InputError(where, "the file has no group '" + group + "'");
  const std::vector<Real> frequencies = read_reals(file, (group + "/frequency_hz").c_str(), f_dims);
  const std::vector<Real> re = read_reals(file, (group + "/ports/s_matrix_re").c_str(), re_dims);
  const std::vector<Real> im = read_reals(file, (group + "/ports/s_matrix_im").c_str(), im_dims);
  const std::vector<Real> reference = read_reals(file, (group + "/model/reference_ohm").c_str(), r_dims);
  if (frequencies.empty() || re.empty() || re_dims.size() != 3 || re_dims != im_dims || re_dims[0] != frequencies.size() ||
      re_dims[1] != re_dims[2] || reference.size() != 1)
    throw InputError(where, "this is not a lobe antenna result (it lacks /ports/s_matrix_re and its companions)");
  NetworkData data;
  data.reference_ohm = reference.front();
  data.frequency_hz = frequencies;
  const auto n = static_cast<Eigen::Index>(re_dims[1]);
  for (std::size_t k = 0; k < frequencies.size(); ++k) {
    ComplexMatrix s(n, n);
    for (Eigen::Index i = 0; i < n; ++i)
      for (Eigen::Index j = 0; j < n; ++j) {
        const std::size_t at = (k * n + i) * n + j;
        s(i, j) = {re[at], im[at]};
      }
    data.s.push_back(s);
  }
  return data;
}

}  // namespace lobe
