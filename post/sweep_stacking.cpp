#include "post/sweep_stacking.hpp"

#include <hdf5_hl.h>

#include <cstring>
#include <map>
#include <optional>
#include <string>

#include "post/hdf5_reading.hpp"

namespace lobe {
namespace {

/// Groups whose arrays are results per frequency (or per band); the model and the
/// currents are geometry, which a sweep varies, and stay in each case's group.
constexpr const char* stacked_groups[] = {"/ports/", "/power/", "/beam/", "/band_figures/", "/pattern/", "/network/",
                                          "/solver/", "/scattering/"};

bool in_stacked_group(const std::string& path) {
  for (const char* group : stacked_groups)
    if (path.rfind(group, 0) == 0) return true;
  return false;
}

herr_t collect_dataset(hid_t, const char* name, const H5O_info_t* info, void* out) {
  if (info->type == H5O_TYPE_DATASET) static_cast<std::vector<std::string>*>(out)->push_back(std::string("/") + name);
  return 0;
}

herr_t scale_path(hid_t, unsigned, hid_t scale, void* out) {
  char name[512];
  if (H5Iget_name(scale, name, sizeof name) <= 0) return -1;
  *static_cast<std::string*>(out) = name;
  return 1;  // the first scale of the dimension
}

/// The paths of the scales attached to each dimension of `set`; nullopt when one has none.
std::optional<std::vector<std::string>> axis_paths(hid_t set, int rank) {
  std::vector<std::string> paths;
  for (int d = 0; d < rank; ++d) {
    std::string path;
    if (H5DSget_num_scales(set, static_cast<unsigned>(d)) <= 0 ||
        H5DSiterate_scales(set, static_cast<unsigned>(d), nullptr, scale_path, &path) < 0 || path.empty())
      return std::nullopt;
    paths.push_back(path);
  }
  return paths;
}

/// An axis's positions as text, to compare between cases: numbers exactly (17 digits).
std::vector<std::string> axis_positions(hid_t file, const std::string& path) {
  Hdf5Handle set(H5Dopen2(file, path.c_str(), H5P_DEFAULT), H5Dclose);
  Hdf5Handle type(H5Dget_type(set), H5Tclose);
  std::vector<hsize_t> dims;
  if (H5Tget_class(type) == H5T_STRING) return read_strings(file, path, dims);
  std::vector<std::string> positions;
  char text[32];
  for (Real v : read_reals(file, path, dims)) {
    std::snprintf(text, sizeof text, "%.17g", v);
    positions.emplace_back(text);
  }
  return positions;
}

std::string text_attribute_of(hid_t set, const char* name) {
  if (H5Aexists(set, name) <= 0) return "";
  Hdf5Handle attribute(H5Aopen(set, name, H5P_DEFAULT), H5Aclose);
  Hdf5Handle type(H5Aget_type(attribute), H5Tclose);
  char* text = nullptr;
  if (H5Tis_variable_str(type) <= 0 || H5Aread(attribute, type, &text) < 0 || !text) return "";
  std::string value = text;
  H5free_memory(text);
  return value;
}

/// Builds the stacked copies of the cases' axes on first use.
class StackedAxes {
 public:
  StackedAxes(hid_t sweep_file, hid_t first_case) : m_sweep(sweep_file), m_first(first_case) {}

  hdf5::Axis axis(const std::string& path) {
    if (const auto found = m_axes.find(path); found != m_axes.end()) return found->second;
    const std::string stacked = "/stacked" + path;
    const auto slash = stacked.rfind('/');
    ensure_groups(stacked.substr(0, slash));
    Hdf5Handle set(H5Dopen2(m_first, path.c_str(), H5P_DEFAULT), H5Dclose);
    Hdf5Handle type(H5Dget_type(set), H5Tclose);
    const std::string name = stacked.substr(slash + 1);
    std::vector<hsize_t> dims;
    hdf5::Axis axis;
    if (H5Tget_class(type) == H5T_STRING)
      axis = hdf5::text_axis(m_sweep, stacked.substr(0, slash), name, read_strings(m_first, path, dims));
    else if (H5Tget_class(type) == H5T_INTEGER)
      axis = hdf5::counting_axis(m_sweep, stacked.substr(0, slash), name, read_reals(m_first, path, dims).size());
    else
      axis = hdf5::real_axis(m_sweep, stacked.substr(0, slash), name, read_reals(m_first, path, dims),
                             text_attribute_of(set, "units"));
    return m_axes.emplace(path, axis).first->second;
  }

