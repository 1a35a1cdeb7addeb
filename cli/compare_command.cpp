#include <algorithm>
#include <cmath>
#include <cstdio>
#include <filesystem>

#include "cli/commands.hpp"
#include "core/formatted_text.hpp"
#include "geometry/model_parser.hpp"
#include "post/curve_comparison.hpp"
#include "post/measured_csv.hpp"
#include "post/port_quantities.hpp"
#include "post/result_reader.hpp"
#include "post/run_summary.hpp"
#include "post/touchstone.hpp"

namespace lobe::cli {

MeasuredCurve read_measured(const std::string& path, Real reference_ohm, const std::string& format) {
  const std::string extension = std::filesystem::path(path).extension().string();
  const bool touchstone_name = extension == ".ts" || (extension.size() >= 4 && (extension[1] == 's' || extension[1] == 'S') &&
                                                      (extension.back() == 'p' || extension.back() == 'P'));
  if (format == "csv" || (format == "auto" && !touchstone_name)) return read_measured_csv(path, reference_ohm);
  const NetworkData network = read_touchstone(path, 1);
  MeasuredCurve measured{{network.frequency_hz, {}}, true, "complex S11 (Touchstone)"};
  for (const auto& s : network.s) {
    // Referred to the result's reference impedance, so that both curves mean the same.
    const Complex z = network.reference_ohm * (1.0 + s(0, 0)) / (1.0 - s(0, 0));
    measured.curve.reflection.push_back(reflection_coefficient(z, reference_ohm));
  }
  return measured;
}

namespace {

std::string band_line(const char* label, const PortBandReport& r) {
  return formatted("  %-10s VSWR best %.3g at %s, mean %.3g, worst %.3g at %s; %s\n", label, r.lowest_vswr.value,
                   frequency_text(r.lowest_vswr.frequency_hz).c_str(), r.mean_vswr, r.highest_vswr.value,
                   frequency_text(r.highest_vswr.frequency_hz).c_str(), share_within_text(r).c_str());
}

}  // namespace

int compare_command(const CompareOptions& options) {
  const std::string group = result_group(options.result_path, options.case_name);
  const NetworkData network = read_result_network(options.result_path, group);
  const std::vector<std::string> names = read_result_port_names(options.result_path, group);
  int port = 0;
  if (!options.port.empty()) {
    const auto found = std::find(names.begin(), names.end(), options.port);
    if (found == names.end()) throw InputError({"--port", 1, 1}, "the result has no port named '" + options.port + "'");
    port = static_cast<int>(found - names.begin());
  }
  ReflectionCurve simulated{network.frequency_hz, {}};
  for (const auto& s : network.s) simulated.reflection.push_back(s(port, port));
  const MeasuredCurve measured = read_measured(options.measured_path, network.reference_ohm, options.measured_format);
  const Real low = std::max(simulated.frequency_hz.front(), measured.curve.frequency_hz.front());
  const Real high = std::min(simulated.frequency_hz.back(), measured.curve.frequency_hz.back());
  if (!(low < high))
    throw InputError({options.measured_path, 1, 1}, "the measured frequencies do not overlap the simulated ones (" +
                                                        frequency_text(simulated.frequency_hz.front()) + " to " +
                                                        frequency_text(simulated.frequency_hz.back()) + ")");
  std::vector<Band> bands;
  for (std::size_t i = 0; i < options.band_options.size(); ++i)
    bands.push_back(parse_band_option(options.band_options[i], static_cast<int>(i) + 1));
  if (bands.empty()) bands.push_back({"overlap", low, high});

  std::printf("simulated: %s, port %s (%zu frequencies)\n", options.result_path.c_str(), names[port].c_str(),
              simulated.frequency_hz.size());
  std::printf("measured:  %s, %s%s (%zu frequencies)\n", options.measured_path.c_str(), measured.quantity.c_str(),
              measured.phase_known ? "" : ", magnitude only", measured.curve.frequency_hz.size());
  std::printf("overlap:   %s to %s, reference %.6g ohm\n\n", frequency_text(low).c_str(), frequency_text(high).c_str(),
              network.reference_ohm);

  const auto simulated_dips = resonances(simulated), measured_dips = resonances(measured.curve);
  const DipPairing pairing = pair_dips(simulated_dips, measured_dips);
  std::printf("dips of |S11| (return loss at least 3 dB, standing 3 dB above their surroundings):\n");
  for (std::size_t s = 0; s < simulated_dips.size(); ++s) {
    const Resonance& d = simulated_dips[s];
    std::printf("  simulated  %-14s return loss %.1f dB", frequency_text(d.frequency_hz).c_str(), d.return_loss_db);
    if (!pairing.simulated_unpaired[s].empty()) std::printf("  unpaired: %s", pairing.simulated_unpaired[s].c_str());
    std::printf("\n");
  }
  for (std::size_t m = 0; m < measured_dips.size(); ++m) {
    const Resonance& d = measured_dips[m];
    std::printf("  measured   %-14s return loss %.1f dB", frequency_text(d.frequency_hz).c_str(), d.return_loss_db);
    const auto pair = std::find_if(pairing.pairs.begin(), pairing.pairs.end(),
                                   [&](const DipPairing::Pair& p) { return p.measured == m; });
    if (pair != pairing.pairs.end()) {
      const Resonance& partner = simulated_dips[pair->simulated];
      std::printf("  paired with the simulated dip at %s: %+.3g MHz (%+.2f %%)", frequency_text(partner.frequency_hz).c_str(),
                  (d.frequency_hz - partner.frequency_hz) / 1e6, 100 * (d.frequency_hz / partner.frequency_hz - 1));
    } else {
      std::printf("  unpaired: %s", pairing.measured_unpaired[m].c_str());
    }
    std::printf("\n");
  }
  if (simulated_dips.empty() && measured_dips.empty()) std::printf("  none in either curve\n");

  const ScaleEstimate estimate =
      frequency_scale_estimate(simulated, measured.curve, low, high, simulated_dips, measured_dips, pairing);
  if (estimate.scale) {
    const Real scale = *estimate.scale;
    std::printf("\nbest frequency-scale factor: %.4f (the measured curve looks like the simulated one with every "
                "frequency times %.4f)\n",
                scale, scale);
    std::printf("  that is what lengths %.2f %% %s than the model's would do: a simple antenna's resonances scale "
                "inversely with its size\n",
                std::abs(100 * (1 / scale - 1)), scale < 1 ? "longer" : "shorter");
  } else {
    std::printf("\nno reliable shift: %s\n", estimate.reason.c_str());
  }
  for (const Band& band : bands) {
    const Real b_low = std::max(band.low_hz, low), b_high = std::min(band.high_hz, high);
    std::printf("\nband %s (%s to %s):\n", band.name.c_str(), frequency_text(band.low_hz).c_str(),
                frequency_text(band.high_hz).c_str());
    if (!(b_low < b_high)) {
      std::printf("  outside the overlap of the two curves\n");
      continue;
    }
    std::printf("  RMS return-loss difference %.2f dB", rms_return_loss_difference_db(simulated, measured.curve, b_low, b_high));
    if (estimate.scale)
      std::printf("; %.2f dB after scaling the frequencies by %.4f",
                  rms_return_loss_difference_db(simulated, measured.curve, b_low, b_high, *estimate.scale), *estimate.scale);
    std::printf("\n");
    if (measured.phase_known) {
      if (const auto d = complex_difference(simulated, measured.curve, b_low, b_high, network.reference_ohm)) {
        std::printf("  on the Smith chart |measured - simulated Gamma|: RMS %.3f, largest %.3f at %s\n", d->rms_reflection,
                    d->largest_reflection, frequency_text(d->largest_reflection_hz).c_str());
        auto tidy = [](Real ohm) { return std::abs(ohm) < 0.05 ? 0.0 : ohm; };  // no "-0.0" from rounding noise
        std::printf("  impedance, measured - simulated: mean %+.1f %+.1fj ohm, largest |dZ| %.1f ohm at %s\n",
                    tidy(d->mean_impedance.real()), tidy(d->mean_impedance.imag()), d->largest_impedance,
                    frequency_text(d->largest_impedance_hz).c_str());
      }
    } else {
      std::printf("  (the measurement has no phase: only magnitudes are compared)\n");
    }
    const PortBandReport sim = band_report(simulated, b_low, b_high), meas = band_report(measured.curve, b_low, b_high);
    std::printf("%s", band_line("simulated", sim).c_str());
    std::printf("%s", band_line("measured", meas).c_str());
    if (options.tx_power_w) {
      // The worst VSWR in the band gives the most power sent back: P |Γ|², |Γ| = (s − 1)/(s + 1).
      auto reflected = [&](const PortBandReport& r) {
        const Real g = (r.highest_vswr.value - 1) / (r.highest_vswr.value + 1);
        return reflected_power_w(*options.tx_power_w, g);
      };
      const Real limit = reflected_power_w(*options.tx_power_w, (vswr_caution_threshold - 1) / (vswr_caution_threshold + 1));
      std::printf("  reflected power with %.4g W forward, at worst: simulated %.4g W, measured %.4g W%s\n",
                  *options.tx_power_w, reflected(sim), reflected(meas),
                  std::max(reflected(sim), reflected(meas)) > limit ? " (more than VSWR 2 reflects: check the transmitter's rating)" : "");
    }
  }
  return 0;
}

}  // namespace lobe::cli
