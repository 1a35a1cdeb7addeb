// Writers and summary of scattering runs.
#include <cstdio>
#include <memory>
#include <stdexcept>

#include "core/constants.hpp"
#include "core/output_error.hpp"
#include "post/hdf5_writer.hpp"
#include "post/run_summary.hpp"
#include "post/scattering_result.hpp"

namespace lobe {

void write_scattering_csv(const std::filesystem::path& path, const ScatteringRun& run) {
  std::unique_ptr<std::FILE, int (*)(std::FILE*)> file(std::fopen(path.c_str(), "w"), &std::fclose);
  if (!file) throw std::runtime_error("cannot write " + path.string());
  std::fprintf(file.get(), "frequency_hz,theta_deg,phi_deg,rcs_m2,rcs_dbsm\n");
  for (const auto& r : run.results)
    for (std::size_t i = 0; i < r.thetas.size(); ++i)
      for (std::size_t j = 0; j < r.phis.size(); ++j) {
        const Real sigma = r.rcs_m2(static_cast<Eigen::Index>(i), static_cast<Eigen::Index>(j));
        std::fprintf(file.get(), "%.10g,%.6g,%.6g,%.9g,%.6f\n", r.frequency_hz, r.thetas[i] * 180 / pi,
                     r.phis[j] * 180 / pi, sigma, to_dbsm(sigma));
      }
  const bool failed = std::fflush(file.get()) != 0 || std::ferror(file.get()) != 0;
  if (std::fclose(file.release()) != 0 || failed) throw output_error(path.string());
}

std::string scattering_summary(const ScatteringRun& run) {
  const PlaneWave& wave = *run.problem.model.wave;
  char line[256];
  std::string out;
  std::snprintf(line, sizeof line, "wave from theta %.1f deg, phi %.1f deg, %s-polarized, %.3g V/m\n\n",
                wave.theta * 180 / pi, wave.phi * 180 / pi, wave.theta_polarized ? "theta" : "phi", wave.amplitude);
  out += line;
  std::snprintf(line, sizeof line, "%-14s %16s %16s %16s\n", "frequency", "monostatic (m2)", "(dBsm)", "largest at th/ph");
  out += line;
  for (const auto& r : run.results) {
    Eigen::Index i = 0, j = 0;
    r.rcs_m2.maxCoeff(&i, &j);
    char where[64];
    std::snprintf(where, sizeof where, "%.0f/%.0f deg", r.thetas[i] * 180 / pi, r.phis[j] * 180 / pi);
    std::snprintf(line, sizeof line, "%-14s %16.5g %16.2f %16s\n", frequency_text(r.frequency_hz).c_str(),
                  r.monostatic_m2, to_dbsm(r.monostatic_m2), where);
    out += line;
  }
  const auto& loads = run.problem.model.loads;
  if (loads.empty()) return out;
  // Power density of the incident wave, ½|E|²/η0: the effective area is P / S.
  const Real density = 0.5 * wave.amplitude * wave.amplitude / eta0;
  out += "\npower received by the loads (effective area = power / incident power density):\n";
  std::snprintf(line, sizeof line, "%-14s %-16s %16s %18s\n", "frequency", "load", "power (W)", "effective area (m2)");
  out += line;
  for (const auto& r : run.results)
    for (std::size_t l = 0; l < loads.size(); ++l) {
      std::snprintf(line, sizeof line, "%-14s %-16s %16.5g %18.5g\n", frequency_text(r.frequency_hz).c_str(),
                    loads[l].name.c_str(), r.load_power_w[l], r.load_power_w[l] / density);
      out += line;
    }
  return out;
}

}  // namespace lobe
