// Thin entry point: everything happens in slipscreen::cli::run.
#include <unistd.h>

#include <csignal>
#include <iostream>
#include <string>
#include <vector>

#include "cli/app.hpp"

int main(int argc, char** argv) {
  // A write beyond the file-size limit (ulimit -f) then fails with EFBIG, which the checked
  // writers report as an I/O error (the run folder's staging is removed), instead of the
  // signal killing the process and leaving a partial folder behind.
  std::signal(SIGXFSZ, SIG_IGN);
  std::vector<std::string> args(argv + 1, argv + argc);
  return slipscreen::cli::run(args, std::cout, std::cerr, isatty(STDERR_FILENO) != 0);
}
