#include "post/run_summary.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>

#include "core/constants.hpp"

namespace lobe {
namespace {

std::string printf_string(const char* format, auto... args) {
  char buffer[512];
  std::snprintf(buffer, sizeof buffer, format, args...);
  return buffer;
}

}  // namespace

std::string frequency_text(Real hz) {
  if (hz >= 1e9) return printf_string("%.4f GHz", hz / 1e9);
  if (hz >= 1e6) return printf_string("%.3f MHz", hz / 1e6);
  return printf_string("%.3f kHz", hz / 1e3);
}

std::string count_text(std::size_t count, const std::string& noun, const std::string& plural) {
  return std::to_string(count) + " " + (count == 1 ? noun : plural.empty() ? noun + "s" : plural);
}

std::string run_summary(const RunRecord& run) {
  const Model& model = run.problem.model;
  std::string out;
  out += printf_string("%-14s %-10s %10s %10s %9s %8s\n", "frequency", "port", "R (ohm)", "X (ohm)", "VSWR", "RL (dB)");
  for (const auto& r : run.results)
    for (std::size_t p = 0; p < r.ports.size(); ++p) {
      const PortResult& port = r.ports[p];
      out += printf_string("%-14s %-10s %10.2f %+10.2f %9.3g %8.2f%s\n", frequency_text(r.frequency_hz).c_str(),
                           model.ports[p].name.c_str(), port.impedance.real(), port.impedance.imag(), port.vswr,
                           port.return_loss_db, port.driven ? "" : "  (0 V: self impedance)");
    }
  out += "\n";
  out += printf_string("%-14s %11s %15s %12s %7s %10s\n", "frequency", "peak (dBi)", "at theta/phi", "AR (dB)", "hand",
                       "efficiency");
  for (const auto& r : run.results) {
    const std::string direction = printf_string("%.0f/%.0f deg", r.peak_theta * 180 / pi, r.peak_phi * 180 / pi);
    out += printf_string("%-14s %11.2f %15s %12.2f %7s %9.1f%%\n", frequency_text(r.frequency_hz).c_str(),
                         r.peak_gain_dbi, direction.c_str(), r.peak_axial_ratio_db, hand_name(r.peak_hand),
                         100.0 * r.power.efficiency());
  }

  for (const auto& band : model.bands) {
    out += "\nband " + band.name + " (" + frequency_text(band.low_hz) + " to " + frequency_text(band.high_hz) + "):";
    std::vector<const FrequencyResult*> inside;
    for (const auto& r : run.results)
      if (r.frequency_hz >= band.low_hz && r.frequency_hz <= band.high_hz) inside.push_back(&r);
    if (inside.empty()) {
      out += " no computed frequency lies inside; add frequencies that cover it\n";
      continue;
    }
    out += ' ';
    out += count_text(inside.size(), "computed frequency", "computed frequencies");
    out += '\n';
    for (std::size_t p = 0; p < model.ports.size(); ++p) {
      Real low = vswr_ceiling, high = 0.0, sum = 0.0;
      for (const auto* r : inside) {
        low = std::min(low, r->ports[p].vswr);
        high = std::max(high, r->ports[p].vswr);
        sum += r->ports[p].vswr;
      }
      out += printf_string("  port %-10s VSWR lowest %.3g, mean %.3g, worst %.3g\n", model.ports[p].name.c_str(), low,
                           sum / inside.size(), high);
    }
  }

  Real smallest_rcond = 1.0, largest_residual = 0.0;
  for (const auto& r : run.results) {
    smallest_rcond = std::min(smallest_rcond, r.report.reciprocal_condition);
    largest_residual = std::max(largest_residual, r.report.relative_residual);
  }
  const std::string condition = smallest_rcond > 0 ? printf_string("%.2g", 1.0 / smallest_rcond) : "infinite";
  out += printf_string("\nmatrix: condition number up to %s, relative residual up to %.1e%s\n", condition.c_str(),
                       largest_residual,
                       smallest_rcond < ill_conditioned_rcond ? " (ill-conditioned: check the geometry)" : "");

  Real worst = 1.0, worst_hz = 0.0;
  for (const auto& r : run.results)
    for (const auto& p : r.ports)
      if (p.driven && p.vswr > worst) {
        worst = p.vswr;
        worst_hz = r.frequency_hz;
      }
  out += "\nCautions:\n";
  if (worst > vswr_caution_threshold) {
    const Real gamma = (worst - 1.0) / (worst + 1.0);
    out += printf_string("  - VSWR reaches %.3g at %s: %.0f%% of the transmitter's power is reflected back toward it.\n"
                         "    A high VSWR can damage a transmitter's amplifier; check its rating before transmitting.\n",
                         worst, frequency_text(worst_hz).c_str(), 100.0 * gamma * gamma);
  }
  out += "  - Fields near a transmitting antenna can exceed RF exposure limits; keep people at a safe distance.\n"
         "  - Which bands and powers you may transmit with depends on your licence and country.\n"
         "    Local regulations and licensed practice take precedence over anything this tool prints.\n";
  return out;
}

}  // namespace lobe
