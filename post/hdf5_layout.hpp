#pragma once
/// The building blocks of lobe's HDF5 layout (internal to post/; docs/hdf5_layout.md
/// describes the result). Every array's dimensions are axes: datasets made HDF5 dimension
/// scales ("frequency", "port", "theta", …) and attached to it, so that h5py, xarray and
/// MATLAB show named, labelled axes. A dataset takes its shape from its axes, so the two
/// cannot disagree. Complex values are the compound {r, i} that h5py and MATLAB read as
/// complex; text is UTF-8 and of variable length.
#include <string>
#include <vector>

#include "core/types.hpp"
#include "post/hdf5_handle.hpp"

namespace lobe::hdf5 {

using Handle = Hdf5Handle;

/// The layout's version: a reader refuses a newer major (an incompatible change) and reads
/// a newer minor (datasets added).
constexpr int format_major = 1;
constexpr int format_minor = 0;

/// Throws std::runtime_error when an HDF5 call failed.
void check(herr_t status);

Hdf5Handle create_group(hid_t parent, const std::string& name);

/// One axis: the absolute path of its scale dataset (named as the axis, "/frequency",
/// "/ports/port", so that xarray names the dimension so too), its length and its name.
struct Axis {
  std::string path;
  hsize_t length = 0;
  std::string name;
};

/// Axes whose positions are numbers (frequencies, angles), text (port names) or 1, 2, 3 …,
/// written as the dataset `name` in `group` ("" for the root, "/ports").
Axis real_axis(hid_t file, const std::string& group, const std::string& name, const std::vector<Real>& values,
               const std::string& units);
Axis text_axis(hid_t file, const std::string& group, const std::string& name, const std::vector<std::string>& values);
Axis counting_axis(hid_t file, const std::string& group, const std::string& name, std::size_t length);

/// Datasets at `path` (absolute) shaped by `axes`, with a "units" attribute for numbers.
void write_reals(hid_t file, const std::string& path, const std::vector<Axis>& axes, const std::vector<Real>& data,
                 const std::string& units);
void write_complex(hid_t file, const std::string& path, const std::vector<Axis>& axes, const std::vector<Complex>& data,
                   const std::string& units);
/// Integers; `meaning` says what they stand for (an index, a flag, a sense).
void write_ints(hid_t file, const std::string& path, const std::vector<Axis>& axes, const std::vector<int>& data,
                const std::string& meaning);
void write_texts(hid_t file, const std::string& path, const std::vector<Axis>& axes, const std::vector<std::string>& data);
/// `count` values of `memory_type` stored as `file_type` (arrays copied from another file).
void write_raw(hid_t file, const std::string& path, const std::vector<Axis>& axes, hid_t file_type, hid_t memory_type,
               const void* data, std::size_t count);
/// One scalar text (a model's source, a summary).
void write_text(hid_t file, const std::string& path, const std::string& value);

void text_attribute(hid_t object, const std::string& name, const std::string& value);
void integer_attribute(hid_t object, const std::string& name, long value);

/// Attaches the scales of `axes` to the dataset at `path`, dimension by dimension.
void attach_axes(hid_t file, const std::string& path, const std::vector<Axis>& axes);

/// The root attributes every lobe file carries: format ("lobe-antenna-result", …) and
/// format_version ("1.0").
void mark_format(hid_t file, const std::string& format);

}  // namespace lobe::hdf5
