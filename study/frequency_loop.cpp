#include "study/frequency_loop.hpp"

#include <atomic>
#include <exception>
#include <map>
#include <memory>
#include <mutex>
#include <stdexcept>
#ifdef _OPENMP
#include <omp.h>
#endif

#include "post/run_summary.hpp"
#include "solver/system_matrix.hpp"
#include "solver/threads.hpp"
#include "study/adaptive_frequencies.hpp"
#include "study/process_ranks.hpp"
#include "study/solution_packing.hpp"

namespace lobe {
namespace {

bool inside_parallel_region() {
#ifdef _OPENMP
  return omp_in_parallel();
#else
  return false;
#endif
}

/// solve_frequencies over several processes: each solves every process_count()-th of the
/// indices, then all exchange their solutions, and every process hands every solution to
/// `use`, in the order of `indices`. A failure or a cancellation on one process ends the
/// set on all, after the exchange (which every process must reach).
bool solve_frequencies_shared(const AntennaProblem& problem, const std::vector<std::size_t>& indices,
                              const StudyControl& control,
                              const std::function<void(std::size_t, FrequencySolution&&)>& use) {
  const auto count = static_cast<std::size_t>(process_count()), rank = static_cast<std::size_t>(process_rank());
  std::vector<std::size_t> mine;
  for (std::size_t n = rank; n < indices.size(); n += count) mine.push_back(indices[n]);
  StudyControl alone = control;
  alone.share_frequencies = false;
  alone.progress = nullptr;
  std::map<std::size_t, FrequencySolution> solved;
  std::mutex guard;
  bool whole = false;
  std::exception_ptr failure;
  try {
    whole = solve_frequencies(problem, mine, alone, [&](std::size_t i, FrequencySolution&& s) {
      const std::lock_guard<std::mutex> lock(guard);
      solved.emplace(i, std::move(s));
    });
  } catch (...) {
    failure = std::current_exception();
  }
  // [failed, whole, solutions, then index and solution for each]
  std::vector<double> packed{failure ? 1.0 : 0.0, whole ? 1.0 : 0.0, static_cast<double>(solved.size())};
  for (const auto& [index, solution] : solved) {
    packed.push_back(static_cast<double>(index));
    pack_solution(solution, packed);
  }
  const std::vector<std::vector<double>> all = gather_from_all_processes(packed);
  if (failure) std::rethrow_exception(failure);
  std::map<std::size_t, FrequencySolution> everything;
  bool every_whole = true;
  for (const std::vector<double>& from : all) {
    if (from.size() < 3) throw std::runtime_error("a process sent no solutions");
    if (from[0] != 0.0) throw std::runtime_error("another process of this job failed in this case (its message is above)");
    every_whole = every_whole && from[1] != 0.0;
    std::size_t at = 3;
    for (std::size_t k = 0; k < static_cast<std::size_t>(from[2]); ++k) {
      const auto index = static_cast<std::size_t>(from.at(at++));
      everything.emplace(index, unpack_solution(from, at));
    }
  }
  if (!every_whole) return false;
  for (std::size_t n = 0; n < indices.size(); ++n) {
    const auto found = everything.find(indices[n]);
    if (found == everything.end()) throw std::runtime_error("a frequency's solution went missing between processes");
    const Real frequency = found->second.frequency_hz;
    use(indices[n], std::move(found->second));
    if (control.progress) control.progress(n + 1, indices.size(), mine.size(), frequency_text(frequency));
  }
  return true;
}

}  // namespace

bool solve_frequencies(const AntennaProblem& problem, const std::vector<std::size_t>& indices,
                       const StudyControl& control, const std::function<void(std::size_t, FrequencySolution&&)>& use) {
  if (control.share_frequencies && process_count() > 1) return solve_frequencies_shared(problem, indices, control, use);
  const std::vector<Real>& frequencies = problem.model.frequencies_hz;
  const std::size_t count = indices.size();
  const int threads = thread_count();
  if (count == 0) return true;
  if (threads < 2 || count < 2 || problem.unknowns() > largest_problem_side_by_side || inside_parallel_region()) {
    const std::unique_ptr<SystemMatrix> matrix = make_system_matrix(problem.model, problem.unknowns());
    for (std::size_t n = 0; n < count; ++n) {
      if (control.cancelled()) return false;
      const std::size_t i = indices[n];
      use(i, solve_frequency(problem, frequencies[i], *matrix));
      if (control.progress) control.progress(n + 1, count, n + 1, frequency_text(frequencies[i]));
    }
    return true;
  }
  // Side by side, one thread each (OpenMP and BLAS alike, for the duration).
  set_thread_count(1);
  std::atomic<bool> stopped{false};
  std::mutex progress_guard;
  std::size_t done = 0;
  std::exception_ptr failure;
#pragma omp parallel num_threads(threads)
  {
    std::unique_ptr<SystemMatrix> matrix;  // one a thread, made at its first frequency
#pragma omp for schedule(dynamic, 1)
    for (std::size_t n = 0; n < count; ++n) {
      if (stopped.load()) continue;
      if (control.cancelled()) {
        stopped.store(true);
        continue;
      }
      try {
        const std::size_t i = indices[n];
        if (!matrix) matrix = make_system_matrix(problem.model, problem.unknowns());
        use(i, solve_frequency(problem, frequencies[i], *matrix));
        const std::lock_guard<std::mutex> lock(progress_guard);
        ++done;
        if (control.progress) control.progress(done, count, done, frequency_text(frequencies[i]));
      } catch (...) {
        const std::lock_guard<std::mutex> lock(progress_guard);
        if (!failure) failure = std::current_exception();
        stopped.store(true);
      }
    }
  }
  set_thread_count(threads);
  if (failure) std::rethrow_exception(failure);
  return !stopped.load();
}

bool solve_each_frequency(const AntennaProblem& problem, const StudyControl& control,
                          const std::function<void(std::size_t, FrequencySolution&&)>& use, FrequencySampling sampling) {
  const std::size_t count = problem.model.frequencies_hz.size();
  if (sampling == FrequencySampling::adaptive && count >= fewest_adaptive_frequencies)
    return solve_adaptively(problem, control, use);
  std::vector<std::size_t> all(count);
  for (std::size_t i = 0; i < count; ++i) all[i] = i;
  return solve_frequencies(problem, all, control, use);
}

}  // namespace lobe
