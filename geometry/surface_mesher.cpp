#include "geometry/surface_mesher.hpp"

#ifdef _OPENMP
#include <omp.h>
#endif

#include <algorithm>
#include <cmath>
#include <map>
#include <mutex>
#include <string>

#include "core/constants.hpp"
#include "core/formatted_text.hpp"
#include "geometry/gmsh_library.hpp"
#include "geometry/surface_contact.hpp"

namespace lobe {
namespace {

namespace gmsh = gmsh_library;
using gmsh::DimTags;

/// Gmsh keeps global state; this opens and always closes one session. Gmsh also sets the
/// OpenMP thread count for its own use, so the caller's count is restored afterwards.
class GmshSession {
 public:
  GmshSession() {
#ifdef _OPENMP
    m_threads = omp_get_max_threads();
#endif
    gmsh::initialize();
    gmsh::set_number_option("General.Terminal", 0);
    gmsh::add_model("lobe");
  }
  ~GmshSession() {
    try {
      gmsh::finalize();
    } catch (const std::exception&) {
      // Nothing is left to save; the mesh, or the error that ended it, is already out.
    }
#ifdef _OPENMP
    omp_set_num_threads(m_threads);
#endif
  }
  GmshSession(const GmshSession&) = delete;
  GmshSession& operator=(const GmshSession&) = delete;

