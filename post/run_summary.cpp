#include "post/run_summary.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>

#include "core/constants.hpp"
#include "core/formatted_text.hpp"
#include "post/band_report.hpp"
#include "post/exposure_summary.hpp"
#include "post/port_quantities.hpp"

namespace lobe {
namespace {

/// The value as `format` prints it, without the sign of a value that rounds to zero ("-0.0").
std::string unsigned_zero_text(const char* format, Real value) {
  std::string text = formatted(format, value);
  if (text.front() == '-' && text.find_first_of("123456789") == std::string::npos) text.erase(0, 1);
  return text;
}

/// "12.3", or "n/a" where a figure is not defined.
std::string optional_text(const std::optional<Real>& value, const char* format) {
  return value ? unsigned_zero_text(format, *value) : std::string("n/a");
}

/// A beamwidth of no_half_power_deg reads as "omni": no half-power point in that plane.
std::string beamwidth_text(Real degrees) {
  return degrees >= no_half_power_deg ? std::string("omni") : formatted("%.0f", degrees);
}

/// Whether every frequency's polarisation figures are taken at its main beam.
bool polarization_at_beam(const RunRecord& run) {
  return std::all_of(run.results.begin(), run.results.end(), [](const FrequencyResult& r) {
    return r.polarization.toward.theta == r.beam.peak.theta && r.polarization.toward.phi == r.beam.peak.phi;
  });
}

/// Whether the field is linearly polarised (axial ratio above linear_axial_ratio_db) where
/// the polarisation figures are taken, at every frequency: their table then says so in a line.
bool linear_everywhere(const RunRecord& run) {
  return std::all_of(run.results.begin(), run.results.end(),
                     [](const FrequencyResult& r) { return r.polarization.axial_ratio_db >= linear_axial_ratio_db; });
}

/// "at the main beam" or "toward theta 0.0, phi 0.0 deg".
std::string polarization_place(const RunRecord& run) {
  const Direction toward = run.results.front().polarization.toward;
  return polarization_at_beam(run) ? "at the main beam"
                                   : formatted("toward theta %.1f, phi %.1f deg", toward.theta * 180 / pi,
                                               toward.phi * 180 / pi);
}

/// The beam's figures over the band, each at the centre and at its worst (post/beam_band_report).
std::string beam_band_text(const RunRecord& run, const Band& band) {
  const auto figures = beam_band_report(beam_curves(run.results), band.low_hz, band.high_hz);
  std::string out;
  // `extreme_word` names the extreme printed: the worst, or with `best` the other one.
  auto line = [&](const char* label, const std::string& name, const char* format, const char* extreme_word,
                  bool best = false) {
    const auto found = figures.find(name);
    if (found == figures.end()) {
      out += formatted("  %-15s n/a: not defined at some frequency of the band (a beam near the zenith over a ground "
                       "has no back)\n", label);
      return;
    }
    const BandFigure& f = found->second;
    auto text = [&](Real v) {
      if (name.rfind("beamwidth", 0) != 0) return unsigned_zero_text(format, v);
      return v >= no_half_power_deg ? std::string("omni (no half-power point)") : formatted(format, v);
    };
    const std::string centre = text(f.centre), extreme = text(best ? f.best : f.worst);
    out += formatted("  %-15s %s at the centre, %s in the band %s at %s\n", label, centre.c_str(), extreme_word, extreme.c_str(),
                     frequency_text(best ? f.best_hz : f.worst_hz).c_str());
  };
  line("gain", "gain", "%.2f dBi", "lowest");
  line("realized gain", "realized-gain", "%.2f dBi", "lowest");
  line("front-to-back", "front-to-back", "%.1f dB", "lowest");
  line("front-to-side", "front-to-side", "%.1f dB", "lowest");
  line("beamwidth theta", "beamwidth-theta", "%.0f deg", "widest");
  line("beamwidth phi", "beamwidth-phi", "%.0f deg", "widest");
  if (linear_everywhere(run)) {
    out += "  polarisation   linear " + polarization_place(run) + " (axial ratio above " +
           formatted("%.0f", linear_axial_ratio_db) + " dB at every frequency)\n";
  } else {
    out += "  " + polarization_place(run) + ":\n";
    line("axial ratio", "axial-ratio", "%.2f dB", "highest");
    // The hand the antenna radiates at the centre is judged by its lowest gain, the other
    // (cross-polar) hand by its highest.
    const bool right = figures.count("rhcp-gain") && figures.count("lhcp-gain") &&
                       figures.at("rhcp-gain").centre >= figures.at("lhcp-gain").centre;
    line("RHCP gain", "rhcp-gain", "%.2f dBi", right ? "lowest" : "highest", !right);
    line("LHCP gain", "lhcp-gain", "%.2f dBi", right ? "highest" : "lowest", right);
    line("cross-polar", "cross-polar", "%.1f dB", "lowest");
  }
  line("efficiency", "efficiency", "%.1f %%", "lowest");
  return out;
}

/// Between every two ports, the highest coupling |S_ij| at the computed frequencies in the
/// band (each port driven alone), floored at coupling_floor_db where it is rounding.
std::string coupling_text(const Model& model, const std::vector<const FrequencyResult*>& inside) {
  std::string out;
  if (inside.empty()) return out;
  const std::size_t np = model.ports.size();
  for (std::size_t i = 0; i < np; ++i)
    for (std::size_t j = i + 1; j < np; ++j) {
      Real highest = 0.0, at = inside.front()->frequency_hz;
      for (const FrequencyResult* r : inside) {
        const Real s = std::max(std::abs(r->s_matrix(i, j)), std::abs(r->s_matrix(j, i)));
        if (s > highest) highest = s, at = r->frequency_hz;
      }
      const std::string label = model.ports[i].name + "-" + model.ports[j].name;
      if (highest < std::pow(10.0, coupling_floor_db / 20))
        out += formatted("  coupling %-6s below %.0f dB at every computed frequency: none beyond the solve's rounding\n",
                         label.c_str(), coupling_floor_db);
      else
        out += formatted("  coupling %-6s highest in the band %.1f dB (|S| between them, each driven alone) at %s\n",
                         label.c_str(), 20 * std::log10(highest), frequency_text(at).c_str());
    }
  return out;
}

/// The band's match per port (band_report) and the beam's figures at the band centre and
/// at their worst over the band (beam_band_text).
std::string band_text(const RunRecord& run, const Band& band) {
  const Model& model = run.problem.model;
  std::string out = "\nband " + band.name + " (" + frequency_text(band.low_hz) + " to " + frequency_text(band.high_hz) + "): ";
  std::vector<const FrequencyResult*> inside;
  for (const auto& r : run.results)
    if (r.frequency_hz >= band.low_hz && r.frequency_hz <= band.high_hz) inside.push_back(&r);
  if (run.results.front().frequency_hz > band.high_hz || run.results.back().frequency_hz < band.low_hz)
    return out + "no computed frequency reaches it; add frequencies that cover it\n";
  out += count_text(inside.size(), "computed frequency", "computed frequencies") + " inside";
  if (run.results.front().frequency_hz > band.low_hz || run.results.back().frequency_hz < band.high_hz)
    out += "; only part of it is covered";
  out += "; between them the match is interpolated\n";
  for (std::size_t p = 0; p < model.ports.size(); ++p) {
    const PortBandReport b = band_report(port_reflection_curve(run.results, p), band.low_hz, band.high_hz, vswr_caution_threshold);
    out += formatted("  port %-10s VSWR best %.2f at %s, mean %.2f, worst %.2f at %s; mean mismatch loss %.2f dB\n",
                         model.ports[p].name.c_str(), b.lowest_vswr.value, frequency_text(b.lowest_vswr.frequency_hz).c_str(),
                         b.mean_vswr, b.highest_vswr.value, frequency_text(b.highest_vswr.frequency_hz).c_str(),
                         b.mean_mismatch_loss_db);
    out += formatted("  %-15s %s; ", "", share_within_text(b).c_str());
    if (const auto& s = b.return_loss_10db)
      out += formatted("return loss >= 10 dB from %s%s to %s%s\n", s->open_low ? "below " : "",
                           frequency_text(s->low_hz).c_str(), frequency_text(s->high_hz).c_str(),
                           s->open_high ? " and beyond" : "");
    else
      out += "return loss stays under 10 dB\n";
  }
  out += coupling_text(model, inside);
  out += beam_band_text(run, band);
  return out;
}

/// P |Γ|² at every frequency and driven port, flagged where it exceeds the share that
/// VSWR 2 reflects (1/9, the usual limit; common practice).
std::string reflected_power_text(const RunRecord& run, Real forward_w) {
  const Real limit_gamma = (vswr_caution_threshold - 1) / (vswr_caution_threshold + 1);
  const Real limit = reflected_power_w(forward_w, limit_gamma);
  std::string out = formatted("\nreflected power with %.4g W forward at each driven port (P |Gamma|^2); '!' marks more "
                                  "than %.3g W, what VSWR %.3g reflects:\n",
                                  forward_w, limit, vswr_caution_threshold);
  out += formatted("%-14s %-10s %14s\n", "frequency", "port", "reflected (W)");
  int flagged = 0;
  for (const auto& r : run.results)
    for (std::size_t p = 0; p < r.ports.size(); ++p) {
      if (!r.ports[p].driven) continue;
      const Real w = reflected_power_w(forward_w, std::abs(r.ports[p].reflection));
      flagged += w > limit;
      out += formatted("%-14s %-10s %14.4g%s\n", frequency_text(r.frequency_hz).c_str(),
                           run.problem.model.ports[p].name.c_str(), w, w > limit ? " !" : "");
    }
  if (flagged)
    out += formatted("%d of these exceed %.3g W: check that the transmitter tolerates it before transmitting there.\n",
                         flagged, limit);
  return out;
}

/// The feed lines' loss as the power delivered past them: −10 log10(1 − P_line/P_accepted).
Real line_loss_db(const PowerBudget& p) {
  if (!(p.accepted > 0.0) || p.line_loss >= p.accepted) return return_loss_ceiling_db;
  return -10.0 * std::log10(1.0 - p.line_loss / p.accepted);
}

/// Where a feed network meets the antenna: the impedance there, as an analyser would see it
/// without the network (a feed line's antenna end).
std::string antenna_ends_text(const RunRecord& run) {
  const FeedNetwork& network = run.problem.network;
  const std::vector<int> ends = network.antenna_ends();
  if (ends.empty()) return "";
  std::string out = "at the antenna, where the feed network meets it:\n";
  out += formatted("%-14s %-16s %10s %10s %9s %8s\n", "frequency", "place", "R (ohm)", "X (ohm)", "VSWR", "RL (dB)");
  for (const auto& r : run.results)
    for (std::size_t k = 0; k < r.antenna_ends.size(); ++k) {
      const PortResult& end = r.antenna_ends[k];
      out += formatted("%-14s %-16s %10.2f %+10.2f %9.2f %8.2f\n", frequency_text(r.frequency_hz).c_str(),
                       network.terminals()[ends[k]].label.c_str(), end.impedance.real(), end.impedance.imag(), end.vswr,
                       end.return_loss_db);
    }
  return out + "\n";
}

}  // namespace

std::string frequency_text(Real hz) {
  if (hz >= 1e9) return formatted("%.4f GHz", hz / 1e9);
  if (hz >= 1e6) return formatted("%.3f MHz", hz / 1e6);
  return formatted("%.3f kHz", hz / 1e3);
}

std::string count_text(std::size_t count, const std::string& noun, const std::string& plural) {
  return std::to_string(count) + " " + (count == 1 ? noun : plural.empty() ? noun + "s" : plural);
}

std::string run_summary(const RunRecord& run) {
  const Model& model = run.problem.model;
  std::string out;
  const auto driven = std::count_if(model.ports.begin(), model.ports.end(), [](const Port& p) { return p.voltage != 0.0; });
  if (driven > 1)
    out += "active impedances: every driven port driven at once, as the model drives them (each port alone: the Z and S "
           "matrices in the HDF5 file)\n";
  out += formatted("%-14s %-10s %10s %10s %9s %8s\n", "frequency", "port", "R (ohm)", "X (ohm)", "VSWR", "RL (dB)");
  for (const auto& r : run.results)
    for (std::size_t p = 0; p < r.ports.size(); ++p) {
      const PortResult& port = r.ports[p];
      out += formatted("%-14s %-10s %10.2f %+10.2f %9.2f %8.2f%s\n", frequency_text(r.frequency_hz).c_str(),
                           model.ports[p].name.c_str(), port.impedance.real(), port.impedance.imag(), port.vswr,
                           port.return_loss_db, port.driven ? "" : "  (0 V: self impedance)");
    }
  out += "\n";
  out += antenna_ends_text(run);
  // On a substrate, where the power that does not radiate goes: surface waves and the
  // dielectric; through a feed line, its loss.
  const bool board = model.substrate.has_value();
  const bool lines = std::any_of(run.results.begin(), run.results.end(),
                                 [](const FrequencyResult& r) { return r.power.line_loss > 0.0; });
  const bool soil = run.problem.medium.has_real_ground();
  out += formatted("%-14s %15s %15s %15s %8s %8s %14s %10s%s%s%s\n", "frequency", "peak gain (dBi)", "realized (dBi)", "peak at th/ph",
                   "F/B (dB)", "F/S (dB)", "HPBW th/ph", "efficiency", board ? "  surface waves  dielectric" : "",
                   soil ? "  into ground" : "", lines ? "  line loss (dB)" : "");
  for (const auto& r : run.results) {
    const BeamFigures& b = r.beam;
    const std::string direction = formatted("%.0f/%.0f deg", b.peak.theta * 180 / pi, b.peak.phi * 180 / pi);
    const std::string widths = beamwidth_text(b.beamwidth_theta_deg) + "/" + beamwidth_text(b.beamwidth_phi_deg) + " deg";
    const Real accepted = r.power.accepted > 0.0 ? r.power.accepted : 1.0;
    std::string losses =
        board ? formatted(" %14.1f%% %10.1f%%", 100.0 * r.power.surface_wave / accepted, 100.0 * r.power.dielectric_loss / accepted)
              : std::string();
    if (soil) losses += formatted(" %12.1f%%", 100.0 * r.power.ground_loss / accepted);
    if (lines) losses += formatted(" %15.2f", line_loss_db(r.power));
    out += formatted("%-14s %15.2f %15.2f %15s %8s %8s %14s %9.1f%%%s%s\n", frequency_text(r.frequency_hz).c_str(),
                     b.gain_dbi, b.realized_gain_dbi, direction.c_str(), optional_text(b.front_to_back_db, "%.1f").c_str(),
                     optional_text(b.front_to_side_db, "%.1f").c_str(), widths.c_str(), 100.0 * r.power.efficiency(),
                     losses.c_str(), std::abs(r.power.imbalance()) > power_balance_warning ? " !" : "");
  }
  if (linear_everywhere(run))
    out += "\npolarisation: linear " + polarization_place(run) + " at every frequency (axial ratio above " +
           formatted("%.0f", linear_axial_ratio_db) + " dB)\n";
  else
    out += formatted("\n%-14s %15s %9s %12s %11s %11s %9s\n", "frequency",
                     polarization_at_beam(run) ? "at the beam" : "toward th/ph", "AR (dB)", "hand", "RHCP (dBi)",
                     "LHCP (dBi)", "XPD (dB)");
  for (const auto& r : run.results) {
    if (linear_everywhere(run)) break;
    const PolarizationFigures& p = r.polarization;
    const std::string direction = formatted("%.0f/%.0f deg", p.toward.theta * 180 / pi, p.toward.phi * 180 / pi);
    out += formatted("%-14s %15s %9.2f %12s %11.2f %11.2f %9.1f\n", frequency_text(r.frequency_hz).c_str(),
                     direction.c_str(), p.axial_ratio_db, hand_name(p.hand), p.rhcp_dbi, p.lhcp_dbi,
                     p.cross_polar_discrimination_db);
  }
  for (const std::string& w : power_balance_warnings(run)) out += "! " + w + "\n";

  for (const auto& band : model.bands) out += band_text(run, band);

  Real smallest_rcond = 1.0, largest_residual = 0.0;
  std::size_t symmetric = 0, rechecked = 0;
  for (const auto& r : run.results) {
    smallest_rcond = std::min(smallest_rcond, r.report.reciprocal_condition);
    largest_residual = std::max(largest_residual, r.report.relative_residual);
    symmetric += r.report.factorization == Factorization::symmetric;
    rechecked += r.report.factorization == Factorization::lu_after_check;
  }
  const std::string condition = smallest_rcond > 0 ? formatted("%.2g", 1.0 / smallest_rcond) : "infinite";
  const std::string method = symmetric == run.results.size() ? "symmetric LDLt"
                             : symmetric == 0               ? "LU"
                                                            : "symmetric LDLt and LU";
  out += formatted("\nmatrix: factored by %s, condition number up to %s, relative residual up to %.1e%s\n",
                   method.c_str(), condition.c_str(), largest_residual,
                   smallest_rcond < ill_conditioned_rcond ? " (ill-conditioned: check the geometry)" : "");
  const std::size_t interpolated = static_cast<std::size_t>(
      std::count_if(run.results.begin(), run.results.end(), [](const FrequencyResult& r) { return r.interpolated; }));
  if (interpolated > 0)
    out += formatted("frequencies: %zu of %zu solved in full, the others interpolated (adaptive sweep: a rational "
                     "fit whose S-parameters settled to 0.001; --every-frequency solves them all)\n",
                     run.results.size() - interpolated, run.results.size());
  if (rechecked > 0)
    out += formatted("! at %zu frequencies the symmetric factors failed their accuracy check (pivot growth); "
                     "those were factored by LU\n", rechecked);

  Real worst = 1.0, worst_hz = 0.0;
  for (const auto& r : run.results)
    for (const auto& p : r.ports)
      if (p.driven && p.vswr > worst) {
        worst = p.vswr;
        worst_hz = r.frequency_hz;
      }
  if (run.info.tx_power_w) out += reflected_power_text(run, *run.info.tx_power_w) + exposure_text(run, *run.info.tx_power_w);
  out += "\nCautions:\n";
  if (worst > vswr_caution_threshold) {
    const Real gamma = (worst - 1.0) / (worst + 1.0);
    out += formatted("  - VSWR reaches %.2f at %s: %.0f%% of the transmitter's power is reflected back toward it.\n"
                         "    A high VSWR can damage a transmitter's amplifier; check its rating before transmitting.\n",
                         worst, frequency_text(worst_hz).c_str(), 100.0 * gamma * gamma);
  }
  out += "  - Fields near a transmitting antenna can exceed RF exposure limits; keep people at a safe distance.\n"
         "  - Which bands and powers you may transmit with depends on your licence and country.\n"
         "    Local regulations and licensed practice take precedence over anything this tool prints.\n";
  return out;
}

std::vector<std::string> power_balance_warnings(const RunRecord& run) {
  std::vector<std::string> warnings;
  for (const auto& r : run.results) {
    const Real miss = r.power.imbalance();
    if (std::abs(miss) <= power_balance_warning) continue;
    warnings.push_back(formatted("power balance at %s misses by %.2g%%: radiated and lost power %s the accepted power, so "
                                 "efficiency (%.1f%%) and gain are uncertain by about that much; refine the mesh near "
                                 "feeds and junctions",
                                 frequency_text(r.frequency_hz).c_str(), 100 * std::abs(miss),
                                 miss < 0 ? "exceed" : "fall short of", 100 * r.power.efficiency()));
  }
  return warnings;
}

std::string share_within_text(const PortBandReport& r) {
  if (r.covered_share >= 1.0 - 1e-12)
    return formatted("VSWR <= %.3g over %.0f%% of the band", r.vswr_threshold, 100 * r.fraction_within);
  return formatted("VSWR <= %.3g over %.0f%% of the covered %.0f%% of the band (%s to %s; the rest is not computed)",
                   r.vswr_threshold, 100 * r.fraction_within, 100 * r.covered_share,
                   frequency_text(r.covered_low_hz).c_str(), frequency_text(r.covered_high_hz).c_str());
}

}  // namespace lobe
