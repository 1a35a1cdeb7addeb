#pragma once
/// Meshes (and currents on them) as VTK XML unstructured grids (.vtu), readable by ParaView:
/// the structure as XML, the arrays appended after it as raw binary (full precision).
#include <array>
#include <filesystem>
#include <string>
#include <vector>

#include "geometry/surface_mesher.hpp"
#include "geometry/wire_mesh.hpp"
#include "post/frequency_result.hpp"

namespace lobe {

/// One value (or `components` values) per cell, segments first and then triangles, under `name`.
struct CellValues {
  std::string name;
  std::vector<Real> values;
  int components = 1;
};

/// The current magnitude on every cell at one frequency, named "current_<frequency>":
/// |I| in A on segments (mean of its two ends), |J| in A/m on triangles (at the centroid);
/// peak values.
CellValues current_cells(Real frequency_hz, const std::vector<std::array<Complex, 2>>& segment_currents,
                         const std::vector<Eigen::Vector3cd>& surface_currents);

/// The currents at one frequency, per cell: "line_current_a" (|I| on segments, the mean of
/// its ends; 0 on triangles), "surface_current_a_per_m" (|J| at each triangle's centroid; 0
/// on segments), and the current as vectors, "current_re" and "current_im" (I t̂ in A on
/// segments, J in A/m on triangles: the phasor's real and imaginary parts, the current at
/// phases 0° and −90°). Peak values.
std::vector<CellValues> current_vector_cells(const WireMesh& wires, const std::vector<std::array<Complex, 2>>& segment_currents,
                                             const std::vector<Eigen::Vector3cd>& surface_currents);

/// The far-field pattern over the whole sphere (a PatternResult over θ from 0 to 180° and
/// φ around the circle) as a closed surface of quadrilaterals around `centre`: each point
/// at a distance from `centre` growing with the gain, from 2 % of `radius` at 40 dB below
/// the peak to `radius` at the peak; point arrays gain_dbi, realized_gain_dbi, rhcp_dbi,
/// lhcp_dbi and axial_ratio_db.
void write_pattern_vtu(const std::filesystem::path& path, const PatternResult& sphere, const Vec3& centre, Real radius);

/// A ParaView collection (.pvd) of one file per frequency, the frequency in MHz as its time.
void write_pvd(const std::filesystem::path& path, const std::vector<std::pair<Real, std::string>>& frequency_files);

/// Segments (VTK lines) and triangles in one grid, with cell arrays "kind" (0 segment,
/// 1 triangle), "object" (wire index for segments, plate or body index for triangles),
/// "radius_m" (0 on triangles), and any `extra` arrays.
void write_model_vtu(const std::filesystem::path& path, const WireMesh& wires, const SurfaceMeshReport& surfaces,
                     const std::vector<CellValues>& extra = {});

}  // namespace lobe
