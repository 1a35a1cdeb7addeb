#pragma once
/// A sphere meshed by subdividing an icosahedron: near-uniform triangles, outward order.
#include "geometry/surface_mesh.hpp"

namespace lobe::testing {

/// 20·4^levels triangles on a sphere of `radius` centred at the origin; edges ≈ 1.05 R / 2^levels.
SurfaceMesh icosphere(Real radius, int levels);

}  // namespace lobe::testing
