#pragma once
/// How a caller follows and stops long studies: a cancel token it may set from a signal
/// handler, and callbacks for progress and warnings. The study never prints.
#include <atomic>
#include <cstddef>
#include <functional>
#include <string>
#include <vector>

#include "geometry/mesh_warning.hpp"

namespace lobe {

/// Set (from any thread or a signal handler) to stop a study at its next frequency.
class CancelToken {
 public:
  void request() { m_requested.store(true); }
  bool requested() const { return m_requested.load(); }

 private:
  std::atomic<bool> m_requested{false};
};

/// How a range of frequencies is covered.
enum class FrequencySampling {
  every,    ///< every frequency solved in full
  adaptive  ///< long ranges: some frequencies solved, the rest interpolated (study/frequency_loop)
};

struct StudyControl {
  const CancelToken* cancel = nullptr;
  /// Called after each step (a frequency, a case, an evaluation): `done` of `total`, of
  /// which `timed` were worked in this process, and a short detail ("433 MHz").
  std::function<void(std::size_t done, std::size_t total, std::size_t timed, const std::string& detail)> progress;
  /// Called once per distinct mesh warning, with the case it first arose in ("" for a run).
  std::function<void(const MeshWarning& warning, const std::string& where)> warning;
  /// Called with something a person should know that is neither progress nor a warning
  /// ("case-000003.h5 is damaged; solving it again").
  std::function<void(const std::string& text)> notice;
  /// Called with the unknowns and the solves ahead, before the first solve, for a time estimate.
  std::function<void(double unknowns, double solves)> workload;
  /// Under MPI, every process takes part in each set of frequencies solved, each solving its
  /// share and all receiving every solution (a sweep of fewer cases than processes). Every
  /// process must then make the same calls in the same order.
  bool share_frequencies = false;

  bool cancelled() const { return cancel && cancel->requested(); }
};

}  // namespace lobe
