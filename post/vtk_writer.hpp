#pragma once
/// Meshes (and currents on them) as VTK XML unstructured grids (.vtu), readable by ParaView.
#include <filesystem>
#include <string>
#include <vector>

#include "geometry/surface_mesher.hpp"
#include "geometry/wire_mesh.hpp"

namespace lobe {

/// One value per cell, segments first and then triangles, under `name`.
struct CellValues {
  std::string name;
  std::vector<Real> values;
};

/// Segments (VTK lines) and triangles in one grid, with cell arrays "kind" (0 segment,
/// 1 triangle), "object" (wire index for segments, plate or body index for triangles),
/// "radius_m" (0 on triangles), and any `extra` arrays.
void write_model_vtu(const std::filesystem::path& path, const WireMesh& wires, const SurfaceMeshReport& surfaces,
                     const std::vector<CellValues>& extra = {});

}  // namespace lobe
