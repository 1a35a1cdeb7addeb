// The frequency range the method can serve for a given mesh: refused where it cannot work,
// warned where it loses digits.
#include <gtest/gtest.h>

#include "geometry/model_parser.hpp"
#include "solver/frequency_limits.hpp"

namespace lobe {
namespace {

std::vector<MeshWarning> limits_of(const std::string& text) {
  const Model model = parse_model(text, "m");
  return check_frequency_limits(model, Medium::of(model), mesh_wires(model), SurfaceMesh{});
}

std::string dipole_at(const std::string& frequency, const std::string& segments = "segments 11") {
  return "wire w from (0,0,-0.25) to (0,0,0.25) radius 1 mm " + segments + "\nport p on w at middle\nfrequency " +
         frequency + "\n";
}

// A 0.5 m dipole: its resistance was 1 % wrong at 100 Hz and negative at 10 Hz and 1 Hz (a
// lossless model showing 78 % efficiency), so below k·D = 1e-5 (954 Hz here) it is refused.
TEST(FrequencyLimits, TooLowIsRefusedAndNearlyTooLowWarns) {
  EXPECT_THROW(limits_of(dipole_at("1 Hz")), InputError);
  EXPECT_THROW(limits_of(dipole_at("100 Hz")), InputError);
  const auto warned = limits_of(dipole_at("10 kHz"));
  ASSERT_EQ(warned.size(), 1u);
  EXPECT_NE(warned.front().message.find("fewer digits"), std::string::npos);
  EXPECT_TRUE(limits_of(dipole_at("300 MHz")).empty());
}

// Just below a limit, the frequency and the limit are printed with the digits that tell them
// apart (95.426 kHz against the 95.4265 kHz of k·D = 1e-3 read "at 95.43 kHz ... below 95.43 kHz").
TEST(FrequencyLimits, AWarningTellsTheFrequencyFromItsLimit) {
  const auto warned = limits_of(dipole_at("95.426 kHz"));
  ASSERT_EQ(warned.size(), 1u);
  const std::string& message = warned.front().message;
  const std::string at = message.substr(3, message.find(" the model") - 3);
  const auto below = message.find("digits below ") + 13;
  const std::string limit = message.substr(below, message.find(';', below) - below);
  EXPECT_NE(at, limit) << message;
  EXPECT_EQ(at, "95.426 kHz") << message;
}

// Segments longer than half a wavelength, and structures too large for the far-field
// integration, are refused before any work (1e15 Hz once ran 35 minutes per frequency).
TEST(FrequencyLimits, ElementsLongerThanHalfAWavelengthAndHugeStructuresAreRefused) {
  EXPECT_THROW(limits_of(dipole_at("20 GHz")), InputError);
  EXPECT_THROW(limits_of(dipole_at("1e15 Hz", "segments 1000")), InputError);
  EXPECT_NO_THROW(limits_of(dipole_at("5 GHz", "segments 40")));
  // 100 m at 300 MHz is 100 wavelengths across, beyond the 76 the integration handles.
  EXPECT_THROW(limits_of("wire w from (0,0,-50) to (0,0,50) radius 1 mm\nport p on w at middle\nfrequency 300 MHz\n"),
               InputError);
  EXPECT_NO_THROW(limits_of("wire w from (0,0,-25) to (0,0,25) radius 1 mm\nport p on w at middle\nfrequency 300 MHz\n"));
}

}  // namespace
}  // namespace lobe
