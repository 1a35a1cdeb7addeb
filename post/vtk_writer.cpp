#include "post/vtk_writer.hpp"

#include <algorithm>
#include <bit>
#include <cstdint>
#include <cerrno>
#include <cstdio>
#include <fstream>
#include <stdexcept>
#include <vector>

#include "core/output_error.hpp"

namespace lobe {
namespace {

/// Arrays stored after the XML as raw little-endian bytes (VTK's "appended" format, as
/// ParaView itself writes): each a 64-bit byte count and the values, at the offset its
/// <DataArray> names. Full precision, and no text to parse.
class AppendedData {
 public:
  template <class T>
  std::string array(const char* type, const std::string& name, const std::vector<T>& values, int components = 1) {
    static_assert(std::endian::native == std::endian::little, "VTK files are written little-endian");
    std::string element = "        <DataArray type=\"";
    element.append(type).append("\"");
    if (!name.empty()) element.append(" Name=\"").append(name).append("\"");
    element.append(" NumberOfComponents=\"").append(std::to_string(components)).append("\" format=\"appended\" offset=\"");
    element.append(std::to_string(m_bytes.size())).append("\"/>\n");
    const std::uint64_t size = values.size() * sizeof(T);
    m_bytes.append(reinterpret_cast<const char*>(&size), sizeof size);
    m_bytes.append(reinterpret_cast<const char*>(values.data()), size);
    return element;
  }
  const std::string& bytes() const { return m_bytes; }

