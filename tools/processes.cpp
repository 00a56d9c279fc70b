#include "tools/processes.h"

#include <climits>
#include <stdexcept>

#ifdef STANDFAST_MPI
#include <mpi.h>
#endif

namespace standfast::tools {

#ifdef STANDFAST_MPI

ProcessGroup::ProcessGroup(int* argc, char*** argv) { MPI_Init(argc, argv); }

ProcessGroup::~ProcessGroup() {
  int finalized = 0;
  MPI_Finalized(&finalized);
  if (!finalized) MPI_Finalize();
}

int process_rank() {
  int rank = 0;
  MPI_Comm_rank(MPI_COMM_WORLD, &rank);
  return rank;
}

int process_count() {
  int size = 1;
  MPI_Comm_size(MPI_COMM_WORLD, &size);
  return size;
}

void sum_over_processes(std::vector<std::uint64_t>& counts) {
  if (counts.size() > static_cast<std::size_t>(INT_MAX))
    throw std::length_error("sum_over_processes: too many counts for one MPI call");
  if (MPI_Allreduce(MPI_IN_PLACE, counts.data(), static_cast<int>(counts.size()), MPI_UINT64_T,
                    MPI_SUM, MPI_COMM_WORLD) != MPI_SUCCESS)
    throw std::runtime_error("sum_over_processes: MPI_Allreduce failed");
}

#else

ProcessGroup::ProcessGroup(int*, char***) {}
ProcessGroup::~ProcessGroup() = default;
int process_rank() { return 0; }
int process_count() { return 1; }
void sum_over_processes(std::vector<std::uint64_t>&) {}

#endif

}  // namespace standfast::tools
