// Touchstone reading and writing against the file format of the open IBIS Touchstone
// specification (versions 1.1 and 2.0): files written here round-trip, and hand-written
// files in each syntax read back to the numbers they encode.
#include <gtest/gtest.h>

#include <cmath>
#include <fstream>
#include <iterator>
#include <random>

#include "core/constants.hpp"
#include "core/input_error.hpp"
#include "post/touchstone.hpp"
#include "support/scratch_directory.hpp"

namespace lobe {
namespace {

std::filesystem::path scratch(const std::string& name) {
  return testing::scratch_directory("touchstone") / name;
}

std::filesystem::path written(const std::string& name, const std::string& text) {
  const auto path = scratch(name);
  std::ofstream(path) << text;
  return path;
}

NetworkData random_network(int ports, unsigned seed) {
  std::mt19937 generator(seed);
  std::uniform_real_distribution<Real> part(-0.7, 0.7);
  NetworkData d;
  d.reference_ohm = 75.0;
  for (int k = 0; k < 4; ++k) {
    d.frequency_hz.push_back(1.2345678901e8 * (k + 1));
    ComplexMatrix s(ports, ports);
    for (int i = 0; i < ports; ++i)
      for (int j = 0; j < ports; ++j) s(i, j) = {part(generator), part(generator)};  // not symmetric: order shows
    d.s.push_back(s);
  }
  return d;
}

TEST(Touchstone, EveryStyleRoundTrips) {
  for (int version : {1, 2})
    for (auto format : {TouchstoneFormat::real_imaginary, TouchstoneFormat::magnitude_angle, TouchstoneFormat::decibel_angle})
      for (Real unit : {1.0, 1e3, 1e6, 1e9})
        for (int ports : {1, 2, 3, 5}) {
          const NetworkData original = random_network(ports, 7u * ports + version);
          const auto path = scratch("trip.s" + std::to_string(ports) + "p");
          write_touchstone(path, original, {version, format, unit}, "round trip\nsecond comment line");
          const NetworkData back = read_touchstone(path);
          ASSERT_EQ(back.ports(), ports);
          ASSERT_EQ(back.frequency_hz.size(), original.frequency_hz.size());
          EXPECT_EQ(back.reference_ohm, 75.0);
          for (std::size_t k = 0; k < back.frequency_hz.size(); ++k) {
            EXPECT_NEAR(back.frequency_hz[k], original.frequency_hz[k], 1e-15 * original.frequency_hz[k]);
            EXPECT_LT((back.s[k] - original.s[k]).norm(), 1e-13) << "version " << version << ", " << ports << " ports";
          }
        }
}

// In decibels a coupling of rounding noise (|S21| = 1e-16, −320 dB) is written at the floor,
// −200 dB, and a comment says so; it reads back as 1e-10, still nothing.
TEST(Touchstone, DecibelsFloorRoundingNoise) {
  NetworkData d;
  d.frequency_hz = {1e9};
  ComplexMatrix s(2, 2);
  s << Complex(0.3, 0.1), Complex(1e-16, 0), Complex(1e-16, 0), Complex(0.2, -0.1);
  d.s.push_back(s);
  const auto path = scratch("floor.s2p");
  write_touchstone(path, d, {1, TouchstoneFormat::decibel_angle, 1e9}, "");
  std::ifstream in(path);
  const std::string text((std::istreambuf_iterator<char>(in)), std::istreambuf_iterator<char>());
  EXPECT_NE(text.find("! magnitudes below -200 dB"), std::string::npos) << text;
  EXPECT_EQ(text.find("-320"), std::string::npos) << text;
  const NetworkData back = read_touchstone(path);
  EXPECT_NEAR(std::abs(back.s[0](1, 0)), 1e-10, 1e-22);
  EXPECT_NEAR(std::abs(back.s[0](0, 0)), std::abs(s(0, 0)), 1e-14);
}

TEST(Touchstone, VersionOneOnePortMagnitudeAngle) {
  const NetworkData d = read_touchstone(written("vna.s1p",
                                                "! invented example data\n"
                                                "# MHz S MA R 50   ! option line with a comment\n"
                                                "100 0.5 -45\n"
                                                "\n"
                                                "200 0.25 90\n"));
  ASSERT_EQ(d.frequency_hz.size(), 2u);
  EXPECT_DOUBLE_EQ(d.frequency_hz[1], 2e8);
  EXPECT_NEAR(std::abs(d.s[0](0, 0) - std::polar(0.5, -pi / 4)), 0.0, 1e-15);
  EXPECT_NEAR(std::abs(d.s[1](0, 0) - Complex(0.0, 0.25)), 0.0, 1e-15);
}

// Version 1 two-port records list S11, S21, S12, S22; options in any order and case.
TEST(Touchstone, VersionOneTwoPortOrderAndDecibels) {
  const NetworkData d = read_touchstone(written("amp.s2p", "# db r 50 ghz s\n1.0 -20 0  -3 90  -40 0  -10 180\n"));
  EXPECT_DOUBLE_EQ(d.frequency_hz[0], 1e9);
  EXPECT_NEAR(std::abs(d.s[0](0, 0) - 0.1), 0.0, 1e-15);
  EXPECT_NEAR(std::abs(d.s[0](1, 0) - std::polar(std::pow(10.0, -0.15), pi / 2)), 0.0, 1e-15);
  EXPECT_NEAR(std::abs(d.s[0](0, 1) - 0.01), 0.0, 1e-15);
  EXPECT_NEAR(std::abs(d.s[0](1, 1) + std::pow(10.0, -0.5)), 0.0, 1e-15);
}

TEST(Touchstone, VersionOneDefaultsWithoutAnOptionLine) {
  const NetworkData d = read_touchstone(written("bare.s1p", "2.4 0.1 0\n"));  // GHz, S, MA, R 50
  EXPECT_DOUBLE_EQ(d.frequency_hz[0], 2.4e9);
  EXPECT_DOUBLE_EQ(d.reference_ohm, 50.0);
  EXPECT_NEAR(d.s[0](0, 0).real(), 0.1, 1e-15);
}

// Version 2: keyword sections, the 12_21 order, a record spread over lines, lower format.
TEST(Touchstone, VersionTwoKeywordsAndSpreadRecords) {
  const NetworkData d = read_touchstone(written("v2.ts",
                                                "! invented\n[Version] 2.0\n# Hz S RI R 50\n[Number of Ports] 2\n"
                                                "[Two-Port Data Order] 12_21\n[Number of Frequencies] 2\n"
                                                "[Reference] 50 50\n[Network Data]\n"
                                                "1e9 0.1 0.2 ! S11\n    0.3 0.4   0.5 0.6\n    0.6 0.7\n"
                                                "2e9 0.1 0 0.2 0 0.3 0 0.4 0\n[End]\n"));
  ASSERT_EQ(d.frequency_hz.size(), 2u);
  EXPECT_EQ(d.s[0](0, 1), Complex(0.3, 0.4));
  EXPECT_EQ(d.s[0](1, 0), Complex(0.5, 0.6));
  EXPECT_EQ(d.s[0](1, 1), Complex(0.6, 0.7));
  const NetworkData lower = read_touchstone(written("lower.ts",
                                                    "[Version] 2.0\n# GHz S RI R 50\n[Number of Ports] 3\n"
                                                    "[Matrix Format] Lower\n[Network Data]\n"
                                                    "1 0.1 0 0.2 0 0.3 0 0.4 0 0.5 0 0.6 0\n[End]\n"));
  EXPECT_EQ(lower.s[0](0, 2), Complex(0.4, 0.0));  // row 3, column 1, mirrored
  EXPECT_EQ(lower.s[0](2, 2), Complex(0.6, 0.0));
}

// Z data: normalised to R in version 1, in ohms in version 2; both become S.
TEST(Touchstone, ImpedanceDataBecomesScattering) {
  const NetworkData v1 = read_touchstone(written("z1.s1p", "# MHz Z RI R 50\n100 2 0\n"));  // Z = 100 Ω
  EXPECT_NEAR(std::abs(v1.s[0](0, 0) - 1.0 / 3.0), 0.0, 1e-15);
  const NetworkData v2 = read_touchstone(
      written("z2.ts", "[Version] 2.0\n# MHz Z RI R 50\n[Number of Ports] 1\n[Network Data]\n100 100 0\n[End]\n"));
  EXPECT_NEAR(std::abs(v2.s[0](0, 0) - 1.0 / 3.0), 0.0, 1e-15);
}

/// The one-line message reading `text` as file `name` gives, or "no error".
std::string message(const std::string& name, const std::string& text) {
  try {
    read_touchstone(written(name, text));
  } catch (const InputError& e) {
    return e.formatted();
  }
  return "no error";
}

TEST(Touchstone, FaultsAreLocated) {
  EXPECT_NE(message("short.s2p", "# GHz S RI\n1 0.1 0 0.2 0\n").find(":2:1: this frequency's record is incomplete"),
            std::string::npos);
  EXPECT_NE(message("down.s1p", "# GHz S RI\n2 0.1 0\n1 0.1 0\n").find(":3:1: frequencies must increase"),
            std::string::npos);
  EXPECT_NE(message("h.s2p", "# GHz H RI\n").find(":1:7: hybrid"), std::string::npos);
  EXPECT_NE(message("word.s1p", "# GHz S RI\n1 0.1 oops\n").find(":2:7: expected a number"), std::string::npos);
  EXPECT_NE(message("noports.txt", "1 0.1 0\n").find("number of ports is unknown"), std::string::npos);
}

// Limits and physics: the port count from the extension is capped, frequencies must be
// positive, a port may not reflect more than it receives (|S11| > 1, or a positive S11 in
// dB); an analyser's .txt reads with a default port count.
TEST(Touchstone, RefusesWhatNoMeasurementGives) {
  EXPECT_NE(message("many.s40000p", "# GHz S MA R 50\n1 0.5 0\n").find("at most 64"), std::string::npos);
  // Found by fuzzing: 3e9 ports overflowed the conversion to int (undefined behaviour).
  EXPECT_NE(message("huge.ts", "[Version] 2.0\n# Hz S MA R 50\n[Number of Ports] 3e9\n").find("from 1 to 64"),
            std::string::npos);
  EXPECT_NE(message("big.s1p", "# GHz S MA R 50\n1 1.3 0\n2 0.5 0\n").find("|S11| is 1.3"), std::string::npos);
  EXPECT_NE(message("gain.s1p", "# GHz S DB R 50\n1 6 0\n").find("cannot reflect more"), std::string::npos);
  // Found by fuzzing: a transmission of 434,134 dB overflowed to an infinite S21, which the
  // reflection check let through into the data.
  EXPECT_NE(message("loud.s2p", "# MHz S DB R 50\n434 -20 0 434134 -8 -20 0 -20 0\n").find(":2:11: 434134 dB"),
            std::string::npos);
  EXPECT_NE(message("singular.s2p", "# MHz Z RI R 50\n434 -1 0 0 0 0 0 -1 0\n").find(":2:1: these impedances"),
            std::string::npos);
  EXPECT_NE(message("zero.s1p", "# GHz S MA R 50\n0 0.5 0\n1 0.5 0\n").find("above zero"), std::string::npos);
  EXPECT_NE(message("negative.s1p", "# GHz S MA R 50\n-1 0.5 0\n").find("above zero"), std::string::npos);
  EXPECT_NE(message("analyser.txt", "# MHz S DB R 50\n433 -20 10\n").find("number of ports is unknown"), std::string::npos);
  const NetworkData txt = read_touchstone(written("analyser.txt", "# MHz S DB R 50\n433 -20 10\n435 -18 5\n"), 1);
  EXPECT_EQ(txt.ports(), 1);
  EXPECT_NEAR(std::abs(txt.s[1](0, 0)), std::pow(10.0, -18.0 / 20), 1e-15);
}

}  // namespace
}  // namespace lobe