 private:
  std::string m_bytes;
};

/// The parts every unstructured grid shares; `cell_data` and `point_data` are <DataArray>
/// elements of `data`.
void write_grid(const std::filesystem::path& path, const std::vector<Vec3>& points, const std::vector<std::vector<int>>& cells,
                AppendedData& data, const std::string& cell_data, const std::string& point_data = "") {
  std::vector<double> coordinates;
  for (const Vec3& p : points) coordinates.insert(coordinates.end(), {p.x(), p.y(), p.z()});
  std::vector<std::int64_t> connectivity, offsets;
  std::vector<std::uint8_t> types;
  constexpr std::uint8_t vtk_line = 3, vtk_triangle = 5, vtk_quad = 9;
  for (const auto& cell : cells) {
    connectivity.insert(connectivity.end(), cell.begin(), cell.end());
    offsets.push_back(static_cast<std::int64_t>(connectivity.size()));
    types.push_back(cell.size() == 2 ? vtk_line : cell.size() == 3 ? vtk_triangle : vtk_quad);
  }
  std::string xml = "<?xml version=\"1.0\"?>\n"
                    "<VTKFile type=\"UnstructuredGrid\" version=\"1.0\" byte_order=\"LittleEndian\" header_type=\"UInt64\">\n"
                    "  <UnstructuredGrid>\n    <Piece NumberOfPoints=\"" +
                    std::to_string(points.size()) + "\" NumberOfCells=\"" + std::to_string(cells.size()) + "\">\n      <Points>\n";
  xml += data.array("Float64", "", coordinates, 3) + "      </Points>\n      <Cells>\n";
  xml += data.array("Int64", "connectivity", connectivity) + data.array("Int64", "offsets", offsets) +
         data.array("UInt8", "types", types) + "      </Cells>\n";
  xml += "      <CellData>\n" + cell_data + "      </CellData>\n";
  if (!point_data.empty()) xml += "      <PointData>\n" + point_data + "      </PointData>\n";
  xml += "    </Piece>\n  </UnstructuredGrid>\n  <AppendedData encoding=\"raw\">\n   _";
  errno = 0;
  std::ofstream out(path, std::ios::binary);
  if (!out) throw output_error(path.string());
  out << xml << data.bytes() << "\n  </AppendedData>\n</VTKFile>\n";
  out.close();
  if (!out) throw output_error(path.string());
}

}  // namespace

void write_model_vtu(const std::filesystem::path& path, const WireMesh& wires, const SurfaceMeshReport& surfaces,
                     const std::vector<CellValues>& extra) {
  std::vector<Vec3> points;
  std::vector<std::vector<int>> cells;
  std::vector<int> kinds, objects;
  std::vector<Real> radii;
  for (const auto& node : wires.nodes) points.push_back(node.position);
  for (const auto& s : wires.segments) {
    cells.push_back({s.node[0], s.node[1]});
    kinds.push_back(0);
    objects.push_back(s.wire);
    radii.push_back(s.radius);
  }
  const int offset = static_cast<int>(points.size());
  points.insert(points.end(), surfaces.mesh.vertices.begin(), surfaces.mesh.vertices.end());
  for (std::size_t t = 0; t < surfaces.mesh.triangles.size(); ++t) {
    const auto& v = surfaces.mesh.triangles[t];
    cells.push_back({offset + v[0], offset + v[1], offset + v[2]});
    kinds.push_back(1);
    objects.push_back(surfaces.region[t]);
    radii.push_back(0.0);
  }
  AppendedData data;
  std::string cell_data = data.array("Int32", "kind", kinds) + data.array("Int32", "object", objects) +
                          data.array("Float64", "radius_m", radii);
  for (const auto& e : extra) {
    if (e.values.size() != cells.size() * e.components) throw std::logic_error("cell array '" + e.name + "' of the wrong size");
    cell_data += data.array("Float64", e.name, e.values, e.components);
  }
  write_grid(path, points, cells, data, cell_data);
}

CellValues current_cells(Real frequency_hz, const std::vector<std::array<Complex, 2>>& segment_currents,
                         const std::vector<Eigen::Vector3cd>& surface_currents) {
  char name[64];
  std::snprintf(name, sizeof name, "current_%.6g_MHz", frequency_hz / 1e6);
  CellValues cells{name, {}};
  for (const auto& c : segment_currents) cells.values.push_back(0.5 * (std::abs(c[0]) + std::abs(c[1])));
  for (const auto& j : surface_currents) cells.values.push_back(j.norm());
  return cells;
}

std::vector<CellValues> current_vector_cells(const WireMesh& wires, const std::vector<std::array<Complex, 2>>& segment_currents,
                                             const std::vector<Eigen::Vector3cd>& surface_currents) {
  CellValues line{"line_current_a", {}}, surface{"surface_current_a_per_m", {}};
  CellValues re{"current_re", {}, 3}, im{"current_im", {}, 3};
  for (std::size_t k = 0; k < segment_currents.size(); ++k) {
    const auto& s = wires.segments[k];
    const Vec3 along = (wires.nodes[s.node[1]].position - wires.nodes[s.node[0]].position).normalized();
    const Complex mean = 0.5 * (segment_currents[k][0] + segment_currents[k][1]);
    line.values.push_back(0.5 * (std::abs(segment_currents[k][0]) + std::abs(segment_currents[k][1])));
    surface.values.push_back(0.0);
    for (int c = 0; c < 3; ++c) re.values.push_back(mean.real() * along[c]), im.values.push_back(mean.imag() * along[c]);
  }
  for (const auto& j : surface_currents) {
    line.values.push_back(0.0);
    surface.values.push_back(j.norm());
    for (int c = 0; c < 3; ++c) re.values.push_back(j[c].real()), im.values.push_back(j[c].imag());
  }
  return {line, surface, re, im};
}

void write_pattern_vtu(const std::filesystem::path& path, const PatternResult& sphere, const Vec3& centre, Real radius) {
  const auto nt = static_cast<Eigen::Index>(sphere.thetas.size()), np = static_cast<Eigen::Index>(sphere.phis.size());
  const Real peak = nt * np > 0 ? sphere.gain_dbi.maxCoeff() : 0.0;
  constexpr Real span_db = 40.0, smallest = 0.02;
  std::vector<Vec3> points;
  std::vector<Real> gain, realized, rhcp, lhcp, axial;
  for (Eigen::Index i = 0; i < nt; ++i)
    for (Eigen::Index j = 0; j < np; ++j) {
      const Real t = sphere.thetas[i], p = sphere.phis[j];
      const Real scale = std::clamp((sphere.gain_dbi(i, j) - (peak - span_db)) / span_db, smallest, 1.0);
      points.push_back(centre + radius * scale * Vec3(std::sin(t) * std::cos(p), std::sin(t) * std::sin(p), std::cos(t)));
      gain.push_back(sphere.gain_dbi(i, j)), realized.push_back(sphere.realized_gain_dbi(i, j));
      rhcp.push_back(sphere.rhcp_dbi(i, j)), lhcp.push_back(sphere.lhcp_dbi(i, j)), axial.push_back(sphere.axial_ratio_db(i, j));
    }
  // Quadrilaterals between neighbouring rows and columns, closed around φ.
  std::vector<std::vector<int>> cells;
  for (Eigen::Index i = 0; i + 1 < nt; ++i)
    for (Eigen::Index j = 0; j < np; ++j) {
      const auto at = [&](Eigen::Index r, Eigen::Index c) { return static_cast<int>(r * np + (c % np)); };
      cells.push_back({at(i, j), at(i + 1, j), at(i + 1, j + 1), at(i, j + 1)});
    }
  AppendedData data;
  const std::string point_data = data.array("Float64", "gain_dbi", gain) + data.array("Float64", "realized_gain_dbi", realized) +
                                 data.array("Float64", "rhcp_dbi", rhcp) + data.array("Float64", "lhcp_dbi", lhcp) +
                                 data.array("Float64", "axial_ratio_db", axial);
  write_grid(path, points, cells, data, "", point_data);
}

void write_pvd(const std::filesystem::path& path, const std::vector<std::pair<Real, std::string>>& frequency_files) {
  errno = 0;
  std::ofstream out(path);
  if (!out) throw output_error(path.string());
  out.precision(9);  // MHz to the hertz
  out << "<?xml version=\"1.0\"?>\n<VTKFile type=\"Collection\" version=\"0.1\" byte_order=\"LittleEndian\">\n  <Collection>\n";
  for (const auto& [hz, file] : frequency_files)
    out << "    <DataSet timestep=\"" << hz / 1e6 << "\" group=\"\" part=\"0\" file=\"" << file << "\"/>\n";
  out << "  </Collection>\n</VTKFile>\n";
  out.close();
  if (!out) throw output_error(path.string());
}

}  // namespace lobe
