#pragma once
/// Where the power delivered to the ports goes.
#include <vector>

#include "solver/antenna_problem.hpp"

namespace lobe {

/// Time-average powers, W.
struct PowerBudget {
  Real accepted = 0.0;        ///< ½ Re Σ V I* over all ports
  Real conductor_loss = 0.0;  ///< skin-effect loss in finitely conducting wires
  Real load_loss = 0.0;       ///< in the resistive parts of lumped loads and network parts
  Real line_loss = 0.0;       ///< in the feed network's lines and stubs
  Real radiated = 0.0;        ///< from the far field over the sphere (hemisphere over ground)
  Real surface_wave = 0.0;    ///< launched into a substrate's surface waves
  /// In a lossy substrate: what the accepted power leaves after everything else (the one
  /// figure taken by balance, so a lossy board's balance is not checked).
  Real dielectric_loss = 0.0;
  /// Over real ground: what the accepted power leaves after everything else, the power the
  /// soil absorbs (taken by balance, so its balance is not checked either).
  Real ground_loss = 0.0;
  Real efficiency() const { return accepted > 0.0 ? radiated / accepted : 0.0; }
  /// (accepted − radiated − surface waves − losses)/accepted: zero for an exact solution.
  Real imbalance() const {
    return accepted > 0.0
               ? (accepted - radiated - surface_wave - conductor_loss - load_loss - line_loss - dielectric_loss -
                  ground_loss) / accepted
               : 0.0;
  }
};

/// The power each wire load takes, ½ |I|² Re Z_load, W: losses when driven, the received
/// power when lit by a wave.
std::vector<Real> load_powers(const AntennaProblem& problem, const FrequencySolution& solution);

/// The power each feed-network element takes, in FeedNetwork element order (the model's
/// elements, then the wire loads that joined the network), W.
std::vector<Real> network_powers(const AntennaProblem& problem, const FrequencySolution& solution);

/// Accepted power and losses; `radiated` is left to the caller (see FarField).
PowerBudget power_budget(const AntennaProblem& problem, const FrequencySolution& solution);

}  // namespace lobe
