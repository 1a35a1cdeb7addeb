#pragma once
/// Ohmic loss of plates and bodies of finite conductivity, as an impedance boundary
/// condition: the tangential field on the metal is Z_s times the surface current, which
/// adds Z_s ∫ f_m·f_n dS to the system matrix.
#include <vector>

#include "solver/antenna_problem.hpp"
#include "solver/system_matrix.hpp"

namespace lobe {

/// Z_s of a metal sheet carrying its current on one face, the other free:
/// η_c coth(γ t) with η_c = (1 + j) R_s, γ = (1 + j)/δ, R_s = √(ωμ0/(2σ)), δ = √(2/(ωμ0σ));
/// (1 + j) R_s for a thick one (t = 0 or many skin depths), 1/(σt) for t ≪ δ. Ω.
Complex sheet_impedance(Real conductivity, Real thickness, Real frequency_hz);

/// The lossy surfaces' terms. Where the current flows: on one face of a printed plate (it
/// gathers on the face toward the ground) and of a closed body (its outside); shared equally
/// by the two faces of a plate in air (Z_s/2), which underestimates the loss of a plate
/// close over a ground by up to half. A junction star's current density grows as 1/ρ toward
/// its wire: its own overlap is cut off at the wire's radius (the current enters over the
/// wire's circumference), integrated in closed form along each ray.
std::vector<MatrixContribution> surface_loss_stamp(const AntennaProblem& problem, Real frequency_hz);

/// ½ Re(I^H S I) for a stamp S whose entries are real multiples of one impedance's real
/// part: the power a stamp dissipates under the coefficients I. W.
Real stamp_power(const std::vector<MatrixContribution>& stamp, const ComplexVector& coefficients);

}  // namespace lobe
