#pragma once
/// Scope-bound HDF5 identifiers, shared by the result writer and reader (internal to post/).
#include <hdf5.h>

#include <stdexcept>

namespace lobe {

/// Closes an HDF5 handle when it goes out of scope.
class Hdf5Handle {
 public:
  Hdf5Handle(hid_t id, herr_t (*close)(hid_t)) : m_id(id), m_close(close) {
    if (id < 0) throw std::runtime_error("HDF5 call failed");
  }
  ~Hdf5Handle() {
    if (m_id >= 0) m_close(m_id);
  }
  Hdf5Handle(Hdf5Handle&& other) noexcept : m_id(other.m_id), m_close(other.m_close) { other.m_id = -1; }
  Hdf5Handle(const Hdf5Handle&) = delete;
  Hdf5Handle& operator=(const Hdf5Handle&) = delete;
  operator hid_t() const { return m_id; }

 private:
  hid_t m_id;
  herr_t (*m_close)(hid_t);
};

}  // namespace lobe
