#pragma once
/// Reading helpers for lobe's own HDF5 files (internal to post/).
#include <filesystem>
#include <string>
#include <vector>

#include "core/input_error.hpp"
#include "core/types.hpp"
#include "post/hdf5_handle.hpp"

namespace lobe {

/// Opens an HDF5 file of lobe's layout for reading (require_readable_format), or throws
/// InputError at FILE:1:1. HDF5's own error printing is switched off: failures are
/// reported by the caller.
hid_t open_hdf5_for_reading(const std::filesystem::path& path);

/// Throws InputError unless the file's root says it is in a format_version this lobe reads:
/// the same major (a newer minor only adds datasets).
void require_readable_format(hid_t file, const SourceLocation& where);

/// A dataset of complex numbers (lobe's compound {r, i}), flattened, with its dimensions;
/// empty when it does not exist.
std::vector<Complex> read_complex(hid_t file, const std::string& name, std::vector<hsize_t>& dims);

/// A dataset of doubles, flattened, with its dimensions; empty when it does not exist.
std::vector<Real> read_reals(hid_t file, const std::string& name, std::vector<hsize_t>& dims);

/// A dataset of variable-length strings, flattened, with its dimensions.
std::vector<std::string> read_strings(hid_t file, const std::string& name, std::vector<hsize_t>& dims);

/// Whether the object `name` exists (its parent groups included), as in "/ports/port".
bool hdf5_exists(hid_t file, const std::string& name);

/// A scalar text dataset, as lobe writes a model's source.
std::string read_text(hid_t file, const std::string& name);

}  // namespace lobe
