#pragma once
/// Impedances that enter the system matrix at a few entries, outside the integral
/// equation: a wire's conductor loss and lumped loads (later: network elements).
#include <vector>

#include "geometry/model.hpp"
#include "geometry/wire_mesh.hpp"
#include "solver/system_matrix.hpp"
#include "solver/wire_basis.hpp"

namespace lobe {

/// Series: R + jωL + 1/(jωC) (no capacitor when none is given). Parallel: the reciprocal
/// of the sum of the admittances of the elements given. Ohm.
Complex load_impedance(const LumpedValues& load, Real frequency_hz);

/// Internal impedance per metre of a round wire of radius a and conductivity σ:
/// z' = (1 + j) √(ωμ0 / (2σ)) / (2πa), valid when the skin depth ≪ a. Ohm/m.
Complex wire_internal_impedance(Real radius, Real conductivity, Real frequency_hz);

/// Z += z' ∫ N_i N_j dl (L/3 or L/6) on every finitely conducting segment.
std::vector<MatrixContribution> conductor_loss_stamp(const WireMesh& mesh, const WireBasis& basis, Real frequency_hz);

/// Z += z_load p pᵀ over the non-zero couplings p of a load's gap.
std::vector<MatrixContribution> load_stamp(const Eigen::VectorXd& coupling, Complex z_load);

}  // namespace lobe
