#include "post/vtk_writer.hpp"

#include <fstream>
#include <sstream>
#include <stdexcept>
#include <vector>

namespace lobe {
namespace {

/// The parts every unstructured grid shares; `cell_data` is written inside <CellData>.
void write_grid(const std::filesystem::path& path, const std::vector<Vec3>& points,
                const std::vector<std::vector<int>>& cells, int cell_type, const std::string& cell_data) {
  std::ofstream out(path);
  if (!out) throw std::runtime_error("cannot write " + path.string());
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
  for (std::size_t c = 0; c < cells.size(); ++c) out << "          " << cell_type << '\n';
  out << "        </DataArray>\n      </Cells>\n      <CellData>\n"
      << cell_data << "      </CellData>\n    </Piece>\n  </UnstructuredGrid>\n</VTKFile>\n";
  out.close();
  if (!out) throw std::runtime_error("writing " + path.string() + " failed");
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

void write_surface_vtu(const std::filesystem::path& path, const SurfaceMeshReport& surfaces) {
  std::vector<std::vector<int>> cells;
  for (const auto& t : surfaces.mesh.triangles) cells.push_back({t[0], t[1], t[2]});
  constexpr int vtk_triangle = 5;
  write_grid(path, surfaces.mesh.vertices, cells, vtk_triangle, cell_array("Int32", "region", surfaces.region));
}

void write_wire_vtu(const std::filesystem::path& path, const WireMesh& mesh) {
  std::vector<Vec3> points;
  std::vector<std::vector<int>> cells;
  std::vector<int> wires;
  std::vector<Real> radii;
  for (const auto& node : mesh.nodes) points.push_back(node.position);
  for (const auto& s : mesh.segments) {
    cells.push_back({s.node[0], s.node[1]});
    wires.push_back(s.wire);
    radii.push_back(s.radius);
  }
  constexpr int vtk_line = 3;
  write_grid(path, points, cells, vtk_line, cell_array("Int32", "wire", wires) + cell_array("Float64", "radius_m", radii));
}

}  // namespace lobe
