#pragma once
// What `run` and `demo` share: running a scenario with progress on a terminal, and the console
// summary (faults closest to failure, where the outputs are, the screening caution).
#include <filesystem>
#include <string>

#include "cli/context.hpp"

namespace slipscreen::cli {

struct RunCommandOptions {
  std::string scenario;
  std::string out;
  bool force = false;
  bool allow_network = false;
  bool reproducible = false;
  int closest = 10;  // faults listed in the summary
  std::string units;  // "SI" or "oilfield" (--units, checked by CLI11); empty: the scenario's [output] units
  bool timings = false;  // --timings: each stage's wall time, the bytes exchanged and the peak memory, on stderr
};

// Loads, runs and reports; returns the exit code (typed errors propagate to cli::run).
int run_and_report(const RunCommandOptions& o, Context& ctx);

// What `run` does, in order, for the help of `run` and `demo` (defined in run_command.cpp).
std::string run_footer();

}  // namespace slipscreen::cli
