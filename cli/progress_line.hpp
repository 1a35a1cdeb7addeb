#pragma once
/// Progress of long work on standard error: on a terminal one line rewritten in place, else
/// plain lines now and then, so that logs of overnight sweeps stay short.
#include <chrono>
#include <string>

namespace lobe::cli {

class ProgressLine {
 public:
  /// `unit` names one step ("case", "frequency"); `total` is the number of steps.
  ProgressLine(std::string unit, std::size_t total);
  ~ProgressLine();
  ProgressLine(const ProgressLine&) = delete;
  ProgressLine& operator=(const ProgressLine&) = delete;

  /// Reports `done` of the total finished, of which `timed` were worked in this process
  /// (the others were found finished, e.g. by a resumed sweep); the rate and time left come
  /// from the timed ones. `detail` is appended, e.g. "433 MHz". A terminal sees at most
  /// five updates a second, anything else one line per ten seconds; the last step always shows.
  void update(std::size_t done, std::size_t timed, const std::string& detail = "");

 private:
  std::string m_unit;
  std::size_t m_total;
  bool m_terminal;
  bool m_shown = false;
  std::chrono::steady_clock::time_point m_start, m_last;
};

/// "12 s", "3 min 20 s", "2 h 05 min": a duration as people read it.
std::string duration_text(double seconds);

}  // namespace lobe::cli
