#include "cli/progress_line.hpp"

#include <unistd.h>

#include <cmath>
#include <cstdio>

#include "core/formatted_text.hpp"

namespace lobe::cli {
namespace {

using clock = std::chrono::steady_clock;

double seconds_between(clock::time_point a, clock::time_point b) { return std::chrono::duration<double>(b - a).count(); }

/// "3.2 per second", "14 per minute", "2.5 per hour".
std::string rate_text(double per_second) {
  if (per_second >= 1) return formatted("%.3g per second", per_second);
  if (per_second * 60 >= 1) return formatted("%.3g per minute", per_second * 60);
  return formatted("%.3g per hour", per_second * 3600);
}

}  // namespace

std::string duration_text(double seconds) {
  const long s = std::lround(seconds);
  if (s < 60) return formatted("%ld s", s);
  if (s < 3600) return formatted("%ld min %02ld s", s / 60, s % 60);
  return formatted("%ld h %02ld min", s / 3600, (s % 3600) / 60);
}

ProgressLine::ProgressLine(std::string unit, std::size_t total)
    : m_unit(std::move(unit)), m_total(total), m_terminal(isatty(fileno(stderr))), m_start(clock::now()), m_last(m_start) {}

// On a terminal the line is redrawn in place ("\r", then ESC [ K to erase what a longer line
// left) and erased when done, so nothing of it stays among the command's own output.
ProgressLine::~ProgressLine() {
  if (m_terminal && m_shown) {
    std::fprintf(stderr, "\r\033[K");
    std::fflush(stderr);
  }
}

void ProgressLine::update(std::size_t done, std::size_t timed, const std::string& detail) {
  const auto now = clock::now();
  const bool last = done == m_total;
  if (!last && seconds_between(m_last, now) < (m_terminal ? 0.2 : 10.0)) return;
  m_last = now;
  m_shown = true;
  const double elapsed = seconds_between(m_start, now);
  std::string line = formatted("%s %zu/%zu", m_unit.c_str(), done, m_total);
  if (!detail.empty()) line += " (" + detail + ")";
  line += ", " + duration_text(elapsed) + " elapsed";
  if (timed > 0 && elapsed > 0) {
    line += ", " + rate_text(timed / elapsed);
    if (!last) line += ", about " + duration_text(elapsed / timed * static_cast<double>(m_total - done)) + " left";
  }
  if (done > timed) line += formatted(", %zu found done", done - timed);
  std::fflush(stdout);  // what the command printed comes before the progress, not after it
  std::fprintf(stderr, m_terminal ? "\r\033[K%s" : "%s\n", line.c_str());
  std::fflush(stderr);
}

}  // namespace lobe::cli
