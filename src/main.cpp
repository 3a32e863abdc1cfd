// Thin entry point: everything happens in slipscreen::cli::run.
#include <unistd.h>

#include <csignal>
#include <iostream>
#include <string>
#include <vector>

#include "cli/app.hpp"
#include "run/interrupt.hpp"
#include "run/mpi_cluster.hpp"

int main(int argc, char** argv) {
  // Before any other thread exists (run/interrupt.hpp): Ctrl-C or SIGTERM while a run is written
  // removes the unfinished run folder and ends with 130 or 143.
  slipscreen::run::remove_unfinished_runs_on_interrupt();
  // A write beyond the file-size limit (ulimit -f) then fails with EFBIG, which the checked
  // writers report as an I/O error (the run folder's staging is removed), instead of the
  // signal killing the process and leaving a partial folder behind.
  std::signal(SIGXFSZ, SIG_IGN);
  // MPI (built with SLIPSCREEN_MPI only): every rank runs this main; docs/cluster.md.
  slipscreen::run::ClusterSession cluster(&argc, &argv);
  std::vector<std::string> args(argv + 1, argv + argc);
  return slipscreen::cli::run(args, std::cout, std::cerr, isatty(STDERR_FILENO) != 0);
}
