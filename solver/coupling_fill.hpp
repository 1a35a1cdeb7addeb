#pragma once
/// Fills the terms that tie wires to surfaces: wire pieces against RWG functions, and the
/// surface halves of wire-to-surface junction functions against everything.
#include <vector>

#include "geometry/wire_mesh.hpp"
#include "solver/junction_star.hpp"
#include "solver/rwg_basis.hpp"
#include "solver/wire_basis.hpp"

namespace lobe {

/// Adds, with the same mixed-potential EFIE and Galerkin testing as the wire and surface
/// fills, Z_mn = jωμ0 ∫∫ f_m·f_n G − (j/(ωε0)) ∫∫ (∇·f_m)(∇·f_n) G for
///   – every wire piece m and RWG function n (segments × triangles), and
///   – every junction star's surface half n against every wire piece, RWG function and
///     star half m (each unordered pair once),
/// each also at (n, m), so Z stays exactly symmetric. The wire current flows on the wire's
/// axis (exact kernel, no reduced-kernel radius), which is accurate once the wire is a few
/// radii from the surface. With `ground_perfect`, every source's image in z = 0 is added.
/// OpenMP-parallel over observing elements; O(S·T) plus O(J·(S + T)) point potentials.
void add_coupling_impedance(const WireMesh& wires, const WireBasis& wire_basis, const SurfaceMesh& surface,
                            const RwgBasis& rwg, const std::vector<JunctionStar>& stars, bool ground_perfect,
                            Real frequency_hz, ComplexMatrix& z);

}  // namespace lobe
