#pragma once
/// A sweep: every case of a grid of `let` values, each saved whole as it finishes, resumable
/// after a crash or a stop, assembled into one file and ranked by a band figure.
#include <filesystem>
#include <optional>
#include <string>
#include <vector>

#include "geometry/model.hpp"
#include "post/frequency_result.hpp"
#include "study/case_grid.hpp"
#include "study/design_goal.hpp"
#include "study/study_control.hpp"

namespace lobe {

struct SweepRequest {
  std::string model_path;
  std::vector<std::string> vary_options;  ///< NAME=START:STOP:STEP or NAME=A,B,C
  std::vector<std::string> set_options;   ///< fixed overrides for every case
  std::string output;                     ///< the sweep's HDF5 file; empty: MODEL-STEM-sweep.h5
  std::string rank;                       ///< a goal to rank by (study/design_goal); empty: no ranking
  std::vector<std::string> limits;        ///< FIGURE<=BOUND or FIGURE>=BOUND, each case must meet
  std::string band;                       ///< LOW:HIGH for the ranking; default the model's first band
  std::string toward;                     ///< THETA,PHI for the polarisation figures; empty: the main beam
  FrequencySampling sampling = FrequencySampling::adaptive;
};

/// A sweep checked completely before the first solve: every case loads, the ranking band
/// lies within every case's frequencies, the outputs can be written.
struct PreparedSweep {
  SweepRequest request;
  CaseGrid grid;
  std::vector<std::vector<Real>> values_si;  ///< per case, the varied values as resolved (SI)
  std::optional<Band> band;                  ///< the ranking band, when ranking
  std::optional<DesignGoal> goal;            ///< when ranking (--rank, or worst-vswr with --limit alone)
  std::vector<DesignLimit> limits;
  FigureOptions figures;
  std::filesystem::path output;
  std::filesystem::path case_directory;      ///< OUTPUT.cases
  std::string manifest;                      ///< what identifies this sweep's cases
};

/// Throws InputError (exit 2) for anything that would stop the sweep later.
PreparedSweep prepare_sweep(const SweepRequest& request);

/// The overrides of case `index`: the fixed ones, then one per varied name.
std::vector<Override> case_overrides(const PreparedSweep& sweep, std::size_t index);

struct SweepOutcome {
  bool finished = false;  ///< false: cancelled; the finished cases are kept
  std::size_t solved = 0, skipped = 0;
  std::vector<std::filesystem::path> case_files;
};

/// Solves every case not already saved (a damaged case file is solved again), each case
/// file published whole, then writes the sweep file. Refuses a case directory that another
/// sweep is writing or that holds another sweep's cases. Throws OutputError when a write
/// fails, saying which cases are kept.
SweepOutcome execute_sweep(const PreparedSweep& sweep, const StudyControl& control);

struct RankedCase {
  std::size_t index;
  Judgement judgement;
};

/// The cases ordered best first (judged_better): those meeting every limit by the goal,
/// then the others by how far they miss; the first port's match and the beam's figures
/// over the ranking band.
std::vector<RankedCase> rank_sweep(const PreparedSweep& sweep, const std::vector<std::filesystem::path>& case_files);

}  // namespace lobe
