#pragma once
// `slipscreen compare OLD_RUN NEW_RUN` end to end (docs/compare.md): read both run folders
// (outputs/comparison_read), check they are runs of the same region in the same working CRS,
// compare (screening/comparison), and write the comparison folder through a RunFolder (staged,
// renamed into place when complete; with `force` only an earlier comparison is replaced, never a
// run or any other folder, nor a folder holding either run).
#include <filesystem>
#include <functional>
#include <optional>
#include <string>
#include <vector>

#include "core/units/units.hpp"
#include "screening/comparison.hpp"

namespace slipscreen::run {

struct CompareJob {
  std::filesystem::path old_run, new_run;
  std::filesystem::path out;                   // "" = the default (compare_default_folder)
  bool force = false;
  bool reproducible = false;                   // no creation time in the manifest
  std::optional<units::UnitSystem> units;      // of comparison.csv; default: the later run's
  std::vector<std::string> command_line;       // for the folder's manifest
  std::function<void(const std::string& line)> notice;  // stale leftovers cleaned beside the folder
};

struct CompareJobResult {
  screening::RunRecord old_run, new_run;
  screening::Comparison comparison;
  std::filesystem::path folder;                // where the comparison was written
  units::UnitSystem units = units::UnitSystem::si;
};

// The folder written when none is given: "compare-<old name>-<new name>" beside NEW_RUN.
std::filesystem::path compare_default_folder(const std::filesystem::path& old_run, const std::filesystem::path& new_run);

// Throws RefusedError (not a run; the output folder may not be written), InputError (a table or
// value missing; runs of different regions or CRSs, naming both), IoError.
CompareJobResult run_compare_job(const CompareJob& job);

}  // namespace slipscreen::run
