#pragma once
/// Where on the frequency axis the method works for a given mesh, and where it does not.
#include <vector>

#include "geometry/mesh_warning.hpp"
#include "geometry/model.hpp"
#include "geometry/surface_mesh.hpp"
#include "geometry/wire_mesh.hpp"
#include "solver/medium.hpp"

namespace lobe {

/// The diagonal of the box around every segment end and surface vertex and their images in
/// the medium, m: the structure's largest extent D.
Real structure_extent_m(const WireMesh& wires, const SurfaceMesh& surfaces, const Medium& medium);

/// Checks the model's lowest and highest frequencies against the meshes. Throws InputError,
/// located at the frequency statement, where the method cannot work:
/// - below k·D = 1e-5 (D the structure's largest extent) the EFIE's scalar-potential term
///   outweighs the radiating vector-potential term by 1/(kD)², and in double precision the
///   radiation resistance is lost (a 0.5 m dipole: 1 % wrong at 100 Hz, negative at 10 Hz);
/// - a segment or triangle edge longer than half a wavelength, which its linear basis
///   cannot follow;
/// - a structure too large for the far-field integration (more than 240 radians of phase
///   across its bounding sphere, the highest-order rule kept).
/// Returns warnings where accuracy is already slipping (k·D below 1e-3).
std::vector<MeshWarning> check_frequency_limits(const Model& model, const Medium& medium, const WireMesh& wires,
                                                const SurfaceMesh& surfaces);

}  // namespace lobe
