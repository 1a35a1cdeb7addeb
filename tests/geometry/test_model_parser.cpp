#include <gtest/gtest.h>

#include <algorithm>
#include <chrono>
#include <cmath>
#include <cstdio>

#include "core/constants.hpp"
#include "core/number_text.hpp"
#include "geometry/model_parser.hpp"
#include "geometry/wire_mesh.hpp"

namespace lobe {
namespace {

const std::string base = "wire w from (0, 0, -1) to (0, 0, 1) radius 1 mm\nport p on w at middle\nfrequency 100 MHz\n";

std::string error_of(const std::string& text, const std::vector<Override>& overrides = {}) {
  try {
    parse_model(text, "m.lobe", overrides);
  } catch (const InputError& e) {
    return e.formatted();
  }
  return "";
}

TEST(ModelParser, ReadsTheIssueSketch) {
  const std::string text =
      "units mm\n"
      "let f0  = 1575.42 MHz\n"
      "let arm = 0.235 * c0 / f0\n"
      "let r   = 1\n"
      "wire east  from (-arm, 0, 0) to (arm, 0, 0)  radius r\n"
      "wire north from (0, -arm, 0) to (0, arm, 0)  radius r  segments 21\n"
      "port a on east  at middle  voltage 1 V\n"
      "port b on north at middle  voltage 1 V  phase -90 deg\n"
      "frequency 1.50 GHz to 1.65 GHz count 31\n"
      "reference 50 ohm\n"
      "band nav 1574.4 MHz to 1576.4 MHz\n"
      "pattern theta 0 to 180 step 2 deg  phi 0 to 355 step 5 deg\n";
  const Model m = parse_model(text, "sketch");
  ASSERT_EQ(m.wires.size(), 2u);
  EXPECT_NEAR(m.wires[0].shape.points[1].x(), 0.235 * speed_of_light / 1575.42e6, 1e-15);
  EXPECT_DOUBLE_EQ(m.wires[0].radius, 1e-3);  // bare number read in mm
  EXPECT_EQ(m.wires[1].segments, 21);
  EXPECT_NEAR(std::arg(m.ports[1].voltage), -pi / 2, 1e-15);
  ASSERT_EQ(m.frequencies_hz.size(), 31u);
  EXPECT_DOUBLE_EQ(m.frequencies_hz.back(), 1.65e9);
  EXPECT_EQ(m.pattern.thetas().size(), 91u);
  EXPECT_EQ(m.pattern.phis().size(), 72u);
  EXPECT_EQ(m.bands.at(0).name, "nav");
}

TEST(ModelParser, OverrideReplacesALet) {
  const std::string text = "units mm\nlet h = 10\nwire w from (0, 0, 0) to (0, 0, h) radius 1\n"
                           "port p on w at middle\nfrequency 1 GHz\n";
  const Model m = parse_model(text, "m", {parse_override("h=20", 1)});
  EXPECT_DOUBLE_EQ(m.wires[0].shape.points[1].z(), 0.020);
  EXPECT_TRUE(m.values.at(0).overridden);
  EXPECT_NE(error_of(text, {parse_override("nope=3", 1)}).find("--set:1:"), std::string::npos);
}

TEST(ModelParser, FrequencyStepRange) {
  const Model m = parse_model("wire w from (0,0,0) to (0,0,1) radius 1 mm\nport p on w at middle\n"
                              "frequency 100 MHz to 200 MHz step 25 MHz\n", "m");
  ASSERT_EQ(m.frequencies_hz.size(), 5u);
  EXPECT_DOUBLE_EQ(m.frequencies_hz[4], 200e6);
}

TEST(ModelParser, TransformsCompose) {
  const Model m = parse_model(base + "copy w as v shift (1, 0, 0)\nturn v about z by 90\nmirror v across zx\n", "m");
  const Vec3 p = m.wires[1].transform * Vec3(0, 0, 1);
  EXPECT_NEAR(p.x(), 0.0, 1e-15);
  EXPECT_NEAR(p.y(), -1.0, 1e-15);  // (1,0,1) turned to (0,1,1), mirrored to (0,−1,1)
  EXPECT_NEAR(p.z(), 1.0, 1e-15);
}

TEST(ModelParser, PlatesBodiesAndWaves) {
  const Model m = parse_model(
      "units mm\n"
      "plate floor rectangle corner (0, 0, 0) size (100, 50) normal (0, 0, 1)\n"
      "plate lid polygon (0, 0, 10) (10, 0, 10) (0, 10, 10)\n"
      "plate coin disc center (0, 0, 20) normal (1, 0, 0) diameter 30\n"
      "sphere ball center (0, 0, 100) diameter 40\n"
      "box crate corner (200, 0, 0) size (10, 20, 30)\n"
      "copy ball as ball2 shift (0, 0, 50)\n"
      "mesh ball size 5\n"
      "wave theta 90 phi 0 polarization phi amplitude 2 V/m\n"
      "frequency 1 GHz\n",
      "m");
  ASSERT_EQ(m.surfaces.size(), 6u);
  EXPECT_DOUBLE_EQ(m.surfaces[0].width, 0.1);
  EXPECT_EQ(m.surfaces[1].polygon.size(), 3u);
  EXPECT_DOUBLE_EQ(m.surfaces[3].mesh_size, 0.005);
  EXPECT_NEAR((m.surfaces[5].transform * Vec3::Zero()).z(), 0.05, 1e-15);
  ASSERT_TRUE(m.wave.has_value());
  EXPECT_NEAR(m.wave->theta, pi / 2, 1e-15);
  EXPECT_FALSE(m.wave->theta_polarized);
  EXPECT_DOUBLE_EQ(m.wave->amplitude, 2.0);
}

TEST(ModelParser, CutsAndPlatePorts) {
  const Model m = parse_model(
      "units mm\n"
      "plate deck rectangle corner (0, 0, 0) size (100, 50)\n"
      "cut deck disc center (20, 20, 0) diameter 6\n"
      "cut deck polygon (0, 0, 0) (10, 0, 0) (0, 10, 0)\n"
      "wire whip from (50, 25, 0) to (50, 25, 70) radius 1\n"
      "port a on deck along (80, 0, 0) to (80, 50, 0) phase 90 deg\n"
      "port b on whip at start\n"
      "frequency 1 GHz\n",
      "m");
  ASSERT_EQ(m.surfaces[0].cuts.size(), 2u);
  EXPECT_EQ(m.surfaces[0].cuts[0].kind, SurfaceKind::disc);
  EXPECT_DOUBLE_EQ(m.surfaces[0].cuts[0].diameter, 0.006);
  EXPECT_EQ(m.surfaces[0].cuts[1].polygon.size(), 3u);
  ASSERT_TRUE(m.ports[0].line.has_value());
  EXPECT_EQ(m.ports[0].line->plate, "deck");
  EXPECT_NEAR(m.ports[0].line->to.y(), 0.05, 1e-15);
  EXPECT_NEAR(std::arg(m.ports[0].voltage), pi / 2, 1e-12);
  EXPECT_FALSE(m.ports[1].line.has_value());
}

TEST(ModelParser, ErrorsPointAtTheCause) {
  EXPECT_EQ(error_of("blorp\n"), "m.lobe:1:1: unknown statement 'blorp'; statements are: units let wire arc helix plate cut "
                                 "sphere box copy shift turn mirror mesh port load line stub transformer conductor ground substrate wave "
                                 "frequency reference band pattern");
  EXPECT_EQ(error_of("wire w from (0,0,0) to (0,0,1)\n"), "m.lobe:1:31: wire 'w' needs 'radius R'");
  EXPECT_EQ(error_of("let a = 1\nlet a = 2\n"), "m.lobe:2:5: 'a' is already defined");
  EXPECT_EQ(error_of(base + "port q on nowhere at middle\n"), "m.lobe:4:11: there is no wire named 'nowhere'");
  EXPECT_EQ(error_of(base + "port q on w at 1.5\n"), "m.lobe:4:16: the position fraction must be from 0 to 1, got 1.5");
  EXPECT_NE(error_of("wire w from (0,0,0) to (0,0,1) radius 1 MHz\n").find("expected a wire radius, got a frequency"),
            std::string::npos);
  EXPECT_EQ(error_of(""), "m.lobe:1:1: the model is empty: it has no statements");
  EXPECT_NE(error_of("wire w from (0,0,0) to (0,0,0) radius 1\n").find("zero length"), std::string::npos);
}

// Ranges override with exact SI texts but show their values in the unit START was written in.
// The substrate statement as the issue writes it; the board lies on the ground plane.
// A band from --band is named by its limits as the user wrote them (it was "option-1",
// which a report reader could not place).
TEST(ModelParser, BandOptionIsNamedByItsLimits) {
  const Band band = parse_band_option("433.05MHz : 434.79 MHz", 1);
  EXPECT_EQ(band.name, "433.05MHz:434.79MHz");
  EXPECT_DOUBLE_EQ(band.low_hz, 433.05e6);
  EXPECT_DOUBLE_EQ(band.high_hz, 434.79e6);
}

TEST(ModelParser, SubstrateStatement) {
  const std::string printed = "plate a rectangle corner (-10, -1, 1.6) size (20, 2)\n"
                              "port p on a along (0, -1, 1.6) to (0, 1, 1.6)\nfrequency 2.4 GHz\n";
  const Model m = parse_model("units mm\nsubstrate fr4 thickness 1.6 permittivity 4.4 loss-tangent 0.02\n" + printed, "m.lobe");
  ASSERT_TRUE(m.substrate.has_value());
  EXPECT_EQ(m.substrate->name, "fr4");
  EXPECT_DOUBLE_EQ(m.substrate->thickness, 1.6e-3);
  EXPECT_DOUBLE_EQ(m.substrate->permittivity, 4.4);
  EXPECT_DOUBLE_EQ(m.substrate->loss_tangent, 0.02);
  EXPECT_TRUE(m.ground_perfect);
  EXPECT_DOUBLE_EQ(parse_model("units mm\nsubstrate r thickness 0.8 permittivity 2.2\n" + printed, "m.lobe").substrate->loss_tangent,
                   0.0);
  EXPECT_EQ(error_of("ground none\nsubstrate s thickness 1 mm permittivity 3\n"),
            "m.lobe:2:1: a substrate lies on the ground plane; it cannot be used with 'ground none'");
  EXPECT_EQ(error_of("substrate s thickness 1 mm permittivity 3\nground none\n"),
            "m.lobe:2:1: a substrate lies on the ground plane; it cannot be used with 'ground none'");
  EXPECT_EQ(error_of("substrate s thickness 1 mm permittivity 0.5\n"),
            "m.lobe:1:41: the relative permittivity must be from 1 to 100, got 0.5");
  EXPECT_EQ(error_of("substrate s thickness 1 mm permittivity 3 loss-tangent -0.1\n").substr(0, 9), "m.lobe:1:");
  EXPECT_NE(error_of("substrate s thickness 1 mm permittivity 3\nsubstrate t thickness 1 mm permittivity 3\n")
                .find("m.lobe:2:1: the substrate is already given (line 1)"),
            std::string::npos);
  EXPECT_NE(error_of("substrate s thickness 0 mm permittivity 3\n").find("the thickness must be above zero"),
            std::string::npos);
  EXPECT_EQ(error_of("substrate s thickness 1 mm permittivity 3 loss - tangent 0.1\n"),
            "m.lobe:1:43: unexpected 'loss' after the statement");
  EXPECT_EQ(error_of("substrate s thickness 5 um permittivity 3\n"),
            "m.lobe:1:23: the thickness must be at least 10 um, got 5 um");
}

// Feed networks: a line from a free point to a gap, its loss from two data-sheet points
// split into a √f and an f part; stubs, transformers, parts between ends; ports at free points.
TEST(ModelParser, FeedNetworkStatements) {
  const std::string wire = "wire w from (0, 0, -1) to (0, 0, 1) radius 1 mm\nfrequency 100 MHz\n";
  const Model m = parse_model(wire +
                                  "port p at conn\n"
                                  "line coax from conn to w at middle impedance 50 ohm length 3 m velocity 0.66 "
                                  "loss 4 dB per 100 m at 100 MHz and 16 dB per 100 m at 1 GHz\n"
                                  "stub s at conn impedance 75 ohm length 0.4 m velocity 0.8 short\n"
                                  "transformer b from conn to w at 0.25 ratio 4\n"
                                  "load c from conn to w at end capacitance 10 pF\n",
                              "m.lobe");
  ASSERT_EQ(m.network.size(), 4u);
  EXPECT_EQ(m.ports[0].node, "conn");
  const NetworkElement& coax = m.network[0];
  EXPECT_EQ(coax.kind, NetworkKind::line);
  EXPECT_EQ(coax.ends[0].node, "conn");
  ASSERT_TRUE(coax.ends[1].wire.has_value());
  EXPECT_EQ(coax.ends[1].wire->wire, "w");
  EXPECT_DOUBLE_EQ(coax.velocity_factor, 0.66);
  EXPECT_NEAR(coax.loss.db_per_metre(100e6), 0.04, 1e-15);
  EXPECT_NEAR(coax.loss.db_per_metre(1e9), 0.16, 1e-15);
  EXPECT_GT(coax.loss.dielectric, 0.0);
  EXPECT_TRUE(m.network[1].shorted);
  EXPECT_DOUBLE_EQ(m.network[2].ratio, 4.0);
  EXPECT_EQ(m.network[3].kind, NetworkKind::lumped);
  EXPECT_DOUBLE_EQ(*m.network[3].part.capacitance, 10e-12);
}

TEST(ModelParser, FeedNetworkErrors) {
  const std::string wire = "wire w from (0, 0, -1) to (0, 0, 1) radius 1 mm\nfrequency 100 MHz\nport p on w at middle\n";
  const std::string line = "line l from w at middle to ";
  EXPECT_EQ(error_of(wire + line + "far impedance 50 ohm length 1 m velocity 1\n"),
            "m.lobe:4:28: free point 'far' is used only by 'l'; a free point joins two or more parts or ports (a "
            "misspelt name?)");
  EXPECT_EQ(error_of(wire + line + "w at 0.2 impedance 50 ohm length 1 m\n"),
            "m.lobe:4:1: 'l' needs its velocity factor (1 for an air line)");
  EXPECT_EQ(error_of(wire + line + "w at middle impedance 50 ohm length 1 m velocity 1\n"),
            "m.lobe:4:28: 'l' joins a place to itself; its two ends must differ");
  EXPECT_EQ(error_of(wire + line + "w at 0.2 impedance 50 ohm length 1 m velocity 1.2\n"),
            "m.lobe:4:74: the velocity factor is the speed on the line over the speed of light: above 0, at most 1 "
            "(solid polyethylene coax 0.66, foam 0.8 to 0.85, air-spaced 1)");
  EXPECT_EQ(error_of(wire + "stub s on w at 0.3 impedance 50 ohm length 1 m velocity 1\n"),
            "m.lobe:4:1: stub 's' needs 'open' or 'short' (its far end)");
  EXPECT_EQ(error_of(wire + "port q at x\nport r at x\n"),
            "m.lobe:5:11: two ports at free point 'x'; one source per point");
  EXPECT_EQ(error_of(wire + line + "w impedance 50 ohm length 1 m velocity 1\nload r at w resistance 1 ohm\n"),
            "m.lobe:4:28: 'w' is a wire or plate; a place on it is written 'w at POSITION'");
  EXPECT_EQ(error_of(wire + line + "w at 0.2 impedance 50 ohm length 1 m velocity 1 "
                                   "loss 10 dB per 100 m at 100 MHz and 12 dB per 100 m at 1 GHz\n"),
            "m.lobe:4:112: these two loss points do not fit a sqrt(f) conductor loss plus an f dielectric loss, both "
            "positive; check them against the data sheet, or give one point");
  EXPECT_EQ(error_of(wire + "transformer t from w at 0.2 to w at 0.7 ratio 0\n"),
            "m.lobe:4:47: the impedance ratio must be from 0.001 to 1000, got 0");
  EXPECT_EQ(error_of(wire + "load r on w at 0.2 resistance 5 ohm\nline r from w at 0.3 to w at 0.6 impedance 50\n"),
            "m.lobe:5:6: a load named 'r' already exists");
}

// Several frequency statements (two bands, say) and lists: merged, sorted, each value once.
TEST(ModelParser, SeveralFrequencyStatements) {
  const std::string wire = "wire w from (0, 0, -1) to (0, 0, 1) radius 1 mm\nport p on w at middle\n";
  const Model m = parse_model(wire + "frequency 430 MHz, 440 MHz, 435 MHz\nfrequency 140 MHz to 150 MHz count 3\n"
                                     "frequency 145 MHz\n",
                              "m.lobe");
  const std::vector<Real> expected = {140e6, 145e6, 150e6, 430e6, 435e6, 440e6};
  ASSERT_EQ(m.frequencies_hz.size(), expected.size());
  for (std::size_t i = 0; i < expected.size(); ++i) EXPECT_DOUBLE_EQ(m.frequencies_hz[i], expected[i]);
  EXPECT_EQ(m.frequency_where.line, 3);
  EXPECT_EQ(error_of(wire + "frequency 430 MHz, 440\n"), "m.lobe:3:20: expected a frequency with a unit; a plain number is ambiguous here");
}

TEST(ModelParser, RealGround) {
  const Model m = parse_model(base + "ground real permittivity 13 conductivity 0.005 S/m system 12 ohm\n", "m.lobe");
  ASSERT_TRUE(m.real_ground.has_value());
  EXPECT_DOUBLE_EQ(m.real_ground->permittivity, 13.0);
  EXPECT_DOUBLE_EQ(m.real_ground->conductivity, 0.005);
  EXPECT_DOUBLE_EQ(*m.real_ground->system_resistance, 12.0);
  EXPECT_FALSE(m.ground_perfect);
  EXPECT_FALSE(parse_model(base + "ground real permittivity 5 conductivity 0.001\n", "m.lobe").real_ground->system_resistance);
  EXPECT_FALSE(parse_model(base + "ground real permittivity 5 conductivity 0.001\nground none\n", "m.lobe").real_ground);
  EXPECT_EQ(error_of(base + "ground real permittivity 13 conductivity 0.005 system -1 ohm\n"),
            "m.lobe:4:55: the ground system's loss resistance must be from 0 to 10 kohm, got -1");
  EXPECT_EQ(error_of(base + "ground real conductivity 0.005\n"),
            "m.lobe:4:13: expected 'permittivity' after 'real', found 'conductivity'");
}

// 'conductor' names a wire, a plate or body, or all of them; a plate's metal may have a
// thickness, a wire has its radius instead.
TEST(ModelParser, ConductorOnPlates) {
  const std::string plates = "units mm\nplate a rectangle corner (-10, -1, 1.6) size (20, 2)\n"
                             "plate b rectangle corner (-10, 5, 1.6) size (20, 2)\n"
                             "port p on a along (0, -1, 1.6) to (0, 1, 1.6)\nfrequency 2.4 GHz\n";
  const Model m = parse_model(plates + "conductor a conductivity 5.8e7 S/m thickness 35 um\n", "m.lobe");
  EXPECT_DOUBLE_EQ(m.surfaces[0].conductivity, 5.8e7);
  EXPECT_DOUBLE_EQ(m.surfaces[0].conductor_thickness, 35e-6);
  EXPECT_EQ(m.surfaces[1].conductivity, 0.0);
  const Model all = parse_model(plates + "conductor all conductivity 3.7e7 S/m\n", "m.lobe");
  EXPECT_DOUBLE_EQ(all.surfaces[1].conductivity, 3.7e7);
  EXPECT_EQ(all.surfaces[1].conductor_thickness, 0.0);
  EXPECT_EQ(error_of("wire w from (0, 0, 0) to (0, 0, 1) radius 0.001\nconductor w conductivity 1e7 S/m thickness 1 mm\n"),
            "m.lobe:2:34: 'thickness' is the metal's thickness of a plate or body; a wire has its radius");
}

TEST(ModelParser, VariedValuesAreShownInTheUnitsGiven) {
  const VariedName droop = parse_vary_option("droop=20deg:30deg:5deg", 1);
  ASSERT_EQ(droop.values.size(), 3u);
  EXPECT_EQ(droop.values[1], exact_text(25 * pi / 180) + " rad");
  EXPECT_EQ(droop.labels, (std::vector<std::string>{"20 deg", "25 deg", "30 deg"}));
  EXPECT_EQ(parse_vary_option("length=160 mm:161mm:0.5mm", 1).labels,
            (std::vector<std::string>{"160 mm", "160.5 mm", "161 mm"}));
  EXPECT_EQ(parse_vary_option("n=1:3:1", 1).labels, (std::vector<std::string>{"1", "2", "3"}));
  const VariedName listed = parse_vary_option("rod=0.5, 2 ,3", 1);
  EXPECT_EQ(listed.values[1], " 2 ");
  EXPECT_EQ(listed.labels, (std::vector<std::string>{"0.5", "2", "3"}));
  const TunedName f = parse_tune_option("f0=2.40GHz:2.48GHz", 1);
  EXPECT_EQ(shown_text(f.low, f.shown), "2.4 GHz");
  EXPECT_EQ(shown_text(0.1613331647701374, parse_tune_option("l=150mm:175mm", 1).shown), "161.3331648 mm");
}

// What editors write: a UTF-8 byte-order mark is skipped, lines may end in CR LF or a lone
// CR (errors still name the right line), and a polygon may repeat its first corner to close.
TEST(ModelParser, ReadsWhatEditorsWrite) {
  const Model bom = parse_model("\xEF\xBB\xBF" + base, "m");
  EXPECT_EQ(bom.wires.size(), 1u);
  std::string cr = base, crlf;
  std::replace(cr.begin(), cr.end(), '\n', '\r');
  EXPECT_EQ(parse_model(cr, "m").ports.size(), 1u);
  for (char ch : base + "x\n") crlf += ch == '\n' ? std::string("\r\n") : std::string(1, ch);
  EXPECT_EQ(error_of(crlf).rfind("m.lobe:4:1: unknown statement 'x'", 0), 0u) << error_of(crlf);
  const Model closed = parse_model("plate p polygon (0,0,0) (1,0,0) (1,1,0) (0,1,0) (0,0,0)\n" + base, "m");
  EXPECT_EQ(closed.surfaces.front().polygon.size(), 4u);
}

/// A grid of short vertical wires, `count` of them, 10 mm apart.
std::string many_wires(int count) {
  std::string text = "units mm\n";
  for (int i = 0; i < count; ++i)
    text += "wire w" + std::to_string(i) + " from (" + std::to_string(i % 400 * 10) + ", " + std::to_string(i / 400 * 10) +
            ", 0) to (" + std::to_string(i % 400 * 10) + ", " + std::to_string(i / 400 * 10) + ", 5) radius 0.1 segments 1\n";
  return text + "port p on w0 at middle\nfrequency 100 MHz\n";
}

double median_seconds_to_parse_and_mesh(const std::string& text) {
  std::vector<double> seconds;
  for (int r = 0; r < 3; ++r) {
    const auto start = std::chrono::steady_clock::now();
    const Model m = parse_model(text, "m");
    mesh_wires(m);
    seconds.push_back(std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count());
  }
  std::sort(seconds.begin(), seconds.end());
  return seconds[1];
}

// Reading and meshing grow about linearly with the number of wires: 80,000 wires once took
// 43 s because every new name was compared with every earlier one. A ratio of times on one
// machine in one run, not an absolute time: four times the wires must cost well under the
// sixteen times a quadratic step would (linear gives about four).
TEST(ModelParser, ParsingAndMeshingGrowNearlyLinearly) {
  const double small = median_seconds_to_parse_and_mesh(many_wires(5000));
  const double large = median_seconds_to_parse_and_mesh(many_wires(20000));
  std::printf("5,000 wires: %.3f s, 20,000 wires: %.3f s, ratio %.1f\n", small, large, large / small);
  EXPECT_LT(large / small, 8.0);
}

}  // namespace
}  // namespace lobe
