#pragma once
/// Port impedance, reflection, VSWR and the multi-port Z and S matrices.
#include <vector>

#include "solver/antenna_problem.hpp"

namespace lobe {

/// Largest VSWR and return loss reported; beyond them the port is a total mismatch or a
/// perfect match to within rounding, and a finite number keeps every output readable.
constexpr Real vswr_ceiling = 1e9;
constexpr Real return_loss_ceiling_db = 300.0;

/// Γ = (Z − Z0)/(Z + Z0) for a real reference Z0.
/// A coupling |S_ij| below this (1e-10) is the solve's rounding, not a coupling: a dense
/// factorisation leaves relative residuals of 1e-15 to 1e-13, and two orthogonal dipoles
/// printed |S21| of −315 dB. Couplings below it are written as "below −200 dB".
constexpr Real coupling_floor_db = -200.0;

Complex reflection_coefficient(Complex impedance, Real reference_ohm);
/// (1 + |Γ|)/(1 − |Γ|), at most vswr_ceiling.
Real vswr_from_reflection(Real magnitude);
/// −20 log10 |Γ|, dB, at most return_loss_ceiling_db.
Real return_loss_db(Real magnitude);
/// −10 log10(1 − |Γ|²), dB: the share of available power not accepted.
Real mismatch_loss_db(Real magnitude);
/// Power sent back toward a transmitter delivering `forward_w` into |Γ|: P |Γ|², W.
Real reflected_power_w(Real forward_w, Real magnitude);

struct PortResult {
  Complex voltage;       ///< V, as driven
  Complex current;       ///< A
  Complex impedance;     ///< ohm: V/I with all ports driven (active), or Z_pp when undriven
  bool driven = true;    ///< false for a 0 V port, whose impedance is its self impedance
  Complex reflection;
  Real vswr = 1.0;
  Real return_loss_db = 0.0;
  Real mismatch_loss_db = 0.0;
};

/// Per-port results, against `reference_ohm`.
std::vector<PortResult> port_results(const FrequencySolution& solution, Real reference_ohm);

/// Where the feed network meets the antenna (FeedNetwork::antenna_ends): the voltage
/// across each gap, the current into the antenna there and their ratio, against
/// `reference_ohm`: a feed line's antenna end, as an analyser would see it without the line.
std::vector<PortResult> antenna_end_results(const AntennaProblem& problem, const FrequencySolution& solution,
                                            Real reference_ohm);

/// Z = Y⁻¹, ohm.
ComplexMatrix impedance_matrix(const FrequencySolution& solution);
/// S = (Z − Z0)(Z + Z0)⁻¹ with the same real reference at every port.
ComplexMatrix scattering_matrix(const ComplexMatrix& impedance, Real reference_ohm);

}  // namespace lobe
