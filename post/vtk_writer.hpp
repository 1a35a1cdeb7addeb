#pragma once
/// Meshes as VTK XML unstructured grids (.vtu), readable by ParaView.
#include <filesystem>

#include "geometry/surface_mesher.hpp"
#include "geometry/wire_mesh.hpp"

namespace lobe {

/// Triangles (cell type 5) with a "region" cell array naming the shape each came from.
void write_surface_vtu(const std::filesystem::path& path, const SurfaceMeshReport& surfaces);
/// Segments (cell type 3, lines) with "wire" (index) and "radius_m" cell arrays.
void write_wire_vtu(const std::filesystem::path& path, const WireMesh& mesh);

}  // namespace lobe
