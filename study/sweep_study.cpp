#include "study/sweep_study.hpp"

#include <algorithm>
#include <exception>
#include <fstream>
#include <optional>
#include <set>
#include <sstream>

#include "core/output_error.hpp"
#include "post/band_report.hpp"
#include "post/hdf5_writer.hpp"
#include "post/output_files.hpp"
#include "post/result_reader.hpp"
#include "post/sweep_file.hpp"
#include "solver/threads.hpp"
#include "study/frequency_loop.hpp"
#include "study/model_loading.hpp"
#include "study/output_checks.hpp"
#include "study/process_ranks.hpp"

namespace lobe {
namespace {

/// What identifies a sweep: the model text, the fixed overrides and every case. A case
/// directory left by another sweep must not be mixed into this one.
std::string manifest(const std::string& model_text, const SweepRequest& request, const CaseGrid& grid) {
  std::ostringstream m;
  m << "lobe sweep cases\nmodel:\n" << model_text << "\nfixed:";
  for (const auto& s : request.set_options) m << ' ' << s;
  // Solving every frequency gives other numbers than the adaptive sweep's interpolants.
  if (request.sampling == FrequencySampling::every) m << "\nevery frequency solved";
  // The polarisation figures stored with each case are taken there.
  if (!request.toward.empty()) m << "\npolarisation toward " << request.toward;
  m << "\nvaried:";
  for (const auto& v : grid.varied) m << ' ' << v.name;
  m << '\n';
  for (std::size_t c = 0; c < grid.size(); ++c) {
    m << case_name(c);
    for (const auto& value : grid.values[c]) m << ' ' << value;
    m << '\n';
  }
  return m.str();
}

/// Creates the case directory, or checks that the one there holds this sweep's cases.
void claim_case_directory(const PreparedSweep& sweep) {
  const auto manifest_path = sweep.case_directory / "manifest.txt";
  if (std::filesystem::exists(manifest_path)) {
    std::ifstream in(manifest_path, std::ios::binary);
    std::ostringstream found;
    found << in.rdbuf();
    if (found.str() != sweep.manifest)
      throw InputError({sweep.output.string(), 1, 1}, "'" + sweep.case_directory.string() +
                                                          "' holds the cases of a different sweep; remove it or choose "
                                                          "another -o");
  } else {
    OutputFiles files(sweep.case_directory);
    files.stage_text("manifest.txt", sweep.manifest);
    files.commit();
  }
}

/// Whether case file `path` is there and reads; a damaged one is removed (and reported).
bool saved_whole(const std::filesystem::path& path, const StudyControl& control) {
  if (!std::filesystem::exists(path)) return false;
  // Published whole by rename, a case file can still be damaged afterwards (a disk error,
  // a copy cut short): a file that does not read is named and solved again.
  try {
    read_result_network(path);
    return true;
  } catch (const InputError& e) {
    if (control.notice) control.notice(path.string() + " is damaged (" + e.what() + "); solving it again");
    std::filesystem::remove(path);
    return false;
  }
}

}  // namespace

std::vector<Override> case_overrides(const PreparedSweep& sweep, std::size_t index) {
  return overrides_with(sweep.request.set_options, sweep.grid.names(), sweep.grid.values[index]);
}

PreparedSweep prepare_sweep(const SweepRequest& request) {
  PreparedSweep sweep;
  sweep.request = request;
  sweep.grid = case_grid(request.vary_options);
  sweep.figures = figure_options(request.toward);
  for (std::size_t i = 0; i < request.limits.size(); ++i)
    sweep.limits.push_back(parse_design_limit(request.limits[i], static_cast<int>(i) + 1));
  if (!request.rank.empty() || !sweep.limits.empty())
    sweep.goal = parse_design_goal(request.rank.empty() ? "worst-vswr" : request.rank, "--rank");
  // Every case must load, and the ranking band must lie within every case's frequencies,
  // before any is solved: a bad value is an input error now, not hours into the night.
  std::string model_text;
  for (std::size_t c = 0; c < sweep.grid.size(); ++c) {
    const Model model = load_model(request.model_path, case_overrides(sweep, c));
    if (model.wave) throw InputError({request.model_path, 1, 1}, "sweeps solve antennas driven by ports, not plane waves");
    if (sweep.goal) {
      const Band band = judged_band(model, request.band);
      if (!sweep.band) sweep.band = band;
    }
    model_text = model.text;
    std::vector<Real> values;
    for (const auto& v : sweep.grid.varied)
      for (const auto& r : model.values)
        if (r.name == v.name) values.push_back(r.value);
    sweep.values_si.push_back(values);
  }
  const std::string stem = std::filesystem::path(request.model_path).stem().string();
  sweep.output = request.output.empty() ? std::filesystem::path(stem + "-sweep.h5") : std::filesystem::path(request.output);
  check_output_file(sweep.output);
  sweep.case_directory = sweep.output.string() + ".cases";
  check_output_directory(sweep.case_directory);
  sweep.manifest = manifest(model_text, request, sweep.grid);
  return sweep;
}

namespace {

/// The unknowns of case c, which decide how the sweep's cases share the cores.
int case_unknowns(const PreparedSweep& sweep, std::size_t c) {
  const Model model = load_model(sweep.request.model_path, case_overrides(sweep, c));
  return AntennaProblem(model).unknowns();
}

}  // namespace

SweepOutcome execute_sweep(const PreparedSweep& sweep, const StudyControl& control) {
  const std::filesystem::path directory =
      sweep.output.has_parent_path() ? sweep.output.parent_path() : std::filesystem::path(".");
  // Under MPI the first process speaks for the job: it holds the directory's lock, checks
  // the manifest, clears a killed run's leftovers and the damaged cases; the others look
  // at the cases after it (an error on it ends them all: see end_all_processes).
  const bool first_process = process_rank() == 0;
  std::optional<DirectoryLock> lock;
  if (first_process) {
    std::filesystem::create_directories(sweep.case_directory);
    lock.emplace(sweep.case_directory);
    if (!lock->held())
      throw InputError({sweep.output.string(), 1, 1}, "another sweep is writing into '" + sweep.case_directory.string() +
                                                          "' now; wait for it to finish or choose another -o");
    claim_case_directory(sweep);
    // Half-written cases of a sweep that was killed: never published, safe to remove.
    remove_dead_temporaries(sweep.case_directory);
    remove_dead_temporaries(directory);
  }
  SweepOutcome outcome;
  const std::size_t total = sweep.grid.size();
  std::vector<std::size_t> pending;
  const auto find_pending = [&] {
    for (std::size_t c = 0; c < total; ++c) {
      outcome.case_files.push_back(sweep.case_directory / (case_name(c) + ".h5"));
      if (saved_whole(outcome.case_files.back(), control))
        ++outcome.skipped;
      else
        pending.push_back(c);
    }
  };
  if (first_process) find_pending();
  wait_for_all_processes();
  if (!first_process) find_pending();
  // Each process takes every count-th pending case; with fewer cases than processes, every
  // process takes every case and they share each case's frequencies instead (the first
  // process writes the case files).
  const auto processes = static_cast<std::size_t>(process_count());
  const bool share_frequencies = processes > 1 && pending.size() < processes;
  if (!share_frequencies) {
    std::vector<std::size_t> mine;
    for (std::size_t k = 0; k < pending.size(); ++k)
      if (k % processes == static_cast<std::size_t>(process_rank())) mine.push_back(pending[k]);
    pending = std::move(mine);
  }
  const bool writes_cases = !share_frequencies || first_process;

  // Small cases run side by side, one thread each: threads inside a case that solves in
  // milliseconds cost more than they save (a 192-unknown case ran faster on one thread
  // than on two). Large ones run one after another with every thread inside. Cases whose
  // frequencies are shared run one after another: only the main thread may exchange them.
  const int threads = thread_count();
  const bool side_by_side = threads > 1 && pending.size() > 1 && !share_frequencies &&
                            case_unknowns(sweep, pending.front()) <= largest_problem_side_by_side;
  if (side_by_side) set_thread_count(1);
  std::set<std::string> warned;  // each distinct mesh warning once, not once per case
  bool estimated = false, stopped = false;
  std::exception_ptr failure;
#pragma omp parallel for schedule(dynamic, 1) num_threads(side_by_side ? threads : 1)
  for (std::size_t k = 0; k < pending.size(); ++k) {
    bool skip;
#pragma omp critical(lobe_sweep_state)
    skip = stopped || failure;
    // Sharing, every process must go on or stop alike (a case file the first could not
    // write stops it alone), or the others would wait for it in the next exchange.
    if (share_frequencies) skip = any_process(skip);
    if (skip) continue;
    try {
      const std::size_t c = pending[k];
      const Model model = load_model(sweep.request.model_path, case_overrides(sweep, c));
      const AntennaProblem problem(model);
      require_solvable(problem);
#pragma omp critical(lobe_sweep_state)
      {
        if (!estimated && control.workload)
          control.workload(problem.unknowns(), static_cast<double>(model.frequencies_hz.size() * (pending.size() - k)) /
                                                   (side_by_side ? threads : 1));
        estimated = true;
        for (const auto* list : {&problem.mesh.warnings, &problem.surfaces.warnings})
          for (const auto& w : *list)
            if (warned.insert(w.formatted()).second && control.warning) control.warning(w, case_name(c));
      }
      std::string command = "lobe sweep case " + case_name(c) + ":";
      for (const auto& o : case_overrides(sweep, c)) command += " --set " + o.name + "=" + o.expression;
      RunRecord run{problem, {}, {LOBE_VERSION, thread_count(), command, std::nullopt}};
      run.info.processes = share_frequencies ? process_count() : 1;
      run.results.resize(model.frequencies_hz.size());
      const bool whole = solve_each_frequency(
          problem, {control.cancel, {}, {}, {}, {}, share_frequencies},
          [&](std::size_t index, FrequencySolution&& s) {
            if (writes_cases) run.results[index] = evaluate_frequency(problem, s, sweep.figures);
          },
          sweep.request.sampling);
#pragma omp critical(lobe_sweep_state)
      {
        if (!whole) {
          stopped = true;
        } else if (writes_cases) {
          // HDF5 is not built to be called from two threads at once.
          OutputFiles files(sweep.case_directory);
          write_hdf5(files.staging_path(case_name(c) + ".h5"), run);
          files.commit();
          ++outcome.solved;
          if (control.progress) control.progress(outcome.solved + outcome.skipped, total, outcome.solved, "");
        }
      }
    } catch (const OutputError& e) {
#pragma omp critical(lobe_sweep_state)
      if (!failure)
        failure = std::make_exception_ptr(OutputError(
            std::string(e.what()) + "; the " + std::to_string(outcome.solved + outcome.skipped) +
            " finished cases are kept in " + sweep.case_directory.string() +
            ": make room and run the same command again to go on"));
    } catch (...) {
#pragma omp critical(lobe_sweep_state)
      if (!failure) failure = std::current_exception();
    }
  }
  if (side_by_side) set_thread_count(threads);
  // Every process reaches these two before any rethrows or returns.
  const bool any_stopped = any_process(stopped || failure);
  const std::size_t solved_here = outcome.solved;
  outcome.solved = sum_over_processes(solved_here);
  if (failure) std::rethrow_exception(failure);
  if (any_stopped) {
    outcome.solved = solved_here;
    return outcome;
  }
  // The first process assembles the sweep file from every process's cases.
  if (!first_process) {
    outcome.finished = true;
    return outcome;
  }
  SweepTable table{sweep.grid.names(), sweep.grid.values, sweep.grid.labels, sweep.values_si};
  try {
    OutputFiles files(directory);
    write_sweep_hdf5(files.staging_path(sweep.output.filename().string()), table, outcome.case_files);
    files.commit();
  } catch (const OutputError& e) {
    throw OutputError(std::string(e.what()) + "; all " + std::to_string(total) + " cases are kept in " +
                      sweep.case_directory.string() + ": make room and run the same command again to assemble them");
  }
  outcome.finished = true;
  return outcome;
}

std::vector<RankedCase> rank_sweep(const PreparedSweep& sweep, const std::vector<std::filesystem::path>& case_files) {
  const DesignGoal& goal = *sweep.goal;
  const bool beam = goal.needs_beam() || std::any_of(sweep.limits.begin(), sweep.limits.end(),
                                                     [](const DesignLimit& l) { return l.needs_beam(); });
  std::vector<RankedCase> ranked;
  for (std::size_t c = 0; c < case_files.size(); ++c) {
    ranked.push_back({c, judge(goal, sweep.limits, read_result_band_figures(case_files[c], "", *sweep.band, beam))});
  }
  std::stable_sort(ranked.begin(), ranked.end(), [&](const RankedCase& a, const RankedCase& b) {
    return judged_better(a.judgement, b.judgement, sweep.limits);
  });
  return ranked;
}


}  // namespace lobe
