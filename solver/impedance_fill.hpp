#pragma once
/// Fills the thin-wire EFIE moment matrix.
#include "geometry/wire_mesh.hpp"
#include "solver/wire_basis.hpp"

namespace lobe {

/// Adds the mixed-potential EFIE Galerkin matrix (exp(+jωt)):
///   Z_mn = jωμ0 ∫∫ f_m·f_n G − (j/(ωε0)) ∫∫ (∇·f_m)(∇·f_n) G,
/// plus, with `ground_perfect`, every source's image in z = 0 (current mirrored and
/// negated), into `z` (N×N, N = basis.size()). Filled by segment pairs, each pair once,
/// so the result is exactly symmetric. OpenMP-parallel over observation segments.
/// Cost: O(S²) kernel evaluations for S segments.
void add_wire_impedance(const WireMesh& mesh, const WireBasis& basis, bool ground_perfect, Real frequency_hz,
                        ComplexMatrix& z);

/// Adds the skin-effect internal impedance of finitely conducting segments:
/// z' = (1 + j) √(ωμ0 / (2σ)) / (2πa) per metre (valid when the skin depth ≪ a),
/// tested with the basis functions themselves (∫ N_i N_j dl = L/3 or L/6).
void add_conductor_impedance(const WireMesh& mesh, const WireBasis& basis, Real frequency_hz, ComplexMatrix& z);

/// Internal impedance per metre of a round wire of radius a and conductivity σ, ohm/m.
Complex wire_internal_impedance(Real radius, Real conductivity, Real frequency_hz);

}  // namespace lobe
