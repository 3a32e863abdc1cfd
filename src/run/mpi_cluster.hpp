#pragma once
// Running `slipscreen run` across MPI processes (docs/cluster.md). Compiled in every build; the
// MPI calls exist only with the CMake option SLIPSCREEN_MPI, otherwise every process is a
// cluster of one and nothing here communicates.
//
// Protocol (rank 0 is the root; it alone writes the run folder):
//   - every rank other than 0 sends the root, in order, its part of each gather it reaches (the
//     deterministic screen's segments, then the probabilistic screen's block, through the
//     RealizationSplit's gather), and last "done" or "failed" (exit code, error category,
//     message) from cluster_finish; a failed rank sends no further parts;
//   - the root receives every rank's part in each gather (a "failed" in its place stops the root
//     with that error), and in cluster_finish drains every rank up to its last message (parts of
//     gathers the root never reached are dropped), then sends every rank its exit code;
//   - every rank ends with the root's exit code, so all processes exit alike.
// A rank's failure reaches the root as an error of the same category ("rank 2: ..."), which the
// root reports once before it writes anything; the root's own input errors are the same on
// every rank (every rank reads the inputs), and the root prints them once. Waiting ranks poll
// with short sleeps so that they do not take a core from the ranks still computing.
#include <iosfwd>
#include <string>

#include "core/probabilistic/realization_split.hpp"

namespace slipscreen::run {

// MPI_Init_thread in the constructor, MPI_Finalize in the destructor (main() holds one). Without
// SLIPSCREEN_MPI it does nothing.
class ClusterSession {
 public:
  ClusterSession(int* argc, char*** argv);
  ~ClusterSession();
  ClusterSession(const ClusterSession&) = delete;
  ClusterSession& operator=(const ClusterSession&) = delete;
};

// This process's rank and the number of ranks (0 and 1 without MPI or outside a session).
int cluster_rank();
int cluster_ranks();
bool built_with_mpi();

// Bytes of results this process has sent to / received from other ranks in the gathers so far
// (the merge's traffic; the protocol's few small messages apart). 0 with one rank.
unsigned long long cluster_bytes_sent();
unsigned long long cluster_bytes_received();

// The split of the probabilistic screen's realizations across the ranks, or nullptr when there is
// one rank. Every rank calls its gather the same number of times, in the same order (one per
// split stage of the run).
const probabilistic::RealizationSplit* cluster_split();

// On the root, once the last split stage has merged (the other ranks then only wait, polling
// with sleeps): its OpenMP threads grow to what the ranks of its node had together (its own
// count times the node's ranks, at most the processors it may run on), so the serial tail of
// the run (the allowable rate, the maps, the outputs, the report) uses the cores the finished
// ranks left idle. Does nothing elsewhere or with one rank per node.
void cluster_root_takes_idle_cores();

// Error categories as sent between ranks: an ErrorCategory's value, or these two.
inline constexpr int kClusterOk = -1;
inline constexpr int kClusterInternal = 100;

// Ends the run on this rank with its exit code (`category` kClusterOk when the code is 0, and the
// error's message otherwise) and returns the code every rank ends with: the root's. The root prints
// a rank's failure to `err` when the root itself succeeded. Returns `code` with one rank.
int cluster_finish(int code, int category, const std::string& message, std::ostream& err);

}  // namespace slipscreen::run
