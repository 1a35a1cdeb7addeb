#include "study/run_study.hpp"

#include <cstdio>

#include "post/csv_writer.hpp"
#include "post/hdf5_writer.hpp"
#include "post/json_summary.hpp"
#include "post/output_files.hpp"
#include "post/run_summary.hpp"
#include "post/scattering_result.hpp"
#include "post/vtk_writer.hpp"
#include "study/frequency_loop.hpp"
#include "study/model_loading.hpp"
#include "study/output_checks.hpp"

namespace lobe {
namespace {

/// "007": the number of a frequency in a file series.
std::string step_text(std::size_t index) {
  char text[24];
  std::snprintf(text, sizeof text, "%03zu", index);
  return text;
}

/// Solves every frequency into `run`, then publishes the files `write` stages, the currents
/// as VTK, and the summary. Antennas and scatterers differ only in what they evaluate and write.
template <class Run, class Evaluate, class Write, class Summary>
RunOutcome solve_and_publish(const PreparedRun& prepared, Run& run, const StudyControl& control,
                             FrequencySampling sampling, Evaluate evaluate, Write write, Summary summary) {
  const AntennaProblem& problem = *prepared.problem;
  RunOutcome outcome;
  run.results.resize(problem.model.frequencies_hz.size());
  outcome.finished = solve_each_frequency(
      problem, control, [&](std::size_t index, FrequencySolution&& solution) { run.results[index] = evaluate(problem, solution); },
      sampling);
  if (!outcome.finished) return outcome;
  OutputFiles files(prepared.directory);
  write(files, prepared.stem, run);
  // The currents' magnitudes at every frequency on one grid; with 3-D views, also as vectors
  // in a series over frequency, one grid per frequency and a .pvd.
  std::vector<CellValues> magnitudes;
  for (const auto& r : run.results) magnitudes.push_back(current_cells(r.frequency_hz, r.segment_currents, r.surface_currents));
  write_model_vtu(files.staging_path(prepared.stem + "_currents.vtu"), problem.mesh, problem.surfaces, magnitudes);
  if (prepared.views) {
    std::vector<std::pair<Real, std::string>> series;
    for (std::size_t k = 0; k < run.results.size(); ++k) {
      const auto& r = run.results[k];
      const std::string name = prepared.stem + "_currents_" + step_text(k) + ".vtu";
      write_model_vtu(files.staging_path(name), problem.mesh, problem.surfaces,
                      current_vector_cells(problem.mesh, r.segment_currents, r.surface_currents));
      series.emplace_back(r.frequency_hz, name);
    }
    write_pvd(files.staging_path(prepared.stem + "_currents.pvd"), series);
  }
  outcome.written = files.commit();
  outcome.summary = summary(run);
  return outcome;
}

/// The far field over the whole sphere per frequency, drawn around the structure at about
/// its own size, and the .pvd of the series.
void write_pattern_series(OutputFiles& files, const std::string& stem, const RunRecord& run) {
  Eigen::AlignedBox3d box;
  for (const auto& node : run.problem.mesh.nodes) box.extend(node.position);
  for (const auto& vertex : run.problem.surfaces.mesh.vertices) box.extend(vertex);
  const Vec3 centre = box.isEmpty() ? Vec3(Vec3::Zero()) : Vec3(box.center());
  const Real radius = box.isEmpty() ? 1.0 : std::max(0.6 * box.diagonal().norm(), 1e-3);
  std::vector<std::pair<Real, std::string>> series;
  for (std::size_t k = 0; k < run.results.size(); ++k) {
    const std::string name = stem + "_pattern_3d_" + step_text(k) + ".vtu";
    write_pattern_vtu(files.staging_path(name), run.results[k].sphere, centre, radius);
    series.emplace_back(run.results[k].frequency_hz, name);
  }
  write_pvd(files.staging_path(stem + "_pattern_3d.pvd"), series);
}

void write_antenna_files(OutputFiles& files, const std::string& stem, const RunRecord& run) {
  write_hdf5(files.staging_path(stem + ".h5"), run);
  write_ports_csv(files.staging_path(stem + "_ports.csv"), run);
  if (!run.problem.network.antenna_ends().empty())
    write_antenna_ends_csv(files.staging_path(stem + "_antenna_ends.csv"), run);
  write_pattern_csv(files.staging_path(stem + "_pattern.csv"), run);
  write_currents_csv(files.staging_path(stem + "_currents.csv"), run);
  if (!run.results.empty() && !run.results.front().sphere.thetas.empty()) write_pattern_series(files, stem, run);
}

void write_scattering_files(OutputFiles& files, const std::string& stem, const ScatteringRun& run) {
  write_scattering_hdf5(files.staging_path(stem + ".h5"), run);
  write_scattering_csv(files.staging_path(stem + "_rcs.csv"), run);
}

}  // namespace

PreparedRun prepare_run(const RunRequest& request) {
  PreparedRun run;
  run.model = std::make_unique<Model>(load_model(request.model_path, request.set_options));
  for (std::size_t i = 0; i < request.band_options.size(); ++i)
    run.model->bands.push_back(parse_band_option(request.band_options[i], static_cast<int>(i) + 1));
  run.stem = std::filesystem::path(request.model_path).stem().string();
  run.directory = request.output_directory.empty() ? std::filesystem::path(run.stem + "-results")
                                                   : std::filesystem::path(request.output_directory);
  run.sampling = request.sampling;
  run.figures = figure_options(request.toward);
  run.views = request.views;
  if (request.views) run.figures.sphere_step_deg = sphere_step_deg;
  run.problem = std::make_unique<AntennaProblem>(*run.model);
  require_solvable(*run.problem);
  check_output_directory(run.directory);
  remove_dead_temporaries(run.directory);  // left by a run that was killed
  return run;
}

RunOutcome execute_run(const PreparedRun& run, const RunInfo& info, const StudyControl& control) {
  if (run.model->wave) {
    ScatteringRun scattering{*run.problem, {}, info};
    return solve_and_publish(run, scattering, control, FrequencySampling::every, evaluate_scattering, write_scattering_files, scattering_summary);
  }
  RunRecord antenna{*run.problem, {}, info};
  const auto evaluate = [&](const AntennaProblem& problem, const FrequencySolution& solution) {
    return evaluate_frequency(problem, solution, run.figures);
  };
  RunOutcome outcome = solve_and_publish(run, antenna, control, run.sampling, evaluate, write_antenna_files, run_summary);
  if (outcome.finished) outcome.json = run_summary_json(antenna);
  return outcome;
}

}  // namespace lobe
