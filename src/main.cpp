// Thin entry point: everything happens in slipscreen::cli::run.
#include <unistd.h>

#include <iostream>
#include <string>
#include <vector>

#include "cli/app.hpp"

int main(int argc, char** argv) {
  std::vector<std::string> args(argv + 1, argv + argc);
  return slipscreen::cli::run(args, std::cout, std::cerr, isatty(STDERR_FILENO) != 0);
}
