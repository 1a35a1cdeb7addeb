#pragma once
/// A finished sweep's summary as JSON (`lobe sweep --json`, schema
/// post/sweep_summary.schema.json): the case table, each case's band figures over the
/// ranking band (or the model's first band) and, when ranking, the order.
#include <string>
#include <vector>

#include "study/sweep_study.hpp"

namespace lobe::cli {

constexpr const char* sweep_summary_schema = "lobe-sweep-summary";
constexpr int sweep_summary_schema_version = 1;

std::string sweep_summary_json(const PreparedSweep& sweep, const SweepOutcome& outcome, const std::vector<RankedCase>& ranked);

}  // namespace lobe::cli
