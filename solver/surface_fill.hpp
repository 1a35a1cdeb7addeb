#pragma once
/// Fills the surface (RWG) EFIE moment matrix and the plane-wave excitation.
#include "geometry/surface_mesh.hpp"
#include "solver/rwg_basis.hpp"

namespace lobe {

/// Adds Z_mn = jωμ0 ∫∫ f_m·f_n G − (j/(ωε0)) ∫∫ (∇·f_m)(∇·f_n) G for RWG functions
/// (mixed-potential EFIE, Galerkin) into `z` (N×N, N ≥ basis.first() + basis.size()),
/// with every source's image in z = 0 when `ground_perfect`. Filled by triangle pairs, each
/// pair once, so Z is exactly symmetric; OpenMP-parallel over observation triangles. O(T²).
void add_surface_impedance(const SurfaceMesh& mesh, const RwgBasis& basis, bool ground_perfect, Real frequency_hz,
                           ComplexMatrix& z);

/// The incident plane wave, arriving from direction (θ, φ) (radians) with its electric
/// field along θ̂ (`theta_polarized`) or φ̂ there, amplitude 1 V/m at the origin:
/// E(r) = p̂ e^{+jk r̂·r}. Returns V_m = ∫ f_m · E dS (7-point rule), V·m.
ComplexVector plane_wave_excitation(const SurfaceMesh& mesh, const RwgBasis& basis, Real frequency_hz, Real theta,
                                    Real phi, bool theta_polarized);

}  // namespace lobe
