// lobe run --json: standard output is one JSON document and nothing else, it validates
// against the schema in the repository (checked by python3-jsonschema, a general-purpose
// validator from Debian), and its figures are the result file's.
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

/// The exit status of validating the JSON file `document` against the schema.
int validate(const std::filesystem::path& document, const std::string& schema = run_schema) {
  const std::string command = "python3 -c 'import json, sys, jsonschema; "
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
  // The control: the validator does reject (a newer schema version here).
  auto newer = doc;
  newer["schema_version"] = 2;
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

}  // namespace
}  // namespace lobe::testing
