#include "study/frequency_loop.hpp"

#include <atomic>
#include <exception>
#include <mutex>
#ifdef _OPENMP
#include <omp.h>
#endif

#include "post/run_summary.hpp"
#include "solver/threads.hpp"
#include "study/adaptive_frequencies.hpp"

namespace lobe {
namespace {

bool inside_parallel_region() {
#ifdef _OPENMP
  return omp_in_parallel();
#else
  return false;
#endif
}

}  // namespace

bool solve_frequencies(const AntennaProblem& problem, const std::vector<std::size_t>& indices,
                       const StudyControl& control, const std::function<void(std::size_t, FrequencySolution&&)>& use) {
  const std::vector<Real>& frequencies = problem.model.frequencies_hz;
  const std::size_t count = indices.size();
  const int threads = thread_count();
  if (threads < 2 || count < 2 || problem.unknowns() > largest_problem_side_by_side || inside_parallel_region()) {
    for (std::size_t n = 0; n < count; ++n) {
      if (control.cancelled()) return false;
      const std::size_t i = indices[n];
      use(i, solve_frequency(problem, frequencies[i]));
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
#pragma omp parallel for schedule(dynamic, 1) num_threads(threads)
  for (std::size_t n = 0; n < count; ++n) {
    if (stopped.load()) continue;
    if (control.cancelled()) {
      stopped.store(true);
      continue;
    }
    try {
      const std::size_t i = indices[n];
      use(i, solve_frequency(problem, frequencies[i]));
      const std::lock_guard<std::mutex> lock(progress_guard);
      ++done;
      if (control.progress) control.progress(done, count, done, frequency_text(frequencies[i]));
    } catch (...) {
      const std::lock_guard<std::mutex> lock(progress_guard);
      if (!failure) failure = std::current_exception();
      stopped.store(true);
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
