#include <algorithm>
#include <cmath>
#include <cstdio>
#include <filesystem>

#include <nlohmann/json.hpp>

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

using Json = nlohmann::ordered_json;

Json band_report_json(const PortBandReport& r) {
  return {{"best_vswr", r.lowest_vswr.value},     {"best_vswr_at_hz", r.lowest_vswr.frequency_hz},
          {"mean_vswr", r.mean_vswr},             {"worst_vswr", r.highest_vswr.value},
          {"worst_vswr_at_hz", r.highest_vswr.frequency_hz}, {"share_under_vswr_2", band_figure(r, "share-under-vswr-2")}};
}

Json dips_json(const std::vector<Resonance>& simulated, const std::vector<Resonance>& measured, const DipPairing& pairing) {
  auto dip = [](const Resonance& d, const std::string& unpaired) {
    return Json{{"frequency_hz", d.frequency_hz}, {"return_loss_db", d.return_loss_db},
                {"unpaired", unpaired.empty() ? Json(nullptr) : Json(unpaired)}};
  };
  Json out{{"simulated", Json::array()}, {"measured", Json::array()}, {"pairs", Json::array()}};
  for (std::size_t s = 0; s < simulated.size(); ++s) out["simulated"].push_back(dip(simulated[s], pairing.simulated_unpaired[s]));
  for (std::size_t m = 0; m < measured.size(); ++m) out["measured"].push_back(dip(measured[m], pairing.measured_unpaired[m]));
  for (const auto& p : pairing.pairs)
    out["pairs"].push_back({{"simulated_hz", simulated[p.simulated].frequency_hz}, {"measured_hz", measured[p.measured].frequency_hz}});
  return out;
}

