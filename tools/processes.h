// The processes of one run: a single process, or the ranks of an MPI run when the program is
// built with -DSTANDFAST_MPI=ON (`mpirun -np K standfast odds ...`). The engine splits every
// batch of seasons over the ranks and the integer tallies are added here, so every rank holds
// the totals of a one-process run; rank 0 alone writes the output.
#ifndef STANDFAST_TOOLS_PROCESSES_H
#define STANDFAST_TOOLS_PROCESSES_H

#include <cstdint>
#include <vector>

namespace standfast::tools {

// MPI_Init and MPI_Finalize around main (nothing without MPI).
class ProcessGroup {
 public:
  ProcessGroup(int* argc, char*** argv);
  ~ProcessGroup();
  ProcessGroup(const ProcessGroup&) = delete;
  ProcessGroup& operator=(const ProcessGroup&) = delete;
};

int process_rank();   // 0 without MPI
int process_count();  // 1 without MPI

// Replaces `counts` in every process by the element-wise sum over the processes (an MPI
// all-reduce of unsigned 64-bit integers; exact in any order).
void sum_over_processes(std::vector<std::uint64_t>& counts);

}  // namespace standfast::tools

#endif  // STANDFAST_TOOLS_PROCESSES_H
