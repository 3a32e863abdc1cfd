#pragma once
// One finished run folder read back for `slipscreen compare` (docs/compare.md): its manifest.json,
// segment_probability.csv and, with a catalog review, catalog_summary.json and catalog_events.csv.
// Quantities come back in SI whatever the run's output units (the column names' unit suffixes,
// report/run_table.hpp).
//
// Refused (RefusedError) when the folder is missing or is not a run of slipscreen
// (formats/files/earlier_run.hpp) or holds no scenario run (the folder of `slipscreen catalog
// --out` or `compare`); InputError naming the folder and file when a table or value the comparison
// needs is missing or malformed (a run without the probabilistic screen has no P(slip)).
#include <filesystem>
#include <string>

#include "screening/comparison.hpp"

namespace slipscreen::outputs {

// `shown` names the folder in messages and outputs (the path as given).
screening::RunRecord read_run_record(const std::filesystem::path& folder, const std::string& shown);

// The run's output unit system as its manifest records it ("SI" or "oilfield").
std::string run_units(const std::filesystem::path& folder);

}  // namespace slipscreen::outputs
