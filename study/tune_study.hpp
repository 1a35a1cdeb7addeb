#pragma once
/// Tuning: a bounded search over `let` values for the best band figure of the first port,
/// and the model written with the values found.
#include <filesystem>
#include <optional>
#include <string>
#include <vector>

#include "geometry/model_parser.hpp"
#include "study/study_control.hpp"

namespace lobe {

struct TuneRequest {
  std::string model_path;
  std::vector<std::string> vary_options;  ///< NAME=MIN:MAX
  std::vector<std::string> set_options;
  std::string goal = "worst-vswr";        ///< worst-vswr, mean-vswr or mean-mismatch-loss
  std::string band;                       ///< LOW:HIGH; default the model's first band
  std::string output;                     ///< the tuned model; empty: MODEL-STEM-tuned.lobe
  int evaluations = 60;
};

/// A search checked before the first solve: both ends of every range load, the band lies
/// within the frequencies at both ends, the output can be written.
struct PreparedTuning {
  TuneRequest request;
  std::vector<TunedName> tuned;
  Band band;
  std::filesystem::path output;
};

/// Throws InputError (exit 2) for anything that would stop the search later.
PreparedTuning prepare_tuning(const TuneRequest& request);

struct TuneOutcome {
  bool finished = true;                  ///< false: cancelled; the best so far is written, if any
  Real best = 0.0;                       ///< the goal's best value
  std::vector<Real> best_si;             ///< the tuned values there, SI
  int evaluations = 0;
  std::filesystem::path written;         ///< the tuned model
};

/// Searches with NLopt's BOBYQA (Powell 2009: bounded, derivative-free) on the unit box of
/// the ranges, reports each evaluation as progress, and writes the model with every
/// overridden value (tuned or fixed by --set) filled in, in the model's own units. When
/// cancelled (at the next frequency), the best of the finished evaluations is written.
TuneOutcome execute_tuning(const PreparedTuning& tuning, const StudyControl& control);

}  // namespace lobe
