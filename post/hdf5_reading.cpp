#include "post/hdf5_reading.hpp"

#include <cstdio>
#include <cstring>
#include <limits>

#include "core/input_error.hpp"
#include "post/hdf5_layout.hpp"
#include "post/output_files.hpp"

namespace lobe {
namespace {

/// A reader is handed files it did not write: everything the file claims is checked before
/// it is believed, and every failure is an InputError naming the file and the dataset.
constexpr int max_rank = 4;
/// Values a dataset may claim per byte it stores: room for compression of real data, none
/// for a header that claims a billion values in a file of a few kilobytes.
constexpr double max_values_per_stored_byte = 8.0;

std::string file_name(hid_t file) {
  const ssize_t length = H5Fget_name(file, nullptr, 0);
  if (length <= 0) return "(HDF5 file)";
  std::string name(static_cast<std::size_t>(length) + 1, '\0');
  H5Fget_name(file, name.data(), name.size());
  name.resize(static_cast<std::size_t>(length));
  return name;
}

[[noreturn]] void refuse(hid_t file, const std::string& message) { throw InputError({file_name(file), 1, 1}, message); }

/// The compound {r, i} of two floating-point numbers that lobe writes for complex values.
bool is_complex_type(hid_t type) {
  if (H5Tget_class(type) != H5T_COMPOUND || H5Tget_nmembers(type) != 2) return false;
  for (unsigned m = 0; m < 2; ++m) {
    char* name = H5Tget_member_name(type, m);
    const bool named = name && std::strcmp(name, m == 0 ? "r" : "i") == 0;
    H5free_memory(name);
    if (!named || H5Tget_member_class(type, m) != H5T_FLOAT) return false;
  }
  return true;
}

/// Opens dataset `name` after checking that it is one, of the expected type class, with a
/// rank and size the file can really hold; returns its element count and dimensions.
hid_t open_checked(hid_t file, const std::string& name, H5T_class_t expected, std::vector<hsize_t>& dims, hsize_t& count) {
  H5O_info_t info{};
  if (H5Oget_info_by_name2(file, name.c_str(), &info, H5O_INFO_BASIC, H5P_DEFAULT) < 0 || info.type != H5O_TYPE_DATASET)
    refuse(file, "'" + name + "' is not a dataset in this file (a group or a broken link stands where data belongs)");
  const hid_t set = H5Dopen2(file, name.c_str(), H5P_DEFAULT);
  if (set < 0) refuse(file, "cannot open '" + name + "' (the file may be truncated or damaged)");
  Hdf5Handle type(H5Dget_type(set), H5Tclose);
  const H5T_class_t found = H5Tget_class(type);
  const bool numeric = found == H5T_FLOAT || found == H5T_INTEGER;
  if (expected == H5T_FLOAT ? !numeric : found != expected || (expected == H5T_COMPOUND && !is_complex_type(type))) {
    H5Dclose(set);
    const auto kind = [](H5T_class_t c) {
      return c == H5T_STRING ? "text" : c == H5T_COMPOUND ? "complex numbers" : c == H5T_FLOAT || c == H5T_INTEGER ? "numbers" : "data of another kind";
    };
    refuse(file, "'" + name + "' holds " + (found == H5T_COMPOUND && !is_complex_type(type) ? "data of another kind" : kind(found)) +
                     " where " + kind(expected) + " belong");
  }
  Hdf5Handle space(H5Dget_space(set), H5Sclose);
  const int rank = H5Sget_simple_extent_ndims(space);
  if (rank < 0 || rank > max_rank) {
    H5Dclose(set);
    refuse(file, "'" + name + "' has " + std::to_string(rank) + " dimensions; lobe's results have at most 4");
  }
  dims.assign(static_cast<std::size_t>(rank), 0);
  H5Sget_simple_extent_dims(space, dims.data(), nullptr);
  double claimed = 1.0;
  for (hsize_t d : dims) claimed *= static_cast<double>(d);
  const double stored = static_cast<double>(H5Dget_storage_size(set));
  if (claimed > max_values_per_stored_byte * stored || claimed > static_cast<double>(std::numeric_limits<std::int32_t>::max())) {
    H5Dclose(set);
    refuse(file, "'" + name + "' claims " + std::to_string(static_cast<long long>(claimed)) + " values but the file holds " +
                     std::to_string(static_cast<long long>(stored)) + " bytes of them");
  }
  count = static_cast<hsize_t>(claimed);
  return set;
}

}  // namespace

hid_t open_hdf5_for_reading(const std::filesystem::path& path) {
  H5Eset_auto2(H5E_DEFAULT, nullptr, nullptr);
  const SourceLocation where{path.string(), 1, 1};
  std::error_code error;
  if (std::filesystem::is_directory(path, error)) throw InputError(where, "this is a directory, not a result file");
  if (H5Fis_hdf5(path.c_str()) <= 0) throw InputError(where, "cannot open this as an HDF5 result file");
  if (const auto marker = publishing_marker_for(path))
    throw InputError(where, "this result set was interrupted while it was being written (" + marker->filename().string() +
                                " names it): its files may be part new, part old; run it again");
  const hid_t file = H5Fopen(path.c_str(), H5F_ACC_RDONLY, H5P_DEFAULT);
  if (file < 0) throw InputError(where, "cannot open this HDF5 file: it is truncated or damaged");
  try {
    require_readable_format(file, where);
  } catch (...) {
    H5Fclose(file);
    throw;
  }
  return file;
}

void require_readable_format(hid_t file, const SourceLocation& where) {
  const std::string readable = std::to_string(hdf5::format_major) + ".x";
  if (H5Aexists(file, "format_version") <= 0)
    throw InputError(where, "this file has no format_version: it is not a lobe result, or one written before lobe's "
                            "versioned layout (" + readable + "); run the model again with this lobe");
  Hdf5Handle attribute(H5Aopen(file, "format_version", H5P_DEFAULT), H5Aclose);
  Hdf5Handle type(H5Aget_type(attribute), H5Tclose);
  Hdf5Handle space(H5Aget_space(attribute), H5Sclose);
  std::string version;
  if (H5Tget_class(type) == H5T_STRING && H5Tis_variable_str(type) > 0 && H5Sget_simple_extent_npoints(space) == 1) {
    char* text = nullptr;
    if (H5Aread(attribute, type, &text) >= 0 && text) version = text;
    if (text) H5free_memory(text);
  }
  int major = 0, minor = 0;
  char rest = 0;
  if (std::sscanf(version.c_str(), "%d.%d%c", &major, &minor, &rest) != 2 || major < 1 || minor < 0)
    throw InputError(where, "this file's format_version is not of the form MAJOR.MINOR ('" + version.substr(0, 40) + "')");
  if (major > hdf5::format_major)
    throw InputError(where, "this file is in lobe's result format " + version + ", newer than this lobe reads (" + readable +
                                "); read it with a newer lobe");
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
  hsize_t count = 0;
  Hdf5Handle set(open_checked(file, name, H5T_FLOAT, dims, count), H5Dclose);
  std::vector<Real> values(count);
  if (!values.empty() && H5Dread(set, H5T_NATIVE_DOUBLE, H5S_ALL, H5S_ALL, H5P_DEFAULT, values.data()) < 0)
    refuse(file, "cannot read '" + name + "' (the file may be truncated or damaged)");
  return values;
}

std::vector<Complex> read_complex(hid_t file, const std::string& name, std::vector<hsize_t>& dims) {
  dims.clear();
  if (!hdf5_exists(file, name)) return {};
  hsize_t count = 0;
  Hdf5Handle set(open_checked(file, name, H5T_COMPOUND, dims, count), H5Dclose);
  Hdf5Handle type(H5Tcreate(H5T_COMPOUND, sizeof(Complex)), H5Tclose);
  H5Tinsert(type, "r", 0, H5T_NATIVE_DOUBLE);
  H5Tinsert(type, "i", sizeof(double), H5T_NATIVE_DOUBLE);
  std::vector<Complex> values(count);
  if (!values.empty() && H5Dread(set, type, H5S_ALL, H5S_ALL, H5P_DEFAULT, values.data()) < 0)
    refuse(file, "cannot read '" + name + "' (the file may be truncated or damaged)");
  return values;
}

std::vector<std::string> read_strings(hid_t file, const std::string& name, std::vector<hsize_t>& dims) {
  dims.clear();
  if (!hdf5_exists(file, name)) refuse(file, "this file has no '" + name + "'");
  hsize_t count = 0;
  Hdf5Handle set(open_checked(file, name, H5T_STRING, dims, count), H5Dclose);
  Hdf5Handle file_type(H5Dget_type(set), H5Tclose);
  if (H5Tis_variable_str(file_type) <= 0) refuse(file, "'" + name + "' holds fixed-length text; lobe writes variable-length");
  Hdf5Handle space(H5Dget_space(set), H5Sclose);
  Hdf5Handle type(H5Tcopy(H5T_C_S1), H5Tclose);
  H5Tset_size(type, H5T_VARIABLE);
  H5Tset_cset(type, H5Tget_cset(file_type));
  std::vector<char*> pointers(count, nullptr);
  if (count > 0 && H5Dread(set, type, H5S_ALL, H5S_ALL, H5P_DEFAULT, pointers.data()) < 0)
    refuse(file, "cannot read '" + name + "' (the file may be truncated or damaged)");
  std::vector<std::string> strings;
  for (char* p : pointers) strings.emplace_back(p ? p : "");
  if (count > 0) H5Dvlen_reclaim(type, space, H5P_DEFAULT, pointers.data());
  return strings;
}

std::string read_text(hid_t file, const std::string& name) {
  if (!hdf5_exists(file, name)) refuse(file, "this file has no '" + name + "'");
  std::vector<hsize_t> dims;
  const std::vector<std::string> text = read_strings(file, name, dims);
  if (!dims.empty() || text.size() != 1) refuse(file, "'" + name + "' is not one text");
  return text.front();
}

}  // namespace lobe
