#pragma once
// Running a scenario end to end (docs/outputs.md): load and check every input, prepare the run,
// compute the screens and the catalog review, write every output into one run folder that
// appears all at once (formats/files/run_folder.hpp), and return what the console summary needs.
#include <filesystem>
#include <functional>
#include <string>
#include <vector>

#include "core/probabilistic/realization_split.hpp"
#include "scenario/scenario.hpp"
#include "screening/run_cost.hpp"
#include "screening/run_summary.hpp"

namespace slipscreen::run {

struct RunOptions {
  std::filesystem::path out;   // run folder; empty: the scenario's output.folder (from the working directory)
  bool force = false;          // replace an earlier run of slipscreen (formats/files/run_folder.hpp)
  bool allow_network = false;  // GDAL network paths in the scenario
  bool reproducible = false;   // no creation time in the manifest, fixed GeoPackage timestamp
  std::vector<std::string> command_line;
  // Progress: a stage name and the fraction of the pressure computation done.
  std::function<void(const std::string& stage, double fraction)> progress;
  // One line per stale leftover of a killed run cleaned beside the run folder (stale_runs.hpp).
  std::function<void(const std::string& line)> notice;
  // The cost estimate (screening/run_cost.hpp), once the inputs are prepared and before any
  // computing; a run beyond the memory limit is refused before this is called.
  std::function<void(const screening::RunCost& cost, double memory_limit)> cost;
  // A run split across processes (run/mpi_cluster.hpp, docs/cluster.md): part 0 runs everything
  // and writes the run folder; every other part reads and checks the inputs, computes its block
  // of the probabilistic screen, hands it to part 0 and returns an empty summary.
  const probabilistic::RealizationSplit* split = nullptr;
};

using screening::RunSummary;

// Throws the typed errors of the inputs; nothing is left behind when it throws.
RunSummary run_scenario(const scenario::ResolvedScenario& s, const RunOptions& o);

// The run folder a scenario writes to with these options (RefusedError when none is given).
std::filesystem::path run_folder_of(const scenario::ResolvedScenario& s, const RunOptions& o);

}  // namespace slipscreen::run
