#include <gtest/gtest.h>

#include <cmath>
#include <map>

#include "core/constants.hpp"
#include "geometry/model_parser.hpp"
#include "geometry/surface_mesher.hpp"

namespace lobe {
namespace {

/// How many triangles use each undirected edge.
std::map<std::pair<int, int>, int> edge_use(const SurfaceMesh& mesh) {
  std::map<std::pair<int, int>, int> use;
  for (const auto& t : mesh.triangles)
    for (int k = 0; k < 3; ++k) {
      const int a = t[k], b = t[(k + 1) % 3];
      ++use[{std::min(a, b), std::max(a, b)}];
    }
  return use;
}

Real total_area(const SurfaceMesh& mesh) {
  Real area = 0.0;
  for (std::size_t t = 0; t < mesh.triangles.size(); ++t) area += mesh.area(static_cast<int>(t));
  return area;
}

SurfaceShape rectangle(const std::string& name, Vec3 corner, Real w, Real l, Vec3 normal, Real size) {
  SurfaceShape s;
  s.name = name;
  s.kind = SurfaceKind::rectangle;
  s.corner = corner;
  s.width = w;
  s.length = l;
  s.normal = normal;
  s.mesh_size = size;
  return s;
}

/// Triangles no smaller in angle than this are free of slivers (a Delaunay-type mesher
/// stays well above it on these simple shapes).
constexpr Real sliver_angle = 20.0 * pi / 180.0;

TEST(SurfaceMesher, RectangleAreaIsExactAndEdgesFollowTheSize) {
  const SurfaceMeshReport r = mesh_surfaces({rectangle("p", {0, 0, 0}, 1.0, 0.5, {0, 0, 1}, 0.1)});
  EXPECT_NEAR(total_area(r.mesh), 0.5, 1e-12);
  EXPECT_GT(r.smallest_angle, sliver_angle);
  for (const auto& [edge, count] : edge_use(r.mesh)) {
    EXPECT_LE(count, 2);
    EXPECT_LT((r.mesh.vertices[edge.first] - r.mesh.vertices[edge.second]).norm(), 1.5 * 0.1);
  }
  for (const Vec3& v : r.mesh.vertices) EXPECT_NEAR(v.z(), 0.0, 1e-12);
}

TEST(SurfaceMesher, SphereIsClosedWithTheRightArea) {
  SurfaceShape s;
  s.name = "ball";
  s.kind = SurfaceKind::sphere;
  s.diameter = 0.2;
  s.mesh_size = 0.02;
  const SurfaceMeshReport r = mesh_surfaces({s});
  for (const auto& [edge, count] : edge_use(r.mesh)) EXPECT_EQ(count, 2);  // closed: every edge shared
  const Real exact = pi * 0.2 * 0.2;  // 4πa²; flat facets inscribed, so a little less
  EXPECT_LT(total_area(r.mesh), exact);
  EXPECT_GT(total_area(r.mesh), 0.98 * exact);
}

TEST(SurfaceMesher, BoxAndDisc) {
  SurfaceShape box;
  box.name = "box";
  box.kind = SurfaceKind::box;
  box.corner = {1, 1, 1};
  box.size = {0.3, 0.2, 0.1};
  box.mesh_size = 0.05;
  SurfaceMeshReport r = mesh_surfaces({box});
  EXPECT_NEAR(total_area(r.mesh), 2 * (0.06 + 0.02 + 0.03), 1e-12);
  for (const auto& [edge, count] : edge_use(r.mesh)) EXPECT_EQ(count, 2);

  SurfaceShape disc;
  disc.name = "disc";
  disc.kind = SurfaceKind::disc;
  disc.corner = {0, 0, 0.5};
  disc.normal = Vec3(1, 0, 0);
  disc.diameter = 0.4;
  disc.mesh_size = 0.03;
  r = mesh_surfaces({disc});
  EXPECT_LT(total_area(r.mesh), pi * 0.04);
  EXPECT_GT(total_area(r.mesh), 0.98 * pi * 0.04);
  for (const Vec3& v : r.mesh.vertices) EXPECT_NEAR(v.x(), 0.0, 1e-9);  // turned to face x
}

// Two plates meeting along a line are meshed conformally: every mesh edge on the common
// line is shared by one triangle of each plate.
TEST(SurfaceMesher, TouchingPlatesShareTheirEdge) {
  const SurfaceMeshReport r = mesh_surfaces({rectangle("floor", {0, 0, 0}, 0.4, 0.3, {0, 0, 1}, 0.05),
                                             rectangle("wall", {0, 0, 0}, 0.4, 0.2, {0, -1, 0}, 0.08)});
  int on_line = 0;
  for (const auto& [edge, count] : edge_use(r.mesh)) {
    const Vec3 &a = r.mesh.vertices[edge.first], &b = r.mesh.vertices[edge.second];
    if (std::abs(a.y()) < 1e-9 && std::abs(a.z()) < 1e-9 && std::abs(b.y()) < 1e-9 && std::abs(b.z()) < 1e-9) {
      ++on_line;
      EXPECT_EQ(count, 2);
    }
  }
  EXPECT_GT(on_line, 0);
  EXPECT_NEAR(total_area(r.mesh), 0.12 + 0.08, 1e-12);
}

// A wire end on a plate becomes a mesh vertex; one off the plate does not.
TEST(SurfaceMesher, PointsOnAPlateBecomeVertices) {
  MeshConstraints constraints;
  constraints.points = {{0.123, 0.071, 0.0}, {0.2, 0.1, 0.05}};
  const SurfaceMeshReport r = mesh_surfaces({rectangle("p", {0, 0, 0}, 0.4, 0.3, {0, 0, 1}, 0.05)}, constraints);
  ASSERT_EQ(r.point_vertex.size(), 2u);
  ASSERT_GE(r.point_vertex[0], 0);
  EXPECT_LT((r.mesh.vertices[r.point_vertex[0]] - constraints.points[0]).norm(), 1e-12);
  EXPECT_EQ(r.point_vertex[1], -1);
  EXPECT_NEAR(total_area(r.mesh), 0.12, 1e-12);
}

// A port line across a strip is laid along mesh edges that cover it end to end, each an
// interior edge of the plate.
TEST(SurfaceMesher, LinesAcrossAPlateFollowMeshEdges) {
  MeshConstraints constraints;
  constraints.lines = {{{0.2, 0.0, 0.0}, {0.2, 0.03, 0.0}}};
  const SurfaceMeshReport r = mesh_surfaces({rectangle("strip", {0, 0, 0}, 0.4, 0.03, {0, 0, 1}, 0.01)}, constraints);
  ASSERT_EQ(r.line_edges.size(), 1u);
  ASSERT_FALSE(r.line_edges[0].empty());
  Real covered = 0.0;
  const auto use = edge_use(r.mesh);
  for (const auto& [a, b] : r.line_edges[0]) {
    EXPECT_NEAR(r.mesh.vertices[a].x(), 0.2, 1e-12);
    EXPECT_NEAR(r.mesh.vertices[b].x(), 0.2, 1e-12);
    covered += (r.mesh.vertices[a] - r.mesh.vertices[b]).norm();
    EXPECT_EQ(use.at({std::min(a, b), std::max(a, b)}), 2);
  }
  EXPECT_NEAR(covered, 0.03, 1e-12);
}

// A hole and a corner notch leave exactly the area OpenCASCADE's cut says.
TEST(SurfaceMesher, CutsRemoveTheirArea) {
  SurfaceShape plate = rectangle("deck", {0, 0, 0}, 0.1, 0.06, {0, 0, 1}, 0.01);
  SurfaceShape notch;
  notch.kind = SurfaceKind::polygon;
  notch.polygon = {{0, 0, 0}, {0.02, 0, 0}, {0, 0.02, 0}};
  SurfaceShape slot = rectangle("slot", {0.05, 0.02, 0}, 0.03, 0.004, {0, 0, 1}, 0.0);
  plate.cuts = {notch, slot};
  const SurfaceMeshReport r = mesh_surfaces({plate});
  EXPECT_NEAR(total_area(r.mesh), 0.006 - 0.0002 - 0.00012, 1e-12);
}

// A sphere at the default tenth of a wavelength is too coarse for its curvature (its RCS
// came out 0.5 dB low at ka = 2); at a twentieth it is not.
TEST(SurfaceMesher, CoarselyFacetedSphereEarnsAWarning) {
  const std::string sphere = "units mm\nsphere ball center (0,0,0) diameter 100\n";
  const std::string rest = "wave theta 0 phi 0 polarization theta\nfrequency 1 GHz\n";
  const SurfaceMeshReport coarse = mesh_model_surfaces(parse_model(sphere + rest, "m"));
  ASSERT_EQ(coarse.warnings.size(), 1u);
  EXPECT_NE(coarse.warnings.front().message.find("mesh ball size 15 mm"), std::string::npos)
      << coarse.warnings.front().message;
  EXPECT_TRUE(mesh_model_surfaces(parse_model(sphere + "mesh ball size 15\n" + rest, "m")).warnings.empty());
}

TEST(SurfaceMesher, NonPlanarPolygonIsAnInputError) {
  SurfaceShape s;
  s.name = "bent";
  s.kind = SurfaceKind::polygon;
  s.polygon = {{0, 0, 0}, {1, 0, 0}, {1, 1, 0.1}, {0, 1, 0}};
  s.mesh_size = 0.1;
  EXPECT_THROW(mesh_surfaces({s}), InputError);
}

}  // namespace
}  // namespace lobe