std::string band_line(const char* label, const PortBandReport& r) {
  return formatted("  %-10s VSWR best %.2f at %s, mean %.2f, worst %.2f at %s; %s\n", label, r.lowest_vswr.value,
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

  std::FILE* const text = options.json ? stderr : stdout;
  Json doc{{"schema", "lobe-compare-summary"},
           {"schema_version", 1},
           {"lobe_version", LOBE_VERSION},
           {"simulated", {{"file", options.result_path}, {"case", options.case_name.empty() ? Json(nullptr) : Json(options.case_name)},
                          {"port", names[port]}, {"frequencies", simulated.frequency_hz.size()}}},
           {"measured", {{"file", options.measured_path}, {"quantity", measured.quantity}, {"phase_known", measured.phase_known},
                         {"frequencies", measured.curve.frequency_hz.size()}}},
           {"overlap_hz", {low, high}},
           {"reference_ohm", network.reference_ohm}};
  std::fprintf(text, "simulated: %s, port %s (%zu frequencies)\n", options.result_path.c_str(), names[port].c_str(),
              simulated.frequency_hz.size());
  std::fprintf(text, "measured:  %s, %s%s (%zu frequencies)\n", options.measured_path.c_str(), measured.quantity.c_str(),
              measured.phase_known ? "" : ", magnitude only", measured.curve.frequency_hz.size());
  std::fprintf(text, "overlap:   %s to %s, reference %.6g ohm\n\n", frequency_text(low).c_str(), frequency_text(high).c_str(),
              network.reference_ohm);

  const auto simulated_dips = resonances(simulated), measured_dips = resonances(measured.curve);
  const DipPairing pairing = pair_dips(simulated_dips, measured_dips);
  std::fprintf(text, "dips of |S11| (return loss at least 3 dB, standing 3 dB above their surroundings):\n");
  for (std::size_t s = 0; s < simulated_dips.size(); ++s) {
    const Resonance& d = simulated_dips[s];
    std::fprintf(text, "  simulated  %-14s return loss %.1f dB", frequency_text(d.frequency_hz).c_str(), d.return_loss_db);
    if (!pairing.simulated_unpaired[s].empty()) std::fprintf(text, "  unpaired: %s", pairing.simulated_unpaired[s].c_str());
    std::fprintf(text, "\n");
  }
  for (std::size_t m = 0; m < measured_dips.size(); ++m) {
    const Resonance& d = measured_dips[m];
    std::fprintf(text, "  measured   %-14s return loss %.1f dB", frequency_text(d.frequency_hz).c_str(), d.return_loss_db);
    const auto pair = std::find_if(pairing.pairs.begin(), pairing.pairs.end(),
                                   [&](const DipPairing::Pair& p) { return p.measured == m; });
    if (pair != pairing.pairs.end()) {
      const Resonance& partner = simulated_dips[pair->simulated];
      std::fprintf(text, "  paired with the simulated dip at %s: %+.3g MHz (%+.2f %%)", frequency_text(partner.frequency_hz).c_str(),
                  (d.frequency_hz - partner.frequency_hz) / 1e6, 100 * (d.frequency_hz / partner.frequency_hz - 1));
    } else {
      std::fprintf(text, "  unpaired: %s", pairing.measured_unpaired[m].c_str());
    }
    std::fprintf(text, "\n");
  }
  if (simulated_dips.empty() && measured_dips.empty()) std::fprintf(text, "  none in either curve\n");
  doc["dips"] = dips_json(simulated_dips, measured_dips, pairing);

  const ScaleEstimate estimate =
      frequency_scale_estimate(simulated, measured.curve, low, high, simulated_dips, measured_dips, pairing);
  doc["frequency_scale"] = estimate.scale ? Json{{"factor", *estimate.scale}, {"reason", nullptr}}
                                           : Json{{"factor", nullptr}, {"reason", estimate.reason}};
  Json band_docs = Json::array();
  if (estimate.scale) {
    const Real scale = *estimate.scale;
    std::fprintf(text, "\nbest frequency-scale factor: %.4f (the measured curve looks like the simulated one with every "
                "frequency times %.4f)\n",
                scale, scale);
    std::fprintf(text, "  that is what lengths %.2f %% %s than the model's would do: a simple antenna's resonances scale "
                "inversely with its size\n",
                std::abs(100 * (1 / scale - 1)), scale < 1 ? "longer" : "shorter");
  } else {
    std::fprintf(text, "\nno reliable shift: %s\n", estimate.reason.c_str());
  }
  for (const Band& band : bands) {
    const Real b_low = std::max(band.low_hz, low), b_high = std::min(band.high_hz, high);
    Json& band_doc = band_docs.emplace_back(Json{{"name", band.name}, {"low_hz", band.low_hz}, {"high_hz", band.high_hz},
                                                 {"in_overlap", b_low < b_high}});
    std::fprintf(text, "\nband %s (%s to %s):\n", band.name.c_str(), frequency_text(band.low_hz).c_str(),
                frequency_text(band.high_hz).c_str());
    if (!(b_low < b_high)) {
      std::fprintf(text, "  outside the overlap of the two curves\n");
      continue;
    }
    const Real rms = rms_return_loss_difference_db(simulated, measured.curve, b_low, b_high);
    std::fprintf(text, "  RMS return-loss difference %.2f dB", rms);
    band_doc["rms_return_loss_difference_db"] = rms;
    band_doc["rms_return_loss_difference_scaled_db"] = nullptr;
    if (estimate.scale) {
      const Real scaled = rms_return_loss_difference_db(simulated, measured.curve, b_low, b_high, *estimate.scale);
      std::fprintf(text, "; %.2f dB after scaling the frequencies by %.4f", scaled, *estimate.scale);
      band_doc["rms_return_loss_difference_scaled_db"] = scaled;
    }
    std::fprintf(text, "\n");
    if (measured.phase_known) {
      if (const auto d = complex_difference(simulated, measured.curve, b_low, b_high, network.reference_ohm)) {
        band_doc["reflection_difference"] = {{"rms", d->rms_reflection},
                                             {"largest", d->largest_reflection},
                                             {"largest_at_hz", d->largest_reflection_hz}};
        band_doc["impedance_difference_ohm"] = {{"mean_resistance", d->mean_impedance.real()},
                                                {"mean_reactance", d->mean_impedance.imag()},
                                                {"largest", d->largest_impedance},
                                                {"largest_at_hz", d->largest_impedance_hz}};
        std::fprintf(text, "  on the Smith chart |measured - simulated Gamma|: RMS %.3f, largest %.3f at %s\n", d->rms_reflection,
                    d->largest_reflection, frequency_text(d->largest_reflection_hz).c_str());
        auto tidy = [](Real ohm) { return std::abs(ohm) < 0.05 ? 0.0 : ohm; };  // no "-0.0" from rounding noise
        std::fprintf(text, "  impedance, measured - simulated: mean %+.1f %+.1fj ohm, largest |dZ| %.1f ohm at %s\n",
                    tidy(d->mean_impedance.real()), tidy(d->mean_impedance.imag()), d->largest_impedance,
                    frequency_text(d->largest_impedance_hz).c_str());
      }
    } else {
      std::fprintf(text, "  (the measurement has no phase: only magnitudes are compared)\n");
    }
    const PortBandReport sim = band_report(simulated, b_low, b_high), meas = band_report(measured.curve, b_low, b_high);
    std::fprintf(text, "%s", band_line("simulated", sim).c_str());
    std::fprintf(text, "%s", band_line("measured", meas).c_str());
    band_doc["simulated"] = band_report_json(sim);
    band_doc["measured"] = band_report_json(meas);
    if (options.tx_power_w) {
      // The worst VSWR in the band gives the most power sent back: P |Γ|², |Γ| = (s − 1)/(s + 1).
      auto reflected = [&](const PortBandReport& r) {
        const Real g = (r.highest_vswr.value - 1) / (r.highest_vswr.value + 1);
        return reflected_power_w(*options.tx_power_w, g);
      };
      const Real limit = reflected_power_w(*options.tx_power_w, (vswr_caution_threshold - 1) / (vswr_caution_threshold + 1));
      band_doc["reflected_power_w"] = {{"forward", *options.tx_power_w}, {"simulated", reflected(sim)}, {"measured", reflected(meas)}};
      std::fprintf(text, "  reflected power with %.4g W forward, at worst: simulated %.4g W, measured %.4g W%s\n",
                  *options.tx_power_w, reflected(sim), reflected(meas),
                  std::max(reflected(sim), reflected(meas)) > limit ? " (more than VSWR 2 reflects: check the transmitter's rating)" : "");
    }
  }
  doc["bands"] = band_docs;
  if (options.json) std::fputs((doc.dump(2) + "\n").c_str(), stdout);
  return 0;
}

}  // namespace lobe::cli
