#include "post/hdf5_memory_file.hpp"

#include <fcntl.h>
#include <unistd.h>

#include <atomic>
#include <string>
#include <vector>

#include "core/output_error.hpp"

namespace lobe {

Hdf5MemoryFile::Hdf5MemoryFile() {
  // Failures are reported by the callers' checks; HDF5's own printing would bury them.
  H5Eset_auto2(H5E_DEFAULT, nullptr, nullptr);
  static std::atomic<int> count{0};
  Hdf5Handle access(H5Pcreate(H5P_FILE_ACCESS), H5Pclose);
  if (H5Pset_fapl_core(access, 1 << 20, 0) < 0) throw std::runtime_error("HDF5: cannot set up a file in memory");
  const std::string name = "lobe-memory-" + std::to_string(::getpid()) + "-" + std::to_string(count++);
  m_file = H5Fcreate(name.c_str(), H5F_ACC_TRUNC, H5P_DEFAULT, access);
  if (m_file < 0) throw std::runtime_error("HDF5: cannot create a file in memory");
}

Hdf5MemoryFile::~Hdf5MemoryFile() { H5Fclose(m_file); }

void Hdf5MemoryFile::save(const std::filesystem::path& path) {
  if (H5Fflush(m_file, H5F_SCOPE_GLOBAL) < 0) throw std::runtime_error("HDF5: cannot finish the file in memory");
  const ssize_t size = H5Fget_file_image(m_file, nullptr, 0);
  if (size < 0) throw std::runtime_error("HDF5: cannot take the file's image");
  std::vector<char> image(static_cast<std::size_t>(size));
  if (H5Fget_file_image(m_file, image.data(), image.size()) != size) throw std::runtime_error("HDF5: cannot take the file's image");
  errno = 0;
  const int fd = ::open(path.c_str(), O_WRONLY | O_CREAT | O_TRUNC | O_CLOEXEC, 0644);
  if (fd < 0) throw output_error(path.string());
  std::size_t done = 0;
  while (done < image.size()) {
    const ssize_t n = ::write(fd, image.data() + done, image.size() - done);
    if (n < 0 && errno == EINTR) continue;
    if (n <= 0) {
      const OutputError error = output_error(path.string());
      ::close(fd);
      throw error;
    }
    done += static_cast<std::size_t>(n);
  }
  if (::close(fd) != 0) throw output_error(path.string());
}

}  // namespace lobe
