#include "post/vtk_writer.hpp"

#include <cstdio>
#include <fstream>
#include <sstream>
#include <stdexcept>
#include <vector>

#include "core/output_error.hpp"

namespace lobe {
namespace {

/// The parts every unstructured grid shares; `cell_data` is written inside <CellData>.
void write_grid(const std::filesystem::path& path, const std::vector<Vec3>& points,
                const std::vector<std::vector<int>>& cells, const std::string& cell_data) {
  errno = 0;
  std::ofstream out(path);
  if (!out) throw output_error(path.string());
  out.precision(12);
  out << "<?xml version=\"1.0\"?>\n"
      << "<VTKFile type=\"UnstructuredGrid\" version=\"0.1\" byte_order=\"LittleEndian\">\n"
      << "  <UnstructuredGrid>\n"
      << "    <Piece NumberOfPoints=\"" << points.size() << "\" NumberOfCells=\"" << cells.size() << "\">\n"
      << "      <Points>\n        <DataArray type=\"Float64\" NumberOfComponents=\"3\" format=\"ascii\">\n";
  for (const Vec3& p : points) out << "          " << p.x() << ' ' << p.y() << ' ' << p.z() << '\n';
  out << "        </DataArray>\n      </Points>\n      <Cells>\n"
      << "        <DataArray type=\"Int64\" Name=\"connectivity\" format=\"ascii\">\n";
  for (const auto& cell : cells) {
    out << "         ";
    for (int v : cell) out << ' ' << v;
    out << '\n';
  }
  out << "        </DataArray>\n        <DataArray type=\"Int64\" Name=\"offsets\" format=\"ascii\">\n";
  std::size_t offset = 0;
  for (const auto& cell : cells) out << "          " << (offset += cell.size()) << '\n';
  out << "        </DataArray>\n        <DataArray type=\"UInt8\" Name=\"types\" format=\"ascii\">\n";
  constexpr int vtk_line = 3, vtk_triangle = 5;
  for (const auto& cell : cells) out << "          " << (cell.size() == 2 ? vtk_line : vtk_triangle) << '\n';
  out << "        </DataArray>\n      </Cells>\n      <CellData>\n"
      << cell_data << "      </CellData>\n    </Piece>\n  </UnstructuredGrid>\n</VTKFile>\n";
  out.close();
  if (!out) throw output_error(path.string());
}

template <class Values>
std::string cell_array(const char* type, const char* name, const Values& values) {
  std::ostringstream text;
  text.precision(12);
  text << "        <DataArray type=\"" << type << "\" Name=\"" << name << "\" format=\"ascii\">\n";
  for (const auto& v : values) text << "          " << v << '\n';
  text << "        </DataArray>\n";
  return text.str();
}

}  // namespace

CellValues current_cells(Real frequency_hz, const std::vector<std::array<Complex, 2>>& segment_currents,
                         const std::vector<Eigen::Vector3cd>& surface_currents) {
  char name[64];
  std::snprintf(name, sizeof name, "current_%.6g_MHz", frequency_hz / 1e6);
  CellValues cells{name, {}};
  for (const auto& c : segment_currents) cells.values.push_back(0.5 * (std::abs(c[0]) + std::abs(c[1])));
  for (const auto& j : surface_currents) cells.values.push_back(j.norm());
  return cells;
}

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
  std::string data = cell_array("Int32", "kind", kinds) + cell_array("Int32", "object", objects) +
                     cell_array("Float64", "radius_m", radii);
  for (const auto& e : extra) {
    if (e.values.size() != cells.size()) throw std::logic_error("cell array '" + e.name + "' of the wrong size");
    data += cell_array("Float64", e.name.c_str(), e.values);
  }
  write_grid(path, points, cells, data);
}

}  // namespace lobe
