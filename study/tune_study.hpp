#pragma once
/// Tuning: a bounded search over `let` values for the best band figure of the first port,
/// and the model written with the values found.
#include <filesystem>
#include <optional>
#include <string>
#include <vector>

#include "geometry/model_parser.hpp"
#include "post/frequency_result.hpp"
#include "study/design_goal.hpp"
#include "study/study_control.hpp"

namespace lobe {

struct TuneRequest {
  std::string model_path;
  std::vector<std::string> vary_options;  ///< NAME=MIN:MAX
  std::vector<std::string> set_options;
  std::string goal = "worst-vswr";        ///< a goal (study/design_goal): a band figure or a weighted sum
  std::vector<std::string> limits;        ///< FIGURE<=BOUND or FIGURE>=BOUND the result must meet
  std::string toward;                     ///< THETA,PHI for the polarisation figures; empty: the main beam
  std::string band;                       ///< LOW:HIGH; default the model's first band
  std::string output;                     ///< the tuned model; empty: MODEL-STEM-tuned.lobe; "-": written nowhere
  int evaluations = 60;
};

/// A search checked before the first solve: both ends of every range load, the band lies
/// within the frequencies at both ends, the output can be written.
struct PreparedTuning {
  TuneRequest request;
  std::vector<TunedName> tuned;
  Band band;
  std::filesystem::path output;
  DesignGoal goal;
  std::vector<DesignLimit> limits;
  FigureOptions figures;
};

/// Throws InputError (exit 2) for anything that would stop the search later.
PreparedTuning prepare_tuning(const TuneRequest& request);

struct TuneOutcome {
  bool finished = true;                  ///< false: cancelled; the best so far is written, if any
  Judgement best;                        ///< the goal's value and the limits' misses there
  std::vector<Real> best_si;             ///< the tuned values there, SI
  std::vector<std::string> at_bounds;    ///< tuned names that ended on a bound of their range
  int evaluations = 0;
  std::filesystem::path written;         ///< the tuned model ("-": only in `text`)
  std::string text;                      ///< the tuned model's text
};

/// Searches on the unit box of the ranges with NLopt: BOBYQA (Powell 2009: bounded,
/// derivative-free) without limits, COBYLA (Powell 1994: derivative-free, with each limit
/// as an inequality constraint) with them. Reports each evaluation as progress and writes
/// the model of the best evaluation (judged_better: meeting every limit first) with every
/// overridden value (tuned or fixed by --set) filled in, in the model's own units. When
/// cancelled (at the next frequency), the best of the finished evaluations is written.
TuneOutcome execute_tuning(const PreparedTuning& tuning, const StudyControl& control);

}  // namespace lobe