 private:
  int m_threads = 1;
};

/// Refuses outlines whose edges cross or touch anywhere but at shared corners (a bow tie),
/// and repeated corners: the mesher would make something other than what was meant.
void require_simple_outline(const SurfaceShape& shape, const std::vector<Vec3>& corners, const Vec3& normal) {
  const std::size_t n = corners.size();
  const Vec3 u = (corners[1] - corners[0]).normalized(), w = normal.cross(u);
  std::vector<Eigen::Vector2d> p;
  Real extent = 0.0;
  for (const Vec3& c : corners) {
    p.emplace_back((c - corners[0]).dot(u), (c - corners[0]).dot(w));
    extent = std::max(extent, p.back().norm());
  }
  const Real tolerance = 1e-12 * extent;
  auto cross = [](const Eigen::Vector2d& a, const Eigen::Vector2d& b) { return a.x() * b.y() - a.y() * b.x(); };
  auto side = [&](const Eigen::Vector2d& a, const Eigen::Vector2d& b, const Eigen::Vector2d& c) {
    const Real s = cross(b - a, c - a);
    return std::abs(s) <= tolerance * extent ? 0 : (s > 0 ? 1 : -1);
  };
  auto on_segment = [&](const Eigen::Vector2d& a, const Eigen::Vector2d& b, const Eigen::Vector2d& c) {
    return side(a, b, c) == 0 && (c - a).dot(c - b) <= tolerance * extent;
  };
  for (std::size_t i = 0; i < n; ++i) {
    if ((p[(i + 1) % n] - p[i]).norm() <= tolerance)
      throw InputError(shape.where, "plate '" + shape.name + "' repeats a corner (corner " + std::to_string(i + 1) + ")");
    for (std::size_t j = i + 1; j < n; ++j) {
      const bool adjacent = j == i + 1 || (i == 0 && j == n - 1);
      const auto &a = p[i], &b = p[(i + 1) % n], &c = p[j], &d = p[(j + 1) % n];
      const bool crossing = side(a, b, c) * side(a, b, d) < 0 && side(c, d, a) * side(c, d, b) < 0;
      const bool touching = !adjacent && (on_segment(a, b, c) || on_segment(a, b, d) || on_segment(c, d, a) || on_segment(c, d, b));
      if (crossing || touching)
        throw InputError(shape.where, "the outline of '" + shape.name + "' crosses itself (edges " + std::to_string(i + 1) +
                                          " and " + std::to_string(j + 1) + ")");
    }
  }
}

int plane_from_points(const SurfaceShape& shape, const std::vector<Vec3>& corners) {
  if (corners.size() < 3) throw InputError(shape.where, "plate '" + shape.name + "' needs at least three corners");
  const Vec3 normal = (corners[1] - corners[0]).cross(corners[2] - corners[0]);
  Real extent = 0.0;
  for (const Vec3& c : corners) extent = std::max(extent, (c - corners[0]).norm());
  if (normal.norm() <= 1e-12 * extent * extent)
    throw InputError(shape.where, "plate '" + shape.name + "' has its first three corners on one line");
  for (const Vec3& c : corners)
    if (std::abs(normal.normalized().dot(c - corners[0])) > 1e-9 * extent)
      throw InputError(shape.where, "plate '" + shape.name + "' is not flat: its corners do not lie in one plane");
  require_simple_outline(shape, corners, normal.normalized());
  std::vector<int> points, lines;
  for (const Vec3& c : corners) points.push_back(gmsh::add_point(c));
  for (std::size_t i = 0; i < points.size(); ++i) lines.push_back(gmsh::add_line(points[i], points[(i + 1) % points.size()]));
  return gmsh::add_plane_surface({gmsh::add_curve_loop(lines)});
}

/// The unit normal of a flat outline (rectangle, disc or polygon).
Vec3 outline_normal(const SurfaceShape& s) {
  if (s.kind != SurfaceKind::polygon) return s.normal.normalized();
  return (s.polygon[1] - s.polygon[0]).cross(s.polygon[2] - s.polygon[0]).normalized();
}

DimTags add_outline(const SurfaceShape& s);

Real area_of(int tag) { return gmsh::mass(2, tag); }

/// Cuts the plate's holes out of `plate` one by one; refuses a cut off the plate's plane,
/// one that misses what is left of the plate and one that leaves nothing.
DimTags cut_holes(const SurfaceShape& s, int plate) {
  const Real original = area_of(plate);
  const Vec3 centre = gmsh::centre_of_mass(2, plate), normal = outline_normal(s);
  DimTags remaining{{2, plate}};
  Real area = original;
  for (const SurfaceShape& hole : s.cuts) {
    const int tool = add_outline(hole).front().second;
    if (std::abs(normal.dot(gmsh::centre_of_mass(2, tool) - centre)) > 1e-9 * std::sqrt(original) ||
        outline_normal(hole).cross(normal).norm() > 1e-9)
      throw InputError(hole.where, "this cut does not lie in the plane of plate '" + s.name + "'");
    const DimTags out = gmsh::cut(remaining, {{2, tool}}).out;
    Real after = 0.0;
    for (const auto& [dim, tag] : out) after += area_of(tag);
    if (after < 1e-9 * original) throw InputError(hole.where, "this cut removes all that is left of plate '" + s.name + "'");
    if (after > area * (1 - 1e-12)) throw InputError(hole.where, "this cut misses plate '" + s.name + "'");
    remaining = out;
    area = after;
  }
  return remaining;
}

/// Adds one shape to the OpenCASCADE model, holes cut; returns its (dimension, tag) entities.
DimTags add_shape(const SurfaceShape& s) {
  DimTags entities = add_outline(s);
  if (s.cuts.empty()) return entities;
  return cut_holes(s, entities.front().second);
}

/// The shape's outline or body as built, without holes.
DimTags add_outline(const SurfaceShape& s) {
  switch (s.kind) {
    case SurfaceKind::rectangle: {
      if (!(s.width > 0.0 && s.length > 0.0))
        throw InputError(s.where, "plate '" + s.name + "' needs a width and length above zero");
      const Vec3 n = s.normal.normalized(), u = in_plane_direction(n), w = n.cross(u);
      return {{2, plane_from_points(s, {s.corner, s.corner + s.width * u, s.corner + s.width * u + s.length * w,
                                        s.corner + s.length * w})}};
    }
    case SurfaceKind::polygon:
      return {{2, plane_from_points(s, s.polygon)}};
    case SurfaceKind::disc: {
      if (!(s.diameter > 0.0)) throw InputError(s.where, "disc '" + s.name + "' needs a diameter above zero");
      const int disc = gmsh::add_disk(Vec3::Zero(), s.diameter / 2, s.diameter / 2);
      const Vec3 n = s.normal.normalized(), axis = Vec3::UnitZ().cross(n);
      const Real angle = std::atan2(axis.norm(), Vec3::UnitZ().dot(n));
      if (axis.norm() > 1e-12) gmsh::rotate({{2, disc}}, Vec3::Zero(), axis, angle);
      else if (angle > 0.5 * pi) gmsh::rotate({{2, disc}}, Vec3::Zero(), Vec3::UnitX(), pi);
      gmsh::translate({{2, disc}}, s.corner);
      return {{2, disc}};
    }
    case SurfaceKind::sphere:
      if (!(s.diameter > 0.0)) throw InputError(s.where, "sphere '" + s.name + "' needs a diameter above zero");
      return {{3, gmsh::add_sphere(s.corner, s.diameter / 2)}};
    case SurfaceKind::box:
      if (!(s.size.minCoeff() > 0.0)) throw InputError(s.where, "box '" + s.name + "' needs sizes above zero");
      return {{3, gmsh::add_box(s.corner, s.size)}};
  }
  return {};
}

Real smallest_angle_of(const SurfaceMesh& mesh, int t) {
  Real smallest = pi;
  for (int k = 0; k < 3; ++k) {
    const Vec3 a = mesh.corner(t, (k + 1) % 3) - mesh.corner(t, k), b = mesh.corner(t, (k + 2) % 3) - mesh.corner(t, k);
    smallest = std::min(smallest, std::acos(std::clamp(a.normalized().dot(b.normalized()), -1.0, 1.0)));
  }
  return smallest;
}

/// Vertex indices of the nodes Gmsh placed on one model entity.
std::vector<int> entity_vertices(int dim, int tag, const std::map<std::size_t, int>& index_of) {
  std::vector<int> vertices;
  for (std::size_t t : gmsh::nodes(dim, tag, true).tags) vertices.push_back(index_of.at(t));
  return vertices;
}

SurfaceMeshReport mesh_in_session(const std::vector<SurfaceShape>& shapes, const MeshConstraints& constraints) {
  SurfaceMeshReport report;
  std::vector<DimTags> entities;
  DimTags all;
  for (const auto& s : shapes) {
    if (!(s.mesh_size > 0.0)) throw InputError(s.where, "'" + s.name + "' needs a mesh size above zero");
    entities.push_back(add_shape(s));
    if (!s.transform.matrix().isIdentity()) {
      // Copies, shifts, turns and mirrors, as a 3×4 matrix by rows.
      std::vector<double> rows;
      for (int r = 0; r < 3; ++r)
        for (int c = 0; c < 4; ++c) rows.push_back(s.transform.matrix()(r, c));
      gmsh::affine_transform(entities.back(), rows);
    }
    all.insert(all.end(), entities.back().begin(), entities.back().end());
  }
  for (const Vec3& p : constraints.points) {
    entities.push_back({{0, gmsh::add_point(p)}});
    all.push_back(entities.back().front());
  }
  for (const MeshLine& line : constraints.lines) {
    entities.push_back({{1, gmsh::add_line(gmsh::add_point(line.from), gmsh::add_point(line.to))}});
    all.push_back(entities.back().front());
  }
  // Fragment everything against everything so that touching shapes share mesh edges and
  // constraints become part of the surfaces they lie on; the map tells which new entities
  // came from which input.
  std::vector<DimTags> pieces_of = entities;
  if (all.size() > 1) {
    const std::vector<DimTags> map = gmsh::fragment(all, {}).map;
    std::size_t index = 0;
    for (std::size_t s = 0; s < entities.size(); ++s) {
      pieces_of[s].clear();
      for (std::size_t e = 0; e < entities[s].size(); ++e, ++index)
        pieces_of[s].insert(pieces_of[s].end(), map[index].begin(), map[index].end());
    }
  }
  gmsh::synchronize();
  // Mesh size per shape, set on every point of the shape's boundary.
  Real largest = 0.0;
  for (std::size_t s = 0; s < shapes.size(); ++s) {
    gmsh::set_mesh_size(gmsh::boundary(pieces_of[s], false, false, true), shapes[s].mesh_size);
    largest = std::max(largest, shapes[s].mesh_size);
  }
  // Finer around constraints, where a feed concentrates the current.
  Real smallest = shapes.front().mesh_size;
  for (const auto& s : shapes) smallest = std::min(smallest, s.mesh_size);
  for (std::size_t c = shapes.size(); c < entities.size(); ++c) {
    DimTags points = gmsh::boundary(pieces_of[c], false, false, true);
    for (const auto& piece : pieces_of[c])
      if (piece.first == 0) points.push_back(piece);
    gmsh::set_mesh_size(points, 0.5 * smallest);
  }
  gmsh::set_number_option("Mesh.MeshSizeMax", largest);
  gmsh::generate_mesh(2);

  const gmsh::Nodes all_nodes = gmsh::nodes();
  const std::vector<std::size_t>& node_tags = all_nodes.tags;
  const std::vector<double>& coordinates = all_nodes.coordinates;
  std::map<std::size_t, int> index_of;
  for (std::size_t i = 0; i < node_tags.size(); ++i) {
    index_of[node_tags[i]] = static_cast<int>(i);
    report.mesh.vertices.emplace_back(coordinates[3 * i], coordinates[3 * i + 1], coordinates[3 * i + 2]);
  }
  // Triangles of each shape's surfaces (a body's surfaces are its boundary).
  std::map<int, int> shape_of_surface;
  for (std::size_t s = 0; s < shapes.size(); ++s) {
    DimTags surfaces;
    for (const auto& [dim, tag] : pieces_of[s]) {
      if (dim == 2) surfaces.emplace_back(dim, tag);
      if (dim == 3) {
        const DimTags boundary = gmsh::boundary({{dim, tag}}, false, false, false);
        surfaces.insert(surfaces.end(), boundary.begin(), boundary.end());
      }
    }
    for (const auto& [dim, tag] : surfaces) shape_of_surface.emplace(std::abs(tag), static_cast<int>(s));
  }
  constexpr int three_node_triangle = 2;
  for (const auto& [surface, shape] : shape_of_surface) {
    const auto [element_tags, element_nodes] = gmsh::elements_of_type(three_node_triangle, surface);
    for (std::size_t e = 0; e < element_tags.size(); ++e) {
      report.mesh.triangles.push_back(
          {index_of.at(element_nodes[3 * e]), index_of.at(element_nodes[3 * e + 1]), index_of.at(element_nodes[3 * e + 2])});
      report.region.push_back(shape);
    }
  }
  report.smallest_angle = pi;
  for (std::size_t t = 0; t < report.mesh.triangles.size(); ++t)
    report.smallest_angle = std::min(report.smallest_angle, smallest_angle_of(report.mesh, static_cast<int>(t)));

  // Constraints: a point's vertex counts only when a triangle uses it (it lay on a surface).
  std::vector<bool> used(report.mesh.vertices.size(), false);
  for (const auto& t : report.mesh.triangles)
    for (int v : t) used[v] = true;
  const std::size_t first_point = shapes.size(), first_line = first_point + constraints.points.size();
  for (std::size_t c = first_point; c < first_line; ++c) {
    int vertex = -1;
    for (const auto& [dim, tag] : pieces_of[c])
      for (int v : entity_vertices(dim, tag, index_of))
        if (used[v]) vertex = v;
    report.point_vertex.push_back(vertex);
  }
  constexpr int two_node_line = 1;
  for (std::size_t c = first_line; c < entities.size(); ++c) {
    std::vector<std::array<int, 2>> edges;
    for (const auto& [dim, tag] : pieces_of[c]) {
      if (dim != 1) continue;
      const auto [element_tags, element_nodes] = gmsh::elements_of_type(two_node_line, tag);
      for (std::size_t e = 0; e < element_tags.size(); ++e) {
        const int a = index_of.at(element_nodes[2 * e]), b = index_of.at(element_nodes[2 * e + 1]);
        if (used[a] && used[b]) edges.push_back({a, b});
      }
    }
    report.line_edges.push_back(std::move(edges));
  }
  return report;
}

}  // namespace

SurfaceMeshReport mesh_surfaces(const std::vector<SurfaceShape>& shapes, const MeshConstraints& constraints) {
  if (shapes.empty()) {
    SurfaceMeshReport nothing;
    nothing.point_vertex.assign(constraints.points.size(), -1);
    nothing.line_edges.resize(constraints.lines.size());
    return nothing;
  }
  // Gmsh's state is global: cases of a sweep that run side by side mesh one at a time.
  static std::mutex one_session_at_a_time;
  const std::lock_guard<std::mutex> lock(one_session_at_a_time);
  GmshSession session;
  // Gmsh reports its own failures with exceptions of its choosing; turn them into ours.
  try {
    return mesh_in_session(shapes, constraints);
  } catch (const InputError&) {
    throw;
  } catch (const std::exception& e) {
    throw std::runtime_error(std::string("surface meshing failed: ") + e.what());
  } catch (...) {
    throw std::runtime_error("surface meshing failed inside Gmsh");
  }
}

namespace {

std::vector<SurfaceShape> sized_shapes(const Model& model) {
  std::vector<SurfaceShape> shapes = model.surfaces;
  // On a substrate the current varies on the dielectric's shorter wavelength (the
  // effective permittivity lies between 1 and εr; εr is the safe side).
  const Real slowing = model.substrate ? std::sqrt(model.substrate->permittivity) : 1.0;
  const Real edge = speed_of_light / model.highest_frequency() / default_edges_per_wavelength / slowing;
  for (auto& s : shapes)
    if (s.mesh_size == 0.0) s.mesh_size = edge;
  return shapes;
}

Real outline_area(const SurfaceShape& s) {
  switch (s.kind) {
    case SurfaceKind::rectangle: return s.width * s.length;
    case SurfaceKind::disc: return 0.25 * pi * s.diameter * s.diameter;
    case SurfaceKind::sphere: return pi * s.diameter * s.diameter;
    case SurfaceKind::box: return 2 * (s.size.x() * s.size.y() + s.size.y() * s.size.z() + s.size.z() * s.size.x());
    case SurfaceKind::polygon: {
      Vec3 twice = Vec3::Zero();
      for (std::size_t i = 0; i < s.polygon.size(); ++i) twice += s.polygon[i].cross(s.polygon[(i + 1) % s.polygon.size()]);
      return 0.5 * twice.norm();
    }
  }
  return 0.0;
}

}  // namespace

SurfaceMeshReport mesh_model_surfaces(const Model& model, const MeshConstraints& constraints) {
  const std::vector<SurfaceShape> shapes = sized_shapes(model);
  SurfaceMeshReport report = mesh_surfaces(shapes, constraints);
  // Flat facets stand in for a curved surface: at the default tenth of a wavelength a
  // sphere's RCS came out 0.5 dB low at ka = 2, at a twentieth within 0.15 dB of the Mie
  // series (tests/reference/test_sphere_scattering.cpp).
  const Real wavelength = speed_of_light / model.highest_frequency();
  for (const SurfaceShape& s : shapes)
    if (s.kind == SurfaceKind::sphere && s.mesh_size > wavelength / coarse_curved_edges_per_wavelength)
      report.warnings.push_back(
          {s.where, formatted("sphere '%s' is meshed in triangles of about λ/%.3g at the highest frequency; a curved "
                              "body needs about λ/%.0f for its flat facets to follow it (RCS within about 0.15 dB): "
                              "add 'mesh %s size %.3g mm'",
                              s.name.c_str(), wavelength / s.mesh_size, curved_edges_per_wavelength, s.name.c_str(),
                              wavelength / curved_edges_per_wavelength * 1e3)});
  return report;
}

double estimated_surface_functions(const Model& model) {
  double functions = 0.0;
  for (const auto& s : sized_shapes(model))
    functions += 1.5 * outline_area(s) / (0.25 * std::sqrt(3.0) * s.mesh_size * s.mesh_size);
  return functions;
}

}  // namespace lobe
