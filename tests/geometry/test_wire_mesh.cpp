#include <gtest/gtest.h>

#include <cmath>

#include "core/constants.hpp"
#include "geometry/model_parser.hpp"
#include "geometry/wire_mesh.hpp"

namespace lobe {
namespace {

WireMesh mesh_of(const std::string& text) {
  const Model m = parse_model(text, "m");
  return mesh_wires(m);
}

std::size_t segments_of_wire(const WireMesh& mesh, int wire) {
  std::size_t n = 0;
  for (const auto& s : mesh.segments) n += s.wire == wire;
  return n;
}

TEST(WireMesh, AutomaticCountIsATwentiethOfAWavelength) {
  // λ = 1 m at 299.792458 MHz; a 1 m wire needs 20 segments.
  const WireMesh mesh = mesh_of("wire w from (0,0,0) to (1,0,0) radius 1 mm\nport p on w at middle\n"
                                "frequency 299.792458 MHz\n");
  EXPECT_EQ(mesh.segments.size(), 20u);
}

TEST(WireMesh, PortSplitsASegmentWhenNotOnANode) {
  const WireMesh mesh = mesh_of("wire w from (0,0,-1) to (0,0,1) radius 1 mm segments 21\nport p on w at middle\n"
                                "frequency 10 MHz\n");
  ASSERT_EQ(mesh.segments.size(), 22u);
  EXPECT_NEAR(mesh.nodes[mesh.port_gaps[0].node].position.z(), 0.0, 1e-15);
}

TEST(WireMesh, EndsWithinARadiusJoin) {
  const WireMesh mesh = mesh_of(
      "units mm\n"
      "wire a from (0,0,0) to (100,0,0) radius 1 segments 4\n"
      "wire b from (100,0,0.5) to (200,0,0) radius 1 segments 4\n"
      "wire c from (100,0,0) to (100,100,0) radius 2 segments 4\n"
      "port p on a at middle\nfrequency 100 MHz\n");
  EXPECT_EQ(mesh.junction_count, 1);
  int largest = 0;
  for (const auto& n : mesh.nodes) largest = std::max(largest, static_cast<int>(n.ends.size()));
  EXPECT_EQ(largest, 3);
}

TEST(WireMesh, WireEndingOnThePerfectGroundConnects) {
  const WireMesh mesh = mesh_of("ground perfect\nwire m from (0,0,0) to (0,0,0.5) radius 1 mm segments 5\n"
                                "port p on m at start\nfrequency 100 MHz\n");
  EXPECT_TRUE(mesh.nodes[mesh.port_gaps[0].node].on_ground);
}

TEST(WireMesh, HelixStartsOnPlusXAndWindsRightHanded) {
  const Model m = parse_model("helix h base (0,0,0) axis (0,0,1) diameter 0.2 pitch 0.1 turns 2 radius 1 mm segments 48\n"
                              "port p on h at middle\nfrequency 100 MHz\n", "m");
  const WireMesh mesh = mesh_wires(m);
  const Segment& first = mesh.segments.front();
  EXPECT_NEAR(first.start.x(), 0.1, 1e-15);
  EXPECT_NEAR(first.start.y(), 0.0, 1e-15);
  // Right-handed about +z: moving counter-clockwise seen from +z while rising.
  EXPECT_GT(first.end.y(), 0.0);
  EXPECT_GT(first.end.z(), 0.0);
  EXPECT_NEAR(mesh.segments.back().end.z(), 0.2, 1e-12);
}

TEST(WireMesh, FullArcClosesIntoALoop) {
  const WireMesh mesh = mesh_of("arc loop center (0,0,0) normal (0,0,1) from (0.1,0,0) angle 360 radius 1 mm segments 12\n"
                                "port p on loop at start\nfrequency 100 MHz\n");
  EXPECT_EQ(mesh.segments.size(), 12u);
  EXPECT_EQ(mesh.nodes.size(), 12u);  // the end joins the start
}

TEST(WireMesh, PolylineSharesSegmentsByLength) {
  const WireMesh mesh = mesh_of("wire w through (0,0,0) (3,0,0) (3,1,0) radius 1 mm segments 8\n"
                                "port p on w at 0.25\nfrequency 1 MHz\n");
  EXPECT_EQ(segments_of_wire(mesh, 0), 8u);  // 6 on the 3 m piece, 2 on the 1 m piece
  EXPECT_NEAR(mesh.segments[2].end.x(), 1.5, 1e-12);  // fraction 0.25 of 4 m lies on a node
}

TEST(WireMesh, WarnsOnShortSegmentsAndUnjoinedCrossings) {
  const WireMesh mesh = mesh_of("units mm\n"
                                "wire a from (-100,0,0) to (100,0,0) radius 2 segments 40\n"
                                "wire b from (0,-100,0) to (0,100,0) radius 1 segments 10\n"
                                "port p on a at middle\nfrequency 100 MHz\n");
  bool thin = false, crossing = false;
  for (const auto& w : mesh.warnings) {
    thin |= w.message.find("thin-wire") != std::string::npos;
    crossing |= w.message.find("cross without a junction") != std::string::npos;
  }
  EXPECT_TRUE(thin);
  EXPECT_TRUE(crossing);
}

TEST(WireMesh, OverlappingWiresAreAnError) {
  EXPECT_THROW(mesh_of("wire a from (0,0,0) to (1,0,0) radius 1 mm\nwire b from (0.5,0,0) to (1.5,0,0) radius 1 mm\n"
                       "port p on a at middle\nfrequency 100 MHz\n"),
               InputError);
}

// A model of plates and bodies alone has no segments; meshing its wires gives nothing.
TEST(WireMesh, NoWiresGiveAnEmptyMesh) {
  const WireMesh mesh = mesh_of("sphere s center (0,0,0) diameter 0.1\nwave theta 0 phi 0 polarization theta\n"
                                "frequency 1 GHz\n");
  EXPECT_TRUE(mesh.segments.empty());
  EXPECT_TRUE(mesh.nodes.empty());
}

TEST(WireMesh, PortOnAFreeEndIsAnError) {
  const WireMesh mesh = mesh_of("wire a from (0,0,0) to (1,0,0) radius 1 mm\nport p on a at start\nfrequency 100 MHz\n");
  EXPECT_THROW(require_current_at_gaps(mesh, {}), InputError);
  EXPECT_NO_THROW(require_current_at_gaps(mesh, std::vector<bool>(mesh.nodes.size(), true)));
}

}  // namespace
}  // namespace lobe
