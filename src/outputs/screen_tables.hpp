#pragma once
// The deterministic screen's tables in a run folder (docs/outputs.md):
//   segment_times.csv   one row per fault segment and output time (tidy)
//   well_shares.csv     one row per segment, output time and well: each well's share of Δp
//   segments.csv        one row per fault segment: stress, Δp_crit, peak Δp, first crossing
#include "core/screen/deterministic_screen.hpp"
#include "formats/files/run_folder.hpp"
#include "outputs/run_readme.hpp"
#include "scenario/scenario.hpp"
#include "screening/prepare.hpp"

namespace slipscreen::outputs {

void write_screen_tables(const formats::RunFolder& folder, const scenario::ResolvedScenario& s,
                         const screening::PreparedRun& p, const screen::ScreenResult& r);

// Their lines in README.txt.
std::vector<ReadmeFile> screen_tables_readme(const scenario::ResolvedScenario& s);

}  // namespace slipscreen::outputs
