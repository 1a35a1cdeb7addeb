#include "post/hdf5_layout.hpp"

#include <hdf5_hl.h>

#include <stdexcept>

namespace lobe::hdf5 {
namespace {

std::vector<hsize_t> shape_of(const std::vector<Axis>& axes) {
  std::vector<hsize_t> dims;
  for (const Axis& a : axes) dims.push_back(a.length);
  return dims;
}

std::size_t count_of(const std::vector<Axis>& axes) {
  std::size_t n = 1;
  for (const Axis& a : axes) n *= a.length;
  return n;
}

Hdf5Handle space_for(const std::vector<Axis>& axes) {
  if (axes.empty()) return Hdf5Handle(H5Screate(H5S_SCALAR), H5Sclose);
  const std::vector<hsize_t> dims = shape_of(axes);
  return Hdf5Handle(H5Screate_simple(static_cast<int>(dims.size()), dims.data(), nullptr), H5Sclose);
}

Hdf5Handle utf8_text_type() {
  Hdf5Handle type(H5Tcopy(H5T_C_S1), H5Tclose);
  check(H5Tset_size(type, H5T_VARIABLE));
  check(H5Tset_cset(type, H5T_CSET_UTF8));
  return type;
}

/// The compound {r, i} of two doubles, laid out as std::complex<double> in memory.
Hdf5Handle complex_type(hid_t member) {
  Hdf5Handle type(H5Tcreate(H5T_COMPOUND, 2 * H5Tget_size(member)), H5Tclose);
  check(H5Tinsert(type, "r", 0, member));
  check(H5Tinsert(type, "i", H5Tget_size(member), member));
  return type;
}

void require_count(const std::string& path, std::size_t have, const std::vector<Axis>& axes) {
  if (have != count_of(axes)) throw std::logic_error("HDF5 dataset " + path + " does not fit its axes");
}

void write_dataset(hid_t file, const std::string& path, const std::vector<Axis>& axes, hid_t file_type, hid_t memory_type,
                   const void* data, std::size_t count) {
  require_count(path, count, axes);
  Hdf5Handle space = space_for(axes);
  Hdf5Handle set(H5Dcreate2(file, path.c_str(), file_type, space, H5P_DEFAULT, H5P_DEFAULT, H5P_DEFAULT), H5Dclose);
  if (count > 0) check(H5Dwrite(set, memory_type, H5S_ALL, H5S_ALL, H5P_DEFAULT, data));
}

void units_attribute(hid_t file, const std::string& path, const char* name, const std::string& value) {
  Hdf5Handle set(H5Dopen2(file, path.c_str(), H5P_DEFAULT), H5Dclose);
  text_attribute(set, name, value);
}

Axis make_scale(hid_t file, const std::string& path, const std::string& name, hsize_t length) {
  Hdf5Handle set(H5Dopen2(file, path.c_str(), H5P_DEFAULT), H5Dclose);
  check(H5DSset_scale(set, name.c_str()));
  return {path, length, name};
}

}  // namespace

void check(herr_t status) {
  if (status < 0) throw std::runtime_error("HDF5 write failed");
}

Hdf5Handle create_group(hid_t parent, const std::string& name) {
  return Hdf5Handle(H5Gcreate2(parent, name.c_str(), H5P_DEFAULT, H5P_DEFAULT, H5P_DEFAULT), H5Gclose);
}

void text_attribute(hid_t object, const std::string& name, const std::string& value) {
  Hdf5Handle type = utf8_text_type();
  Hdf5Handle space(H5Screate(H5S_SCALAR), H5Sclose);
  Hdf5Handle attribute(H5Acreate2(object, name.c_str(), type, space, H5P_DEFAULT, H5P_DEFAULT), H5Aclose);
  const char* text = value.c_str();
  check(H5Awrite(attribute, type, &text));
}

void integer_attribute(hid_t object, const std::string& name, long value) {
  Hdf5Handle space(H5Screate(H5S_SCALAR), H5Sclose);
  Hdf5Handle attribute(H5Acreate2(object, name.c_str(), H5T_STD_I64LE, space, H5P_DEFAULT, H5P_DEFAULT), H5Aclose);
  check(H5Awrite(attribute, H5T_NATIVE_LONG, &value));
}

void write_reals(hid_t file, const std::string& path, const std::vector<Axis>& axes, const std::vector<Real>& data,
                 const std::string& units) {
  write_dataset(file, path, axes, H5T_IEEE_F64LE, H5T_NATIVE_DOUBLE, data.data(), data.size());
  units_attribute(file, path, "units", units);
  attach_axes(file, path, axes);
}

void write_complex(hid_t file, const std::string& path, const std::vector<Axis>& axes, const std::vector<Complex>& data,
                   const std::string& units) {
  Hdf5Handle stored = complex_type(H5T_IEEE_F64LE), memory = complex_type(H5T_NATIVE_DOUBLE);
  static_assert(sizeof(Complex) == 2 * sizeof(double));
  write_dataset(file, path, axes, stored, memory, data.data(), data.size());
  units_attribute(file, path, "units", units);
  attach_axes(file, path, axes);
}

void write_ints(hid_t file, const std::string& path, const std::vector<Axis>& axes, const std::vector<int>& data,
                const std::string& meaning) {
  write_dataset(file, path, axes, H5T_STD_I32LE, H5T_NATIVE_INT, data.data(), data.size());
  units_attribute(file, path, "meaning", meaning);
  attach_axes(file, path, axes);
}

void write_texts(hid_t file, const std::string& path, const std::vector<Axis>& axes, const std::vector<std::string>& data) {
  std::vector<const char*> pointers;
  for (const auto& s : data) pointers.push_back(s.c_str());
  Hdf5Handle type = utf8_text_type();
  write_dataset(file, path, axes, type, type, pointers.data(), pointers.size());
  attach_axes(file, path, axes);
}

void write_raw(hid_t file, const std::string& path, const std::vector<Axis>& axes, hid_t file_type, hid_t memory_type,
               const void* data, std::size_t count) {
  write_dataset(file, path, axes, file_type, memory_type, data, count);
  attach_axes(file, path, axes);
}

void write_text(hid_t file, const std::string& path, const std::string& value) {
  const char* text = value.c_str();
  Hdf5Handle type = utf8_text_type();
  write_dataset(file, path, {}, type, type, &text, 1);
}

void attach_axes(hid_t file, const std::string& path, const std::vector<Axis>& axes) {
  Hdf5Handle set(H5Dopen2(file, path.c_str(), H5P_DEFAULT), H5Dclose);
  for (std::size_t d = 0; d < axes.size(); ++d) {
    const auto index = static_cast<unsigned>(d);
    check(H5DSset_label(set, index, axes[d].name.c_str()));
    if (axes[d].path == path) continue;  // a scale is not attached to itself
    Hdf5Handle scale(H5Dopen2(file, axes[d].path.c_str(), H5P_DEFAULT), H5Dclose);
    check(H5DSattach_scale(set, scale, index));
  }
}

Axis real_axis(hid_t file, const std::string& group, const std::string& name, const std::vector<Real>& values,
               const std::string& units) {
  const std::string path = group + "/" + name;
  const Axis self{path, values.size(), name};
  write_reals(file, path, {self}, values, units);
  return make_scale(file, path, name, values.size());
}

Axis text_axis(hid_t file, const std::string& group, const std::string& name, const std::vector<std::string>& values) {
  const std::string path = group + "/" + name;
  const Axis self{path, values.size(), name};
  write_texts(file, path, {self}, values);
  return make_scale(file, path, name, values.size());
}

Axis counting_axis(hid_t file, const std::string& group, const std::string& name, std::size_t length) {
  const std::string path = group + "/" + name;
  std::vector<int> numbers(length);
  for (std::size_t k = 0; k < length; ++k) numbers[k] = static_cast<int>(k + 1);
  const Axis self{path, length, name};
  write_ints(file, path, {self}, numbers, "position along the axis, counted from 1");
  return make_scale(file, path, name, length);
}

void mark_format(hid_t file, const std::string& format) {
  text_attribute(file, "format", format);
  text_attribute(file, "format_version", std::to_string(format_major) + "." + std::to_string(format_minor));
}

}  // namespace lobe::hdf5
