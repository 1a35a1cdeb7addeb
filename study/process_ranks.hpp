#pragma once
/// The processes a sweep is spread over. One, unless lobe was built with MPI and started by
/// mpirun (or another launcher that sets Open MPI's, MPICH's or PMIx's rank variables);
/// then every process runs the same command and the sweep shares its cases among them.
#include <cstddef>
#include <vector>

namespace lobe {

/// Starts MPI when launched by mpirun; finishes it when destroyed. One per program, in main.
class ProcessRanks {
 public:
  ProcessRanks(int* argc, char*** argv);
  ~ProcessRanks();
  ProcessRanks(const ProcessRanks&) = delete;
  ProcessRanks& operator=(const ProcessRanks&) = delete;
};

/// This process's rank (0 without MPI) and the number of processes (1 without MPI).
int process_rank();
int process_count();
/// Processes of this job on this machine (they share its cores).
int processes_on_this_machine();
/// Waits until every process has called it.
void wait_for_all_processes();
/// True on every process when `flag` is true on any.
bool any_process(bool flag);
/// The sum of `value` over the processes, on every process.
std::size_t sum_over_processes(std::size_t value);
/// Every process's `mine`, in rank order, on every process (just `mine` without MPI).
std::vector<std::vector<double>> gather_from_all_processes(const std::vector<double>& mine);
/// Ends every process of the job with `code` (after an error one of them cannot recover
/// from while the others may be waiting for it); returns `code` without MPI.
int end_all_processes(int code);

}  // namespace lobe
