#include "study/process_ranks.hpp"

#include <climits>
#include <cstdlib>
#include <initializer_list>
#include <stdexcept>

#ifdef LOBE_HAVE_MPI
// The C interface only (MPI's C++ bindings are deprecated and need their own library).
#define OMPI_SKIP_MPICXX 1
#define MPICH_SKIP_MPICXX 1
#include <mpi.h>
#endif

namespace lobe {
namespace {

bool g_started = false;
int g_rank = 0, g_count = 1, g_local = 1;

/// Whether a launcher started this process as one of a job: each MPI implementation's
/// launcher sets its own rank variable.
bool launched_as_rank() {
  for (const char* name : {"OMPI_COMM_WORLD_RANK", "PMI_RANK", "PMIX_RANK"})
    if (std::getenv(name) != nullptr) return true;
  return false;
}

}  // namespace

ProcessRanks::ProcessRanks([[maybe_unused]] int* argc, [[maybe_unused]] char*** argv) {
#ifdef LOBE_HAVE_MPI
  if (!launched_as_rank()) return;
  int provided = 0;
  // Only the main thread calls MPI; OpenMP's threads never do.
  MPI_Init_thread(argc, argv, MPI_THREAD_FUNNELED, &provided);
  g_started = true;
  MPI_Comm_rank(MPI_COMM_WORLD, &g_rank);
  MPI_Comm_size(MPI_COMM_WORLD, &g_count);
  MPI_Comm local;
  MPI_Comm_split_type(MPI_COMM_WORLD, MPI_COMM_TYPE_SHARED, g_rank, MPI_INFO_NULL, &local);
  MPI_Comm_size(local, &g_local);
  MPI_Comm_free(&local);
#endif
}

ProcessRanks::~ProcessRanks() {
#ifdef LOBE_HAVE_MPI
  if (g_started) MPI_Finalize();
#endif
}

int process_rank() { return g_rank; }
int process_count() { return g_count; }
int processes_on_this_machine() { return g_local; }

void wait_for_all_processes() {
#ifdef LOBE_HAVE_MPI
  if (g_started) MPI_Barrier(MPI_COMM_WORLD);
#endif
}

bool any_process(bool flag) {
#ifdef LOBE_HAVE_MPI
  if (g_started) {
    int local = flag ? 1 : 0, global = 0;
    MPI_Allreduce(&local, &global, 1, MPI_INT, MPI_MAX, MPI_COMM_WORLD);
    return global != 0;
  }
#endif
  return flag;
}

std::size_t sum_over_processes(std::size_t value) {
#ifdef LOBE_HAVE_MPI
  if (g_started) {
    unsigned long long local = value, global = 0;
    MPI_Allreduce(&local, &global, 1, MPI_UNSIGNED_LONG_LONG, MPI_SUM, MPI_COMM_WORLD);
    return static_cast<std::size_t>(global);
  }
#endif
  return value;
}

std::vector<std::vector<double>> gather_from_all_processes(const std::vector<double>& mine) {
#ifdef LOBE_HAVE_MPI
  if (g_started && g_count > 1) {
    // Sizes first, then the values into one buffer (MPI counts in int).
    long long size = static_cast<long long>(mine.size());
    std::vector<long long> sizes(static_cast<std::size_t>(g_count));
    MPI_Allgather(&size, 1, MPI_LONG_LONG, sizes.data(), 1, MPI_LONG_LONG, MPI_COMM_WORLD);
    std::vector<int> counts, offsets;
    long long total = 0;
    for (long long n : sizes) {
      if (total + n > INT_MAX) throw std::runtime_error("too much to exchange between processes in one message");
      counts.push_back(static_cast<int>(n));
      offsets.push_back(static_cast<int>(total));
      total += n;
    }
    std::vector<double> all(static_cast<std::size_t>(total));
    MPI_Allgatherv(mine.data(), static_cast<int>(mine.size()), MPI_DOUBLE, all.data(), counts.data(), offsets.data(),
                   MPI_DOUBLE, MPI_COMM_WORLD);
    std::vector<std::vector<double>> out;
    for (int r = 0; r < g_count; ++r)
      out.emplace_back(all.begin() + offsets[static_cast<std::size_t>(r)],
                       all.begin() + offsets[static_cast<std::size_t>(r)] + counts[static_cast<std::size_t>(r)]);
    return out;
  }
#endif
  return {mine};
}

int end_all_processes(int code) {
#ifdef LOBE_HAVE_MPI
  if (g_started && g_count > 1) MPI_Abort(MPI_COMM_WORLD, code);
#endif
  return code;
}

}  // namespace lobe
