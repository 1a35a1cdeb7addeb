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
  // What a builder looks for first: which wire, how far along it, how much current and its
  // phase; then the complex parts and where the segment is.
  std::fprintf(file.get(), "frequency_hz,wire,segment,distance_m,magnitude_a,phase_deg,real_a,imaginary_a,x_m,y_m,z_m\n");
  const auto& mesh = run.problem.mesh;
  const std::vector<Real> distances = distances_along_wires(mesh);
  for (const auto& r : run.results) {
    int on_wire = 0;
    for (std::size_t s = 0; s < mesh.segments.size(); ++s) {
      const Segment& seg = mesh.segments[s];
      on_wire = s > 0 && mesh.segments[s - 1].wire == seg.wire ? on_wire + 1 : 1;
      const Vec3 m = seg.midpoint();
      const Complex c = 0.5 * (r.segment_currents[s][0] + r.segment_currents[s][1]);
      std::fprintf(file.get(), "%.10g,%s,%d,%.9g,%.9g,%.4f,%.9g,%.9g,%.9g,%.9g,%.9g\n", r.frequency_hz,
                   run.problem.model.wires[seg.wire].name.c_str(), on_wire, distances[s], std::abs(c),
                   std::arg(c) * degrees, c.real(), c.imag(), m.x(), m.y(), m.z());
    }
  }
  finish(file, path);
}

}  // namespace lobe
