#pragma once
/// A single run: one model (an antenna driven at its ports or a scatterer lit by its wave),
/// every frequency, its result files.
#include <filesystem>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include "geometry/model.hpp"
#include "post/run_record.hpp"
#include "solver/antenna_problem.hpp"
#include "study/study_control.hpp"

namespace lobe {

/// The step of the whole-sphere pattern a run writes for 3-D views (degrees): fine enough
/// to show a lobe's shape. Its 2,664 directions cost about 0.03 s a frequency on a patch of
/// 1,394 unknowns (2 cores), more than the rest of an adaptive run's frequency, and the
/// series repeat the mesh in every file: hence written only when asked for (--views).
constexpr Real sphere_step_deg = 5.0;

struct RunRequest {
  std::string model_path;
  std::vector<std::string> set_options;   ///< NAME=EXPRESSION
  std::vector<std::string> band_options;  ///< extra bands, LOW:HIGH
  std::string output_directory;           ///< empty: MODEL-STEM-results
  std::string toward;                     ///< THETA,PHI for the polarisation figures; empty: the main beam
  bool views = false;                     ///< also 3-D views: the sphere pattern and the currents as .pvd series
  FrequencySampling sampling = FrequencySampling::adaptive;
};

/// A run with everything checked that can be checked before solving: the model and its
/// overrides and bands, the mesh, the matrix memory and the output directory.
struct PreparedRun {
  std::unique_ptr<Model> model;
  std::unique_ptr<AntennaProblem> problem;
  std::filesystem::path directory;
  std::string stem;
  FigureOptions figures;
  bool views = false;
  FrequencySampling sampling = FrequencySampling::adaptive;
};

/// Throws InputError (exit 2) for anything that would make the run fail later.
PreparedRun prepare_run(const RunRequest& request);

struct RunOutcome {
  bool finished = false;                         ///< false: cancelled, nothing written
  std::vector<std::filesystem::path> written;    ///< the result files, published together
  std::string summary;                           ///< the run's summary for people
  std::string json;                              ///< the same as JSON (post/json_summary), for antennas
};

/// Solves every frequency and writes the result files: for an antenna the HDF5 file, the
/// port, pattern and current tables and the currents as VTK; for a scatterer the HDF5
/// file, the cross-section table and the currents.
RunOutcome execute_run(const PreparedRun& run, const RunInfo& info, const StudyControl& control);

}  // namespace lobe
