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

// An odd count with a centre port: the node goes to the centre and the segments stay equal
// (one more segment) instead of the middle one being split into two short ones.
TEST(WireMesh, PortAtTheMiddleOfAnOddCountGetsANodeAndEqualSegments) {
  const WireMesh mesh = mesh_of("wire w from (0,0,-1) to (0,0,1) radius 1 mm segments 21\nport p on w at middle\n"
                                "frequency 10 MHz\n");
  ASSERT_EQ(mesh.segments.size(), 22u);
  EXPECT_NEAR(mesh.nodes[mesh.port_gaps[0].node].position.z(), 0.0, 1e-15);
  for (const Segment& s : mesh.segments) EXPECT_NEAR(s.length(), 2.0 / 22, 1e-12);
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
                                "wire b from (0,-100,0) to (0,100,0) radius 1 segments 11\n"
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

std::size_t warnings_containing(const WireMesh& mesh, const std::string& text) {
  std::size_t n = 0;
  for (const auto& w : mesh.warnings) n += w.message.find(text) != std::string::npos;
  return n;
}

int largest_node(const WireMesh& mesh) {
  std::size_t largest = 0;
  for (const auto& n : mesh.nodes) largest = std::max(largest, n.ends.size());
  return static_cast<int>(largest);
}

// A straight wire never doubles back: short segments for its radius only earn the
// thin-wire warning, whatever the count (the cases a builder hit: 162 mm of 1.5 mm radius in
// 31 or 41 segments, 6 mm radius in 10 mm segments, a 980 mm dipole at 3 GHz).
TEST(WireMesh, StraightWireWithShortSegmentsIsNotRefused) {
  for (const char* text : {"units mm\nwire w from (0,0,0) to (162,0,0) radius 1.5 segments 31\nport p on w at middle\n",
                           "units mm\nwire w from (0,0,0) to (162,0,0) radius 1.5 segments 41\nport p on w at middle\n",
                           "units mm\nwire w from (0,0,0) to (200,0,0) radius 6 segments 20\nport p on w at middle\n",
                           "units mm\nwire w from (0,0,-490) to (0,0,490) radius 3\nport p on w at middle\n"}) {
    SCOPED_TRACE(text);
    const WireMesh mesh = mesh_of(std::string(text) + "frequency 3 GHz\n");
    EXPECT_EQ(warnings_containing(mesh, "radii long"), 1u);
    EXPECT_EQ(warnings_containing(mesh, "touches itself"), 0u);
  }
}

// A value just under a limit is printed with the digits that tell it from the limit (it
// read "a segment is only 8 radii long; below 8").
TEST(WireMesh, AWarningsValueDiffersFromItsLimitInPrint) {
  // 8 segments of 7.9996 mm on a wire of 1 mm radius.
  const WireMesh mesh = mesh_of("units mm\nwire w from (0,0,0) to (63.9968,0,0) radius 1 segments 8\nport p on w at middle\n"
                                "frequency 300 MHz\n");
  ASSERT_EQ(mesh.warnings.size(), 1u);
  EXPECT_NE(mesh.warnings.front().message.find("only 7.9996 radii long; below 8 "), std::string::npos)
      << mesh.warnings.front().message;
}

// Every node of a polyline is a node like any other: elements ending on the boom's corners
// join it there, and an element ending between the boom's nodes splits its segment.
TEST(WireMesh, WiresJoinAtPolylineCornersAndInsideSegments) {
  const WireMesh mesh = mesh_of(
      "units mm\nwire boom through (0,0,0) (400,0,0) (800,0,0) radius 5 segments 2\n"
      "wire e1 from (400,-500,0) to (400,0,0) radius 2\nwire e2 from (400,0,0) to (400,500,0) radius 2\n"
      "wire e3 from (600,-500,0) to (600,0,0) radius 2\nwire e4 from (600,0,0) to (600,500,0) radius 2\n"
      "port p on e1 at end\nfrequency 144 MHz\n");
  EXPECT_TRUE(mesh.warnings.empty()) << mesh.warnings.front().message;
  EXPECT_EQ(mesh.junction_count, 2);
  EXPECT_EQ(largest_node(mesh), 4);
  EXPECT_EQ(segments_of_wire(mesh, 0), 4u);  // 400 to 800 mm split at 600 mm, then made equal
}

// Same on a curved wire: the joint lands on the arc, not on its chord.
TEST(WireMesh, WireEndingOnAnArcBetweenItsNodesJoinsIt) {
  const Model m = parse_model("units mm\narc loop center (0,0,0) normal (0,0,1) from (100,0,0) angle 360 deg radius 1 segments 24\n"
                              "wire tap from (0,0,0) to (100*cos(37 deg), 100*sin(37 deg), 0) radius 1\n"
                              "port p on tap at start\nfrequency 300 MHz\n", "m");
  const WireMesh mesh = mesh_wires(m);
  EXPECT_EQ(mesh.junction_count, 1);
  EXPECT_TRUE(mesh.warnings.empty());
}

// Turns of a helix lying on one another are refused like overlapping wires.
TEST(WireMesh, OverlappingHelixTurnsAreAnError) {
  EXPECT_THROW(mesh_of("units mm\nhelix h base (0,0,0) axis (0,0,1) diameter 40 pitch 1 turns 3 radius 1 segments 60\n"
                       "port p on h at middle\nfrequency 2.4 GHz\n"),
               InputError);
}

// A wire soldered through a plate is joined to it there: it gets a node on the plate.
TEST(WireMesh, WirePassingThroughAPlateGetsANodeThere) {
  const WireMesh mesh = mesh_of("units mm\nplate p rectangle corner (-50,-50,7) size (100, 100)\n"
                                "wire w from (0,0,-30) to (0,0,70) radius 1 segments 5\nport f on w at middle\n"
                                "frequency 1 GHz\n");
  int on_plate = 0;
  for (const auto& n : mesh.nodes) on_plate += std::abs(n.position.z() - 0.007) < 1e-15;
  EXPECT_EQ(on_plate, 1);
}

// Through a clearance hole it stays apart; through the hole's edge it is refused.
TEST(WireMesh, WireThroughAHoleStaysApartAndThroughAnEdgeIsRefused) {
  const std::string plate = "units mm\nplate p rectangle corner (-50,-50,7) size (100, 100)\n";
  const std::string rest = "wire w from (0,0,-30) to (0,0,70) radius 1 segments 5\nport f on w at middle\nfrequency 1 GHz\n";
  const WireMesh mesh = mesh_of(plate + "cut p disc center (0,0,7) diameter 5\n" + rest);
  for (const auto& n : mesh.nodes) EXPECT_GT(std::abs(n.position.z() - 0.007), 1e-6);
  EXPECT_THROW(mesh_of(plate + "cut p disc center (0,0,7) diameter 2\n" + rest), InputError);
  EXPECT_THROW(mesh_of("units mm\nplate p rectangle corner (0.5,-50,7) size (100, 100)\n" + rest), InputError);
}

TEST(WireMesh, WiresInsideBodiesOrAlongPlatesAreRefused) {
  EXPECT_THROW(mesh_of("units mm\nsphere s center (0,0,0) diameter 100\nwire w from (0,0,20) to (0,0,200) radius 1\n"
                       "port f on w at middle\nfrequency 1 GHz\n"),
               InputError);
  EXPECT_THROW(mesh_of("units mm\nplate p rectangle corner (-50,-50,0) size (100, 100)\n"
                       "wire w from (-20,0,0) to (20,0,0) radius 1\nport f on w at middle\nfrequency 1 GHz\n"),
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
