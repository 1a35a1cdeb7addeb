#pragma once
/// Far field radiated by surface (RWG) currents.
#include "geometry/surface_mesh.hpp"
#include "post/far_field.hpp"
#include "solver/rwg_basis.hpp"

namespace lobe {

/// E_θ, E_φ at r = 1 m (e^{−jkr} removed) from currents `coefficients` on the RWG functions,
/// E = −jωμ0/(4π) (I − r̂ r̂·) ∫ J(r') e^{jk r̂·r'} dS', by the 7-point rule per triangle.
/// O(T) per direction.
FarFieldSample surface_far_field(const SurfaceMesh& mesh, const RwgBasis& basis, const ComplexVector& coefficients,
                                 Real frequency_hz, Real theta, Real phi);

/// Radar cross-section 4π |E_scattered|² / |E_incident|² at r = 1 m with a 1 V/m incident
/// wave, m².
Real radar_cross_section(const FarFieldSample& scattered);

}  // namespace lobe
