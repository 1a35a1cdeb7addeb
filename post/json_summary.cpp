#include "post/json_summary.hpp"

#include <nlohmann/json.hpp>

#include "core/constants.hpp"
#include "post/band_report.hpp"
#include "post/run_summary.hpp"

namespace lobe {
namespace {

using Json = nlohmann::ordered_json;

Json optional_number(const std::optional<Real>& value) { return value ? Json(*value) : Json(nullptr); }

/// The beam's figures per frequency, under their band-figure names (beam_figure_kinds).
Json beam_json(const RunRecord& run) {
  const BeamCurves curves = beam_curves(run.results);
  Json beam = Json::object();
  beam["peak_theta_deg"] = curves.peak_theta_deg;
  beam["peak_phi_deg"] = curves.peak_phi_deg;
  for (const auto& kind : beam_figure_kinds()) {
    Json values = Json::array();
    for (const auto& v : curves.values.at(kind.name)) values.push_back(optional_number(v));
    beam[kind.dataset] = values;
  }
  Json toward_theta = Json::array(), toward_phi = Json::array(), hands = Json::array();
  for (const auto& r : run.results) {
    toward_theta.push_back(r.polarization.toward.theta * 180 / pi);
    toward_phi.push_back(r.polarization.toward.phi * 180 / pi);
    hands.push_back(hand_name(r.polarization.hand));
  }
  beam["polarization_theta_deg"] = toward_theta;
  beam["polarization_phi_deg"] = toward_phi;
  beam["hand"] = hands;
  return beam;
}

/// One band: per port the match figures, and the beam's figures at the centre and worst.
Json band_json(const RunRecord& run, const Band& band) {
  Json out{{"name", band.name}, {"low_hz", band.low_hz}, {"high_hz", band.high_hz}};
  const auto per_port = run_band_figures(run.results, run.problem.model.ports.size(), band);
  out["covered"] = per_port.has_value();
  if (!per_port) return out;  // no computed frequency reaches the band
  Json ports = Json::array();
  for (std::size_t p = 0; p < per_port->size(); ++p) {
    Json port{{"name", run.problem.model.ports[p].name}};
    for (const auto& name : port_figure_names()) port[name] = band_figure((*per_port)[p].port, name);
    port["covered_share"] = (*per_port)[p].port.covered_share;
    ports.push_back(port);
  }
  // The beam's figures are the same for every port (an antenna has at least one).
  const std::map<std::string, BandFigure>& beam_figures = per_port->front().beam;
  out["ports"] = ports;
  Json figures = Json::object();
  for (const auto& kind : beam_figure_kinds()) {
    const auto found = beam_figures.find(kind.name);
    figures[kind.name] = found == beam_figures.end()
                             ? Json(nullptr)
                             : Json{{"centre", found->second.centre},
                                    {"worst", found->second.worst},
                                    {"worst_hz", found->second.worst_hz},
                                    {"best", found->second.best},
                                    {"best_hz", found->second.best_hz}};
  }
  out["beam"] = figures;
  return out;
}

}  // namespace

std::string run_summary_json(const RunRecord& run) {
  const Model& model = run.problem.model;
  Json doc{{"schema", run_summary_schema}, {"schema_version", run_summary_schema_version}, {"lobe_version", run.info.version}};
  Json ports = Json::array();
  for (const auto& p : model.ports) ports.push_back(p.name);
  doc["model"] = {{"file", model.file}, {"reference_ohm", model.reference_ohm}, {"ports", ports}};
  Json frequencies = Json::array();
  for (const auto& r : run.results) frequencies.push_back(r.frequency_hz);
  doc["frequency_hz"] = frequencies;
  Json per_port = Json::array();
  for (std::size_t p = 0; p < model.ports.size(); ++p) {
    Json resistance = Json::array(), reactance = Json::array(), vswr = Json::array(), loss = Json::array();
    for (const auto& r : run.results) {
      resistance.push_back(r.ports[p].impedance.real());
      reactance.push_back(r.ports[p].impedance.imag());
      vswr.push_back(r.ports[p].vswr);
      loss.push_back(r.ports[p].return_loss_db);
    }
    per_port.push_back({{"name", model.ports[p].name},
                        {"resistance_ohm", resistance},
                        {"reactance_ohm", reactance},
                        {"vswr", vswr},
                        {"return_loss_db", loss}});
  }
  doc["ports"] = per_port;
  doc["beam"] = beam_json(run);
  Json bands = Json::array();
  for (const auto& band : model.bands) bands.push_back(band_json(run, band));
  doc["bands"] = bands;
  doc["warnings"] = power_balance_warnings(run);
  return doc.dump(2) + "\n";
}

}  // namespace lobe
