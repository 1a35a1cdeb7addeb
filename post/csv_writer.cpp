#include "post/csv_writer.hpp"

#include <cmath>
#include <cstdio>
#include <memory>
#include <stdexcept>

#include "core/constants.hpp"
#include "core/output_error.hpp"

namespace lobe {
namespace {

using File = std::unique_ptr<std::FILE, int (*)(std::FILE*)>;

File open_for_writing(const std::filesystem::path& path) {
  errno = 0;
  File file(std::fopen(path.c_str(), "w"), &std::fclose);
  if (!file) throw output_error(path.string());
  return file;
}

void finish(File& file, const std::filesystem::path& path) {
  const bool failed = std::fflush(file.get()) != 0 || std::ferror(file.get()) != 0;
  if (std::fclose(file.release()) != 0 || failed) throw output_error(path.string());
}

constexpr Real degrees = 180.0 / pi;

}  // namespace

void write_ports_csv(const std::filesystem::path& path, const RunRecord& run) {
  File file = open_for_writing(path);
  std::fprintf(file.get(),
               "frequency_hz,port,resistance_ohm,reactance_ohm,vswr,return_loss_db,mismatch_loss_db,"
               "reflection_magnitude,reflection_phase_deg,driven\n");
  for (const auto& r : run.results)
    for (std::size_t p = 0; p < r.ports.size(); ++p) {
      const PortResult& port = r.ports[p];
      std::fprintf(file.get(), "%.10g,%s,%.10g,%.10g,%.10g,%.10g,%.10g,%.10g,%.10g,%d\n", r.frequency_hz,
                   run.problem.model.ports[p].name.c_str(), port.impedance.real(), port.impedance.imag(), port.vswr,
                   port.return_loss_db, port.mismatch_loss_db, std::abs(port.reflection),
                   std::arg(port.reflection) * degrees, port.driven ? 1 : 0);
    }
  finish(file, path);
}

void write_antenna_ends_csv(const std::filesystem::path& path, const RunRecord& run) {
  File file = open_for_writing(path);
  std::fprintf(file.get(),
               "frequency_hz,place,resistance_ohm,reactance_ohm,vswr,return_loss_db,reflection_magnitude,"
               "reflection_phase_deg\n");
  const FeedNetwork& network = run.problem.network;
  const std::vector<int> ends = network.antenna_ends();
  for (const auto& r : run.results)
    for (std::size_t k = 0; k < r.antenna_ends.size(); ++k) {
      const PortResult& end = r.antenna_ends[k];
      std::fprintf(file.get(), "%.10g,%s,%.10g,%.10g,%.10g,%.10g,%.10g,%.10g\n", r.frequency_hz,
                   network.terminals()[ends[k]].label.c_str(), end.impedance.real(), end.impedance.imag(), end.vswr,
                   end.return_loss_db, std::abs(end.reflection), std::arg(end.reflection) * degrees);
    }
  finish(file, path);
}

void write_pattern_csv(const std::filesystem::path& path, const RunRecord& run) {
  File file = open_for_writing(path);
  std::fprintf(file.get(),
               "frequency_hz,theta_deg,phi_deg,gain_dbi,rhcp_dbi,lhcp_dbi,axial_ratio_db,directivity_dbi,"
               "realized_gain_dbi,hand\n");
  for (const auto& r : run.results) {
    const PatternResult& p = r.pattern;
    for (std::size_t i = 0; i < p.thetas.size(); ++i)
      for (std::size_t j = 0; j < p.phis.size(); ++j) {
        const auto ii = static_cast<Eigen::Index>(i), jj = static_cast<Eigen::Index>(j);
        std::fprintf(file.get(), "%.10g,%.6g,%.6g,%.6f,%.6f,%.6f,%.6f,%.6f,%.6f,%s\n", r.frequency_hz,
                     p.thetas[i] * degrees, p.phis[j] * degrees, p.gain_dbi(ii, jj), p.rhcp_dbi(ii, jj),
                     p.lhcp_dbi(ii, jj), p.axial_ratio_db(ii, jj), p.directivity_dbi(ii, jj),
                     p.realized_gain_dbi(ii, jj), hand_name(static_cast<Hand>(p.hand(ii, jj))));
      }
  }
  finish(file, path);
}

void write_currents_csv(const std::filesystem::path& path, const RunRecord& run) {
  File file = open_for_writing(path);
  std::fprintf(file.get(), "frequency_hz,segment,wire,x_m,y_m,z_m,current_re_a,current_im_a,current_magnitude_a\n");
  const auto& mesh = run.problem.mesh;
  for (const auto& r : run.results)
    for (std::size_t s = 0; s < mesh.segments.size(); ++s) {
      const Segment& seg = mesh.segments[s];
      const Vec3 m = seg.midpoint();
      const Complex c = 0.5 * (r.segment_currents[s][0] + r.segment_currents[s][1]);
      std::fprintf(file.get(), "%.10g,%zu,%s,%.9g,%.9g,%.9g,%.9g,%.9g,%.9g\n", r.frequency_hz, s,
                   run.problem.model.wires[seg.wire].name.c_str(), m.x(), m.y(), m.z(), c.real(), c.imag(),
                   std::abs(c));
    }
  finish(file, path);
}

}  // namespace lobe