  void ensure_groups(const std::string& path) {
    for (std::size_t slash = path.find('/', 1);; slash = path.find('/', slash + 1)) {
      const std::string group = path.substr(0, slash);
      if (H5Lexists(m_sweep, group.c_str(), H5P_DEFAULT) <= 0) hdf5::create_group(m_sweep, group);
      if (slash == std::string::npos) return;
    }
  }

 private:
  hid_t m_sweep, m_first;
  std::map<std::string, hdf5::Axis> m_axes;
};

/// Why `path` cannot be stacked, or "" when it can.
/// Whether each axis holds the same positions in every case, read once per axis (every
/// per-frequency array shares /frequency).
class AxisAgreement {
 public:
  explicit AxisAgreement(const std::vector<hid_t>& cases) : m_cases(cases) {}
  bool same_in_every_case(const std::string& axis) {
    if (const auto known = m_same.find(axis); known != m_same.end()) return known->second;
    const std::vector<std::string> positions = axis_positions(m_cases.front(), axis);
    bool same = true;
    for (std::size_t c = 1; c < m_cases.size() && same; ++c) same = axis_positions(m_cases[c], axis) == positions;
    return m_same.emplace(axis, same).first->second;
  }

 private:
  const std::vector<hid_t>& m_cases;
  std::map<std::string, bool> m_same;
};

std::string reason_not_stackable(const std::vector<hid_t>& cases, const std::string& path,
                                 const std::vector<std::string>& axes, AxisAgreement& agreement) {
  Hdf5Handle first(H5Dopen2(cases.front(), path.c_str(), H5P_DEFAULT), H5Dclose);
  Hdf5Handle first_type(H5Dget_type(first), H5Tclose);
  for (std::size_t c = 1; c < cases.size(); ++c) {
    if (H5Lexists(cases[c], path.c_str(), H5P_DEFAULT) <= 0) return "not in every case";
    Hdf5Handle set(H5Dopen2(cases[c], path.c_str(), H5P_DEFAULT), H5Dclose);
    Hdf5Handle type(H5Dget_type(set), H5Tclose);
    if (H5Tequal(type, first_type) <= 0) return "its type differs between cases";
    const auto paths = axis_paths(set, static_cast<int>(axes.size()));
    if (!paths || *paths != axes) return "its axes differ between cases";
  }
  for (const auto& axis : axes)
    if (!agreement.same_in_every_case(axis)) return axis.substr(axis.rfind('/') + 1) + " differs between cases";
  return "";
}

/// The bytes of `path` in every case, one after another, in the cases' stored type.
std::vector<unsigned char> stacked_bytes(const std::vector<hid_t>& cases, const std::string& path, hid_t memory_type) {
  std::vector<unsigned char> bytes;
  for (hid_t file : cases) {
    Hdf5Handle set(H5Dopen2(file, path.c_str(), H5P_DEFAULT), H5Dclose);
    Hdf5Handle space(H5Dget_space(set), H5Sclose);
    const std::size_t size = static_cast<std::size_t>(H5Sget_simple_extent_npoints(space)) * H5Tget_size(memory_type);
    const std::size_t at = bytes.size();
    bytes.resize(at + size);
    if (size > 0) hdf5::check(H5Dread(set, memory_type, H5S_ALL, H5S_ALL, H5P_DEFAULT, bytes.data() + at));
  }
  return bytes;
}

}  // namespace

void copy_case_group(hid_t sweep_file, const std::string& group, hid_t case_file) {
  hdf5::check(H5Ocopy(case_file, "/", sweep_file, group.c_str(), H5P_DEFAULT, H5P_DEFAULT));
  // The copied axis references point into the case's own file; HDF5 cannot map them to the
  // copies, so the attachments are dropped and made again inside the group.
  std::vector<std::string> datasets;
  hdf5::check(H5Ovisit2(case_file, H5_INDEX_NAME, H5_ITER_INC, collect_dataset, &datasets, H5O_INFO_BASIC));
  for (const auto& path : datasets) {
    Hdf5Handle copy(H5Dopen2(sweep_file, (group + path).c_str(), H5P_DEFAULT), H5Dclose);
    for (const char* attribute : {"DIMENSION_LIST", "REFERENCE_LIST"})
      if (H5Aexists(copy, attribute) > 0) hdf5::check(H5Adelete(copy, attribute));
  }
  for (const auto& path : datasets) {
    Hdf5Handle source(H5Dopen2(case_file, path.c_str(), H5P_DEFAULT), H5Dclose);
    Hdf5Handle space(H5Dget_space(source), H5Sclose);
    const int rank = H5Sget_simple_extent_ndims(space);
    Hdf5Handle copy(H5Dopen2(sweep_file, (group + path).c_str(), H5P_DEFAULT), H5Dclose);
    for (int d = 0; d < rank; ++d) {
      std::string axis;
      if (H5DSget_num_scales(source, static_cast<unsigned>(d)) <= 0 ||
          H5DSiterate_scales(source, static_cast<unsigned>(d), nullptr, scale_path, &axis) < 0 || axis == path)
        continue;
      Hdf5Handle scale(H5Dopen2(sweep_file, (group + axis).c_str(), H5P_DEFAULT), H5Dclose);
      hdf5::check(H5DSattach_scale(copy, scale, static_cast<unsigned>(d)));
    }
  }
}

void write_stacked_arrays(hid_t sweep_file, const std::vector<std::string>& case_names, const std::vector<hid_t>& case_files) {
  if (case_files.empty()) return;
  hdf5::Handle stacked = hdf5::create_group(sweep_file, "/stacked");
  // The case axis again inside /stacked: netCDF readers find axes only in a group or its parents.
  const hdf5::Axis cases = hdf5::text_axis(sweep_file, "/stacked", "case", case_names);
  const hid_t first = case_files.front();
  std::vector<std::string> datasets;
  hdf5::check(H5Ovisit2(first, H5_INDEX_NAME, H5_ITER_INC, collect_dataset, &datasets, H5O_INFO_BASIC));
  StackedAxes axes(sweep_file, first);
  AxisAgreement agreement(case_files);
  std::string left_out;
  for (const auto& path : datasets) {
    if (!in_stacked_group(path)) continue;
    Hdf5Handle set(H5Dopen2(first, path.c_str(), H5P_DEFAULT), H5Dclose);
    Hdf5Handle type(H5Dget_type(set), H5Tclose);
    Hdf5Handle space(H5Dget_space(set), H5Sclose);
    const int rank = H5Sget_simple_extent_ndims(space);
    if (H5DSis_scale(set) > 0 || rank < 1 || H5Tget_class(type) == H5T_STRING) continue;
    const auto paths = axis_paths(set, rank);
    const std::string reason = paths ? reason_not_stackable(case_files, path, *paths, agreement) : "it has no axes";
    if (!reason.empty()) {
      left_out += (left_out.empty() ? "" : "; ") + path + " (" + reason + ")";
      continue;
    }
    std::vector<hdf5::Axis> shape{cases};
    for (const auto& axis : *paths) shape.push_back(axes.axis(axis));
    const std::string target = "/stacked" + path;
    axes.ensure_groups(target.substr(0, target.rfind('/')));
    Hdf5Handle memory(H5Tget_native_type(type, H5T_DIR_ASCEND), H5Tclose);
    const std::vector<unsigned char> bytes = stacked_bytes(case_files, path, memory);
    hdf5::write_raw(sweep_file, target, shape, type, memory, bytes.data(), bytes.size() / H5Tget_size(memory));
    const std::string units = text_attribute_of(set, "units"), meaning = text_attribute_of(set, "meaning");
    Hdf5Handle written(H5Dopen2(sweep_file, target.c_str(), H5P_DEFAULT), H5Dclose);
    if (!units.empty()) hdf5::text_attribute(written, "units", units);
    if (!meaning.empty()) hdf5::text_attribute(written, "meaning", meaning);
  }
  hdf5::text_attribute(stacked, "left_out", left_out.empty() ? "nothing" : left_out);
}

}  // namespace lobe
