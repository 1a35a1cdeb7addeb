#pragma once
/// The right-hand sides of the moment equations.
#include "solver/antenna_problem.hpp"
#include "solver/medium.hpp"

namespace lobe {

/// V_m = ∫ f_m · E dl (or dS) for an incident plane wave and the waves the medium reflects
/// (over a perfect ground, the image wave), on every wire piece, RWG function and junction
/// star, at the points of basis_samples. V (the wave's amplitude in V/m times metres).
ComplexVector plane_wave_vector(const AntennaProblem& problem, const IncidentWave& wave, Real frequency_hz);

}  // namespace lobe
