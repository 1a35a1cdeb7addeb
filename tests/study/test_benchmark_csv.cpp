// lobe bench's CSV against RFC 4180 (Common Format and MIME Type for CSV Files): a field
// holding a comma or a double quote is quoted, and a quote inside doubled, so that every
// line splits into as many fields as the header.
#include <gtest/gtest.h>

#include <sstream>
#include <string>
#include <vector>

#include "bench/benchmark.hpp"

namespace lobe {
namespace {

/// The fields of one CSV line by RFC 4180.
std::vector<std::string> fields(const std::string& line) {
  std::vector<std::string> out(1);
  bool quoted = false;
  for (std::size_t i = 0; i < line.size(); ++i) {
    const char c = line[i];
    if (quoted && c == '"' && i + 1 < line.size() && line[i + 1] == '"') {
      out.back() += '"';
      ++i;
    } else if (c == '"') {
      quoted = !quoted;
    } else if (c == ',' && !quoted) {
      out.emplace_back();
    } else {
      out.back() += c;
    }
  }
  return out;
}

// Found by reading a full run's CSV: "patch, free space" split its row into one field more
// than the header had.
TEST(BenchmarkCsv, NamesWithCommasAndQuotesStayOneField) {
  BenchmarkReport report;
  report.sweep_model = "dipoles, \"crossed\"";
  for (const char* name : {"patch, free space", "a \"quoted\" plate", "wire curtain"}) {
    BenchmarkRow row;
    row.model = name;
    row.unknowns = 100;
    row.fill_seconds = row.factor_seconds = row.solve_seconds = 1.0;
    report.rows.push_back(row);
  }
  report.sweep_cases = 1;
  report.sweep_seconds = 1.0;
  std::istringstream csv(benchmark_csv(report));
  std::vector<std::vector<std::string>> lines;
  for (std::string line; std::getline(csv, line);) lines.push_back(fields(line));
  ASSERT_EQ(lines.size(), 5u);  // header, three models, the sweep
  for (const auto& line : lines) EXPECT_EQ(line.size(), lines[0].size()) << line[0];
  EXPECT_EQ(lines[1][0], "patch, free space");
  EXPECT_EQ(lines[2][0], "a \"quoted\" plate");
  EXPECT_EQ(lines[4][0], "sweep: dipoles, \"crossed\" (1 cases)");
}

}  // namespace
}  // namespace lobe
