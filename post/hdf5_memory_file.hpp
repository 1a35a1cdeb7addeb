#pragma once
/// An HDF5 file built in memory and written to disk in one piece (internal to post/).
#include <filesystem>

#include "post/hdf5_handle.hpp"

namespace lobe {

/// The HDF5 core driver without a backing store: the library never touches the disk, and
/// save() writes the finished image with plain system calls. A full disk or a failing
/// device is then one OutputError naming the path, never HDF5 failing to flush a
/// half-written file (which printed pages of diagnostics and crashed at exit).
class Hdf5MemoryFile {
 public:
  Hdf5MemoryFile();
  ~Hdf5MemoryFile();
  Hdf5MemoryFile(const Hdf5MemoryFile&) = delete;
  Hdf5MemoryFile& operator=(const Hdf5MemoryFile&) = delete;
  operator hid_t() const { return m_file; }
  /// Writes the whole file to `path`; throws OutputError.
  void save(const std::filesystem::path& path);

 private:
  hid_t m_file = -1;
};

}  // namespace lobe
