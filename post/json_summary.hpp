#pragma once
/// A run's summary as JSON, for scripts: the same figures the printed summary shows, in SI
/// units, under a named and versioned schema (post/run_summary.schema.json).
#include <string>

#include "post/run_record.hpp"

namespace lobe {

/// The schema's name and version, written into every document; a reader refuses a newer
/// major version.
constexpr const char* run_summary_schema = "lobe-run-summary";
constexpr int run_summary_schema_version = 2;

/// Per frequency: each port's impedance, VSWR and return loss, and the beam's figures; per
/// band (the model's and --band's): each port's match figures and each beam figure at the
/// band's centre and worst; the warnings. A figure that is not defined is null.
std::string run_summary_json(const RunRecord& run);

}  // namespace lobe
