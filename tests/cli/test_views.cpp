// The 3-D views a run writes for ParaView: the currents and the whole-sphere pattern as one
// file series over frequency (.pvd), each file well-formed VTK XML with the arrays the
// README names appended in binary, and the pattern surface drawn to its stated scale with
// its peak where the beam is.
#include <gtest/gtest.h>

#include <cmath>
#include <regex>
#include <sstream>

#include "cli/run_process.hpp"
#include "post/result_reader.hpp"
#include "support/vtu_arrays.hpp"
#include "support/xml_check.hpp"

namespace lobe::testing {
namespace {

const std::string models = std::string(LOBE_SOURCE_DIR) + "/models/";

int attribute(const std::string& text, const std::string& name) {
  std::smatch m;
  if (!std::regex_search(text, m, std::regex(name + "=\"(\\d+)\""))) return -1;
  return std::stoi(m[1]);
}

// Crossed dipoles over a reflector plate: segments and triangles in one grid per frequency;
// only with --views (without, the one-file currents grid alone: the views cost time).
TEST(Views, CurrentsAndPatternAreSeriesOverFrequency) {
  const auto dir = fresh_directory("views");
  ASSERT_EQ(run_lobe("run '" + models + "crossed_dipole_reflector_137.lobe' --views -o '" + (dir / "out").string() + "'", dir).exit_code, 0);
  const auto out = dir / "out";
  const BeamCurves beam = read_result_beam(out / "crossed_dipole_reflector_137.h5");
  for (const std::string series : {"currents", "pattern_3d"}) {
    const std::string pvd = read_text(out / ("crossed_dipole_reflector_137_" + series + ".pvd"));
    ASSERT_EQ(xml_error(pvd), "") << series;
    const std::regex step(R"re(<DataSet timestep="([0-9.e+-]+)" group="" part="0" file="([^"]+)"/>)re");
    std::size_t k = 0;
    for (std::sregex_iterator m(pvd.begin(), pvd.end(), step), end; m != end; ++m, ++k) {
      ASSERT_LT(k, beam.frequency_hz.size());
      EXPECT_NEAR(std::stod((*m)[1]), beam.frequency_hz[k] / 1e6, 1e-6) << series;
      const std::string vtu = read_text(out / (*m)[2].str());
      ASSERT_EQ(xml_error(vtu_structure(vtu)), "") << (*m)[2];
      if (series == "currents") {
        const int cells = attribute(vtu, "NumberOfCells");
        ASSERT_GT(cells, 0);
        EXPECT_EQ(vtu_array(vtu, "line_current_a").size(), static_cast<std::size_t>(cells));
        EXPECT_EQ(vtu_array(vtu, "surface_current_a_per_m").size(), static_cast<std::size_t>(cells));
        EXPECT_EQ(vtu_array(vtu, "current_re").size(), 3u * cells);
        EXPECT_EQ(vtu_array(vtu, "current_im").size(), 3u * cells);
      }
    }
    EXPECT_EQ(k, beam.frequency_hz.size()) << series;
  }
  // The pattern surface at the first frequency: 37 rows of 72 points (5° steps), each at a
  // distance from the centre that grows with the gain as stated (2 % of the full radius at
  // 40 dB below the peak, all of it at the peak), the farthest point where the beam is.
  const std::string vtu = read_text(out / "crossed_dipole_reflector_137_pattern_3d_000.vtu");
  const auto points = vtu_array(vtu, ""), gain = vtu_array(vtu, "gain_dbi");
  ASSERT_EQ(gain.size(), 37u * 72u);
  ASSERT_EQ(points.size(), 3 * gain.size());
  for (const char* name : {"rhcp_dbi", "lhcp_dbi", "axial_ratio_db", "realized_gain_dbi"})
    EXPECT_EQ(vtu_array(vtu, name).size(), gain.size()) << name;
  std::size_t top = 0;
  for (std::size_t i = 1; i < gain.size(); ++i)
    if (gain[i] > gain[top]) top = i;
  EXPECT_NEAR(gain[top], *beam.values.at("gain")[0], 0.01) << "the sphere's peak is the pattern grid's";
  // The centre (the structure's middle) and the full radius, recovered from the two poles,
  // which lie on the vertical axis through the centre.
  const double peak = gain[top];
  auto scale = [&](double g) { return std::clamp((g - (peak - 40)) / 40, 0.02, 1.0); };
  const Eigen::Vector3d north(points[0], points[1], points[2]);
  const Eigen::Vector3d south(points[points.size() - 3], points[points.size() - 2], points[points.size() - 1]);
  const double full = (north - south).norm() / (scale(gain.front()) + scale(gain.back()));
  const Eigen::Vector3d centre = north - full * scale(gain.front()) * Eigen::Vector3d::UnitZ();
  for (std::size_t i = 0; i < gain.size(); i += 97) {
    const Eigen::Vector3d p(points[3 * i], points[3 * i + 1], points[3 * i + 2]);
    EXPECT_NEAR((p - centre).norm() / full, scale(gain[i]), 1e-6) << i;
  }
  const Eigen::Vector3d farthest(points[3 * top], points[3 * top + 1], points[3 * top + 2]);
  const Eigen::Vector3d towards = (farthest - centre).normalized();
  const double theta = beam.peak_theta_deg[0] * M_PI / 180, phi = beam.peak_phi_deg[0] * M_PI / 180;
  const ProcessResult plain = run_lobe("run '" + models + "crossed_dipole_reflector_137.lobe' -o '" + (dir / "plain").string() + "'", dir);
  ASSERT_EQ(plain.exit_code, 0);
  EXPECT_TRUE(std::filesystem::exists(dir / "plain" / "crossed_dipole_reflector_137_currents.vtu"));
  EXPECT_FALSE(std::filesystem::exists(dir / "plain" / "crossed_dipole_reflector_137_currents.pvd"));
  EXPECT_FALSE(std::filesystem::exists(dir / "plain" / "crossed_dipole_reflector_137_pattern_3d.pvd"));
  EXPECT_GT(towards.dot(Eigen::Vector3d(std::sin(theta) * std::cos(phi), std::sin(theta) * std::sin(phi), std::cos(theta))),
            std::cos(5.0 * M_PI / 180));
}

}  // namespace
}  // namespace lobe::testing
