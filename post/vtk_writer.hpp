#pragma once
/// Meshes (and currents on them) as VTK XML unstructured grids (.vtu), readable by ParaView.
#include <array>
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

/// The current magnitude on every cell at one frequency, named "current_<frequency>":
/// |I| in A on segments (mean of its two ends), |J| in A/m on triangles (at the centroid);
/// peak values.
CellValues current_cells(Real frequency_hz, const std::vector<std::array<Complex, 2>>& segment_currents,
                         const std::vector<Eigen::Vector3cd>& surface_currents);

/// Segments (VTK lines) and triangles in one grid, with cell arrays "kind" (0 segment,
/// 1 triangle), "object" (wire index for segments, plate or body index for triangles),
/// "radius_m" (0 on triangles), and any `extra` arrays.
void write_model_vtu(const std::filesystem::path& path, const WireMesh& wires, const SurfaceMeshReport& surfaces,
                     const std::vector<CellValues>& extra = {});

}  // namespace lobe
