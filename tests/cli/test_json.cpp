// --json on run, check, sweep and compare: standard output is one JSON document and nothing
// else, it validates against its schema in the repository (checked by python3-jsonschema, a
// general-purpose validator from Debian, with a newer schema version as the control), and
// its figures are the result file's.
#include <gtest/gtest.h>

#include <nlohmann/json.hpp>

#include <fstream>

#include "cli/result_datasets.hpp"
#include "cli/run_process.hpp"
#include "post/result_reader.hpp"

namespace lobe::testing {
namespace {

const std::string models = std::string(LOBE_SOURCE_DIR) + "/models/";
const std::string run_schema = std::string(LOBE_SOURCE_DIR) + "/post/run_summary.schema.json";
const std::string check_schema = std::string(LOBE_SOURCE_DIR) + "/post/check_summary.schema.json";
const std::string sweep_schema = std::string(LOBE_SOURCE_DIR) + "/post/sweep_summary.schema.json";
const std::string compare_schema = std::string(LOBE_SOURCE_DIR) + "/post/compare_summary.schema.json";

/// The exit status of validating the JSON file `document` against the schema.
int validate(const std::filesystem::path& document, const std::string& schema = run_schema) {
  const std::string command = "/usr/bin/python3 -c 'import json, sys, jsonschema; "
                              "jsonschema.validate(json.load(open(sys.argv[1])), json.load(open(sys.argv[2])))' '" +
                              document.string() + "' '" + schema + "' 2>/dev/null";
  return std::system(command.c_str());
}

TEST(JsonSummary, YagiDocumentValidatesAndHoldsTheFileFigures) {
  const auto dir = fresh_directory("json");
  const ProcessResult r = run_lobe("run '" + models + "yagi_3el_144.lobe' --json -o '" + (dir / "out").string() + "'", dir);
  ASSERT_EQ(r.exit_code, 0) << r.err;
  EXPECT_EQ(r.out.front(), '{');
  EXPECT_NE(r.err.find("results:"), std::string::npos);  // everything else on standard error
  const auto doc = nlohmann::json::parse(r.out);         // throws on anything but one document
  std::ofstream(dir / "summary.json") << r.out;
  EXPECT_EQ(validate(dir / "summary.json"), 0);
  EXPECT_EQ(doc["schema_version"].get<int>(), 2);
  // The control: the validator does reject (a newer schema version here).
  auto newer = doc;
  newer["schema_version"] = 3;
  std::ofstream(dir / "newer.json") << newer.dump();
  EXPECT_NE(validate(dir / "newer.json"), 0);

  const auto h5 = dir / "out" / "yagi_3el_144.h5";
  const BeamCurves beam = read_result_beam(h5);
  ASSERT_EQ(doc["frequency_hz"].size(), beam.frequency_hz.size());
  for (std::size_t k = 0; k < beam.frequency_hz.size(); ++k) {
    EXPECT_DOUBLE_EQ(doc["beam"]["front_to_back_db"][k].get<double>(), *beam.values.at("front-to-back")[k]);
    EXPECT_DOUBLE_EQ(doc["beam"]["beamwidth_phi_deg"][k].get<double>(), *beam.values.at("beamwidth-phi")[k]);
  }
  EXPECT_DOUBLE_EQ(doc["bands"][0]["beam"]["front-to-back"]["worst"].get<double>(),
                   dataset(h5, "/band_figures/worst_front_to_back").at(0));
  EXPECT_DOUBLE_EQ(doc["bands"][0]["ports"][0]["worst-vswr"].get<double>(), dataset(h5, "/band_figures/worst_vswr").at(0));
}

// On a board over an infinite ground, its beam at the zenith, a patch has no back: null, and
// the document still valid.
TEST(JsonSummary, AnUndefinedFigureIsNull) {
  const auto dir = fresh_directory("json-null");
  const ProcessResult r = run_lobe("run '" + models + "patch_fr4_2450.lobe' --json -o '" + (dir / "out").string() + "'", dir);
  ASSERT_EQ(r.exit_code, 0) << r.err;
  const auto doc = nlohmann::json::parse(r.out);
  EXPECT_TRUE(doc["beam"]["front_to_back_db"][0].is_null());
  EXPECT_TRUE(doc["bands"][0]["beam"]["front-to-back"].is_null());
  EXPECT_TRUE(doc["bands"][0]["beam"]["gain"].is_object());
  EXPECT_EQ(doc["beam"]["hand"][0], "not circular");  // a linear patch: the sense is named, not "linear"
  std::ofstream(dir / "summary.json") << r.out;
  EXPECT_EQ(validate(dir / "summary.json"), 0);
}

// check --json: the counts as JSON on standard output, warnings both in it and on standard
// error (here a wire whose segments are shorter than 8 radii), valid against its schema.
TEST(JsonSummary, CheckDocumentValidatesAndCarriesTheWarnings) {
  const auto dir = fresh_directory("json-check");
  const auto model = dir / "short_segments.lobe";
  std::ofstream(model) << "units mm\nwire w from (0,0,-10) to (0,0,10) radius 1 segments 10\nport p on w at middle\n"
                          "frequency 1 GHz\n";
  const ProcessResult r = run_lobe("check '" + model.string() + "' --json", dir);
  ASSERT_EQ(r.exit_code, 0) << r.err;
  const auto doc = nlohmann::json::parse(r.out);
  EXPECT_EQ(doc["segments"].get<int>(), 10);
  EXPECT_EQ(doc["unknowns"].get<int>(), 9);
  ASSERT_FALSE(doc["warnings"].empty());
  EXPECT_EQ(doc["warnings"][0]["line"].get<int>(), 2);
  EXPECT_NE(r.err.find(":2:"), std::string::npos) << r.err;
  std::ofstream(dir / "check.json") << r.out;
  EXPECT_EQ(validate(dir / "check.json", check_schema), 0);
  auto newer = doc;
  newer["schema_version"] = 2;
  std::ofstream(dir / "newer.json") << newer.dump();
  EXPECT_NE(validate(dir / "newer.json", check_schema), 0);
}

/// `document` validates against `schema`, and the same with a newer schema_version does not.
void expect_valid_with_control(const std::filesystem::path& dir, const nlohmann::json& document, const std::string& schema) {
  std::ofstream(dir / "document.json") << document.dump();
  EXPECT_EQ(validate(dir / "document.json", schema), 0);
  auto newer = document;
  newer["schema_version"] = 2;
  std::ofstream(dir / "newer.json") << newer.dump();
  EXPECT_NE(validate(dir / "newer.json", schema), 0);
}

// sweep --json: the case table, each case's band figures (those of the file's stacked band
// figures) and the ranking with the limits met or missed.
TEST(JsonSummary, SweepDocumentValidatesAndHoldsTheFileFigures) {
  const auto dir = fresh_directory("json-sweep");
  const auto output = dir / "gp.h5";
  const ProcessResult r = run_lobe("sweep '" + models + "ground_plane_433.lobe' --vary droop=30:50:10 --rank worst-vswr "
                                   "--limit 'worst-vswr<=1.1' --json -o '" + output.string() + "'", dir);
  ASSERT_EQ(r.exit_code, 0) << r.err;
  EXPECT_NE(r.err.find("3 cases (3 solved now, 0 from before)"), std::string::npos) << r.err;
  const auto doc = nlohmann::json::parse(r.out);
  expect_valid_with_control(dir, doc, sweep_schema);
  ASSERT_EQ(doc["cases"].size(), 3u);
  EXPECT_EQ(doc["band"]["name"], "ism433");
  const std::vector<Real> worst = dataset(output, "/stacked/band_figures/worst_vswr");  // [case, band, port]
  ASSERT_EQ(worst.size(), 3u);
  for (std::size_t c = 0; c < 3; ++c) EXPECT_DOUBLE_EQ(doc["cases"][c]["figures"]["worst-vswr"].get<double>(), worst[c]);
  EXPECT_EQ(doc["cases"][1]["values"]["droop"]["label"], "40");
  const auto& order = doc["ranking"]["order"];
  ASSERT_EQ(order.size(), 3u);
  EXPECT_EQ(order[0]["case"], "case-000002");  // 40 degrees of droop matches best
  EXPECT_TRUE(order[0]["meets_limits"].get<bool>());
  EXPECT_FALSE(order[2]["meets_limits"].get<bool>());
}

// compare --json: the dips, the frequency-scale estimate and the band's figures as the text
// prints them.
TEST(JsonSummary, CompareDocumentValidatesAndAgreesWithTheText) {
  const auto dir = fresh_directory("json-compare");
  const ProcessResult run = run_lobe("run '" + models + "ground_plane_433.lobe' -o '" + (dir / "out").string() + "'", dir);
  ASSERT_EQ(run.exit_code, 0) << run.err;
  const std::string command = "compare '" + (dir / "out" / "ground_plane_433.h5").string() + "' '" + models +
                              "ground_plane_433_measured.csv' --band 433.05MHz:434.79MHz --tx-power 5";
  const ProcessResult json = run_lobe(command + " --json", dir);
  const ProcessResult text = run_lobe(command, dir);
  ASSERT_EQ(json.exit_code, 0) << json.err;
  const auto doc = nlohmann::json::parse(json.out);
  expect_valid_with_control(dir, doc, compare_schema);
  EXPECT_EQ(json.err, text.out);  // the text, unchanged, on standard error
  const double scale = doc["frequency_scale"]["factor"].get<double>();
  char printed[64];
  std::snprintf(printed, sizeof printed, "best frequency-scale factor: %.4f", scale);
  EXPECT_NE(text.out.find(printed), std::string::npos) << text.out;
  std::snprintf(printed, sizeof printed, "RMS return-loss difference %.2f dB",
                doc["bands"][0]["rms_return_loss_difference_db"].get<double>());
  EXPECT_NE(text.out.find(printed), std::string::npos) << text.out;
  EXPECT_EQ(doc["dips"]["pairs"].size(), 1u);
  EXPECT_GT(doc["bands"][0]["reflected_power_w"]["measured"].get<double>(), 0.0);
}

}  // namespace
}  // namespace lobe::testing
